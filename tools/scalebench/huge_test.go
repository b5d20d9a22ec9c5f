package main

import (
	"os"
	"os/exec"
	"path/filepath"
	"strconv"
	"syscall"
	"testing"
)

// BenchmarkCLIMillion measures the peak resident memory of the seatsmith
// binary apportioning a generated table of 10^6 units by each method, as
// ratios to the file's size and to the peak of a process that only reads
// the file (scalebench read), both measured in the same run. It needs a
// few minutes and a few GB of disk, so it runs only with
// SEATSMITH_BENCH_HUGE=1:
//
//	SEATSMITH_BENCH_HUGE=1 go test -run XXX -bench CLIMillion -benchtime 1x ./tools/scalebench
func BenchmarkCLIMillion(b *testing.B) {
	if os.Getenv("SEATSMITH_BENCH_HUGE") != "1" {
		b.Skip("set SEATSMITH_BENCH_HUGE=1 to apportion 10^6 units through the binary")
	}
	dir := b.TempDir()
	bin := filepath.Join(dir, "seatsmith")
	self := filepath.Join(dir, "scalebench")
	for _, c := range [][]string{{"-o", bin, "seatsmith/tools/seatsmith"}, {"-o", self, "seatsmith/tools/scalebench"}} {
		if out, err := exec.Command("go", append([]string{"build"}, c...)...).CombinedOutput(); err != nil {
			b.Fatalf("build: %v\n%s", err, out)
		}
	}
	table := filepath.Join(dir, "big.csv")
	f, err := os.Create(table)
	if err != nil {
		b.Fatal(err)
	}
	gen := exec.Command(self, "gen", "-units", "1000000")
	gen.Stdout = f
	if err := gen.Run(); err != nil {
		b.Fatal(err)
	}
	f.Close()
	st, _ := os.Stat(table)
	size := float64(st.Size())
	peak := func(args ...string) float64 {
		cmd := exec.Command(args[0], args[1:]...)
		// Exit status 3 is a result: a tie reported, seats left open.
		if out, err := cmd.CombinedOutput(); err != nil && cmd.ProcessState.ExitCode() != 3 {
			b.Fatalf("%v: %v\n%s", args, err, out)
		}
		return float64(cmd.ProcessState.SysUsage().(*syscall.Rusage).Maxrss) * 1024 // kilobytes on Linux
	}
	base := peak(self, "read", table)
	b.ReportMetric(base/size, "read-peak/file")
	for _, m := range []string{"jefferson", "webster", "huntington-hill", "hamilton", "droop"} {
		for _, seats := range []int{100_000_000, 435 * 1_000_000 / 50} {
			for _, format := range []string{"text", "csv", "json"} {
				b.Run(m+"/"+strconv.Itoa(seats)+"/"+format, func(b *testing.B) {
					for i := 0; i < b.N; i++ {
						p := peak(bin, "allot", "-method", m, "-seats", strconv.Itoa(seats), "-format", format, "-o", filepath.Join(dir, "out"), table)
						b.ReportMetric(p/(1<<20), "peak-MB")
						b.ReportMetric(p/size, "peak/file")
						b.ReportMetric(p/base, "peak/read-peak")
					}
				})
			}
		}
	}
}
