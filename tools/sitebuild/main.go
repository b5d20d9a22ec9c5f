// Command sitebuild builds seatsmith's static site: explainer pages with
// live calculators, a full calculator for staffers and a self-contained
// offline calculator.
//
// Usage:
//
//	sitebuild build [-src site/content] [-out DIR] [-wasm DIR]
//	sitebuild check [-src site/content] [-golden testdata/site] [-update]
//	sitebuild serve [-src site/content] [-addr 127.0.0.1:8080] [-wasm DIR]
//
// build renders every page of the site sources with html/template,
// computes every calculator's results with the native engine (so that the
// numbers are right with JavaScript off), checks every claim (a claim that
// does not hold fails the build, naming page and claim), builds the
// WebAssembly engine, minifies and fingerprints the assets and writes a
// Content-Security-Policy both into each page and into the headers file
// site-headers.txt. DIR/index.html is the landing page and DIR/offline.html
// a single file with the full calculator that works from disk with no
// network.
//
// check renders every calculator's results and compares them with the
// golden files under testdata/site, printing a readable difference on a
// mismatch; -update rewrites the golden files.
//
// serve builds the site into a temporary folder and serves it for preview,
// applying the headers file.
//
// Results on the site are not official: the governing law, the official
// counts and the responsible authority decide.
package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"
)

func main() {
	os.Exit(run(os.Args[1:], os.Stdout, os.Stderr))
}

const usage = `Usage: sitebuild COMMAND [options]

Commands:
  build   render the site into a folder (-out DIR)
  check   compare every calculator's results with the golden files
  serve   build the site and serve it for preview (-addr 127.0.0.1:8080)

Run "sitebuild COMMAND -h" for a command's options.

Results on the site are not official: the governing statute or
constitution, the official counts and the responsible authority decide.
`

func run(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 {
		io.WriteString(stderr, usage)
		return 2
	}
	var err error
	switch args[0] {
	case "build":
		err = cmdBuild(args[1:], stdout, stderr)
	case "check":
		err = cmdCheck(args[1:], stdout, stderr)
	case "serve":
		err = cmdServe(args[1:], stdout, stderr)
	case "help", "-h", "-help", "--help":
		io.WriteString(stdout, usage)
		return 0
	default:
		fmt.Fprintf(stderr, "sitebuild: unknown command %q\n\n%s", args[0], usage)
		return 2
	}
	if err == nil {
		return 0
	}
	if errors.Is(err, flag.ErrHelp) {
		return 0
	}
	var ue usageError
	if errors.As(err, &ue) {
		fmt.Fprintf(stderr, "sitebuild %s: %v\n", args[0], err)
		return 2
	}
	fmt.Fprintf(stderr, "sitebuild %s: %v\n", args[0], err)
	return 1
}

// usageError is a mistake on the command line.
type usageError struct{ msg string }

func (u usageError) Error() string { return u.msg }

func parseFlags(fs *flag.FlagSet, args []string, stderr io.Writer) error {
	fs.SetOutput(stderr)
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return err
		}
		return usageError{err.Error()}
	}
	if fs.NArg() > 0 {
		return usageError{"unexpected arguments: " + fmt.Sprint(fs.Args())}
	}
	return nil
}

func cmdBuild(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("build", flag.ContinueOnError)
	src := fs.String("src", filepath.Join("site", "content"), "the site sources")
	out := fs.String("out", "dist", "the folder to write the site into")
	wasm := fs.String("wasm", "", "use the prebuilt modules in `DIR` (seatsmith.wasm, seatsmith-analysis.wasm) instead of building them")
	if err := parseFlags(fs, args, stderr); err != nil {
		return err
	}
	st, err := Build(Options{Src: *src, Out: *out, Wasm: *wasm})
	if err != nil {
		return err
	}
	fmt.Fprintf(stdout, "built %d pages with %d calculators and %d claims into %s\n", st.Pages, st.Calculators, st.Claims, *out)
	return nil
}
