// Command scalebench measures seatsmith's command-line pipeline on large
// inputs: it writes a CSV table of invented districts, and apportions one
// the way "seatsmith allot -format csv" does (read the CSV, prepare the
// scenario and drop its units, Allot, build the table, write it), with the
// explanation's costlier parts chosen by a flag, printing the time and the
// Go heap after each step. Run it under
// /usr/bin/time -v for the peak resident memory.
//
// Usage:
//
//	go run ./tools/scalebench gen -units N [-seed S] > big.csv
//	go run ./tools/scalebench allot -method M -seats H [-detail D] [-o FILE] [-lean] big.csv
//	go run ./tools/scalebench read big.csv
//
// read is the baseline for peak memory: it reads the file into memory and
// does nothing else, so the peak resident memory of any command on the
// same file can be given as a ratio to it.
//
// -detail is none, margins, order or full (the default, what seatsmith
// allot asks for); FILE defaults to /dev/null. -lean writes the table in
// chunks of 10^4 units through a buffered file instead of building all of
// it in memory.
//
// The districts and their populations are invented (log-uniform between
// 10^3 and 10^9, as in the engine's benchmarks).
package main

import (
	"bufio"
	"bytes"
	"flag"
	"fmt"
	"io"
	"math/rand/v2"
	"os"
	"runtime"
	"strconv"
	"time"

	"seatsmith/engine"
	"seatsmith/engine/format"
	"seatsmith/engine/format/csv"
	"seatsmith/engine/input"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		io.WriteString(stderr, "usage: scalebench gen -units N | scalebench allot -method M -seats H [-detail D] FILE\n")
		return 2
	}
	switch args[0] {
	case "gen":
		return gen(args[1:], stdout, stderr)
	case "allot":
		return allot(args[1:], stdout, stderr)
	case "read":
		return readOnly(args[1:], stdout, stderr)
	}
	fmt.Fprintf(stderr, "scalebench: unknown command %q\n", args[0])
	return 2
}

func gen(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("gen", flag.ContinueOnError)
	fs.SetOutput(stderr)
	n := fs.Int("units", 1_000_000, "number of districts")
	seed := fs.Uint64("seed", 2026, "seed of the populations")
	if fs.Parse(args) != nil || fs.NArg() != 0 {
		return 2
	}
	r := rand.New(rand.NewPCG(*seed, uint64(*n)))
	w := bufio.NewWriter(stdout)
	w.WriteString("name,population\n")
	for i := 0; i < *n; i++ {
		p := uint64(1000)
		for k := r.IntN(6); k > 0; k-- {
			p *= 10
		}
		p += r.Uint64N(p * 9)
		w.WriteString("district-")
		w.WriteString(strconv.Itoa(i + 1))
		w.WriteByte(',')
		w.WriteString(strconv.FormatUint(p, 10))
		w.WriteByte('\n')
	}
	if err := w.Flush(); err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	return 0
}

// writeChunks writes the table of res to the file name, 10^4 units at a
// time, keeping the header of the first chunk only.
func writeChunks(name string, res *engine.Result) error {
	f, err := os.Create(name)
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f, 1<<20)
	part := *res
	var b bytes.Buffer
	for i := 0; i < len(res.Units); i += 10_000 {
		part.Units = res.Units[i:min(i+10_000, len(res.Units))]
		b.Reset()
		if err := (csv.Encoder{}).Encode(&b, format.Allotment("", &part, &engine.Scenario{}, format.AllotOptions{})); err != nil {
			f.Close()
			return err
		}
		rows := b.Bytes()
		if i > 0 {
			rows = rows[bytes.IndexByte(rows, '\n')+1:]
		}
		w.Write(rows)
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

var details = map[string]engine.Detail{
	"none": 0, "margins": engine.WithMargins, "order": engine.WithOrder, "full": engine.Full,
}

func allot(args []string, stdout, stderr io.Writer) int {
	fs := flag.NewFlagSet("allot", flag.ContinueOnError)
	fs.SetOutput(stderr)
	method := fs.String("method", "webster", "apportionment method")
	seats := fs.Int("seats", 0, "house size")
	detail := fs.String("detail", "full", "explanation: none, margins, order or full")
	out := fs.String("o", os.DevNull, "write the CSV table to this file")
	lean := fs.Bool("lean", false, "write the table in chunks")
	if fs.Parse(args) != nil || fs.NArg() != 1 {
		return 2
	}
	d, ok := details[*detail]
	if !ok {
		fmt.Fprintf(stderr, "scalebench: unknown detail %q\n", *detail)
		return 2
	}
	m, err := engine.ParseMethod(*method)
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 2
	}
	start := time.Now()
	step := func(name string) {
		var ms runtime.MemStats
		runtime.ReadMemStats(&ms)
		fmt.Fprintf(stdout, "%-7s %8.3fs  heap in use %5d MB  total allocated %6d MB\n",
			name, time.Since(start).Seconds(), ms.HeapInuse>>20, ms.TotalAlloc>>20)
	}
	f, err := os.Open(fs.Arg(0))
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	src, err := input.Read(fs.Arg(0), bufio.NewReader(f))
	f.Close()
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	step("read")
	src.Scenario.Method, src.Scenario.Seats = m, *seats
	prep, err := engine.Prepare(&src.Scenario)
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", src.Locate(err))
		return 1
	}
	src.Scenario.Units = nil
	step("prepare")
	res, err := prep.Allot(d)
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", src.Locate(err))
		return 1
	}
	step("allot")
	if *lean {
		if err := writeChunks(*out, res); err != nil {
			fmt.Fprintln(stderr, "scalebench:", err)
			return 1
		}
		step("write")
		return 0
	}
	doc := format.Allotment("", res, &engine.Scenario{}, format.AllotOptions{})
	step("table")
	var b bytes.Buffer
	if err := (csv.Encoder{}).Encode(&b, doc); err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	step("csv")
	if err := os.WriteFile(*out, b.Bytes(), 0o644); err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	step("write")
	return 0
}

// readOnly reads the file into memory and reports its size.
func readOnly(args []string, stdout, stderr io.Writer) int {
	if len(args) != 1 {
		io.WriteString(stderr, "usage: scalebench read FILE\n")
		return 2
	}
	data, err := os.ReadFile(args[0])
	if err != nil {
		fmt.Fprintln(stderr, "scalebench:", err)
		return 1
	}
	lines := bytes.Count(data, []byte{'\n'})
	fmt.Fprintf(stdout, "read %d bytes, %d lines\n", len(data), lines)
	return 0
}
