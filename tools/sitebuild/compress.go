package main

import (
	"bytes"
	"compress/gzip"
	"crypto/sha256"
	"path"
	"runtime"
	"sort"
	"sync"

	"github.com/andybalholm/brotli"
)

// BrotliQuality is the brotli quality of the precompressed twins.
//
// Measured on the calculator module (4,397,374 bytes; gzip -9 gives
// 1,222,307) with github.com/andybalholm/brotli on one core of the build
// machine: quality 9 gives 1,028,685 bytes in 0.7 s, 10 gives 940,676 in
// 5.0 s, 11 gives 908,797 in 9.7 s (a window of 2^24 instead of the
// default 2^22: 909,865, no gain). The analysis module (5,358,730 bytes):
// 1,233,346 in 0.9 s, 1,110,246 in 6.2 s, 1,082,587 in 11.0 s. Quality
// 11 is 12% smaller than 9 on the download every reader waits for, and
// the build compresses both modules at once (one core each), so it costs
// about 11 s of a build; the scripts and styles take milliseconds at any
// quality.
const BrotliQuality = 11

// compressedTypes lists, by extension, the files the build writes
// precompressed twins for: text, and the WebAssembly modules. Images other
// than SVG are compressed already.
var compressedTypes = map[string]bool{
	".wasm": true, ".js": true, ".css": true, ".html": true, ".svg": true, ".json": true, ".csv": true,
}

// compressible reports whether the site file name gets precompressed twins.
func compressible(name string) bool { return compressedTypes[path.Ext(name)] }

// The encodings of the twins, in the order a server prefers them, and the
// suffix each adds to its file's name.
var encodings = []struct {
	name, suffix string
	compress     func([]byte) []byte
}{
	{"br", ".br", brotliBytes},
	{"gzip", ".gz", gzipBytes},
}

// addCompressed adds, beside every compressible file, its brotli twin
// (NAME.br) and its gzip twin (NAME.gz), which decompress to the same
// bytes. Files with the same bytes (the unfingerprinted copies under
// embed/) are compressed once; the largest files go first, spread over
// the machine's cores.
func addCompressed(files map[string][]byte) {
	type job struct {
		sum  [32]byte
		data []byte
		enc  int
	}
	names := map[[32]byte][]string{}
	var jobs []job
	for name, data := range files {
		if !compressible(name) {
			continue
		}
		sum := sha256.Sum256(data)
		if names[sum] == nil {
			for i := range encodings {
				jobs = append(jobs, job{sum, data, i})
			}
		}
		names[sum] = append(names[sum], name)
	}
	// Largest first, so that the two modules do not end up on one core.
	sort.SliceStable(jobs, func(i, j int) bool { return len(jobs[i].data) > len(jobs[j].data) })
	out := make([][]byte, len(jobs))
	next := make(chan int)
	var wg sync.WaitGroup
	for range max(1, runtime.GOMAXPROCS(0)) {
		wg.Add(1)
		go func() {
			defer wg.Done()
			for i := range next {
				out[i] = encodings[jobs[i].enc].compress(jobs[i].data)
			}
		}()
	}
	for i := range jobs {
		next <- i
	}
	close(next)
	wg.Wait()
	for i, j := range jobs {
		for _, name := range names[j.sum] {
			files[name+encodings[j.enc].suffix] = out[i]
		}
	}
}

// brotliBytes compresses data with brotli at BrotliQuality.
func brotliBytes(data []byte) []byte {
	var b bytes.Buffer
	w := brotli.NewWriterLevel(&b, BrotliQuality)
	w.Write(data)
	w.Close()
	return b.Bytes()
}

// gzipBytes compresses data with gzip at its best compression.
func gzipBytes(data []byte) []byte {
	var b bytes.Buffer
	w, _ := gzip.NewWriterLevel(&b, gzip.BestCompression)
	w.Write(data)
	w.Close()
	return b.Bytes()
}
