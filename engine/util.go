package engine

import "sort"

func sortInts(s []int) { sort.Ints(s) }
