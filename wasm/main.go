package main

import "seatsmith/wasm/api"

func main() { api.Serve(api.Calculator(), api.Limits()) }
