package engine

import (
	"sort"
	"strconv"
)

func sortInts(s []int) { sort.Ints(s) }

func strconvU(n uint64) string { return strconv.FormatUint(n, 10) }

// resize returns s with length n, reusing its room.
func resize[T any](s []T, n int) []T {
	if cap(s) < n {
		return make([]T, n)
	}
	return s[:n]
}
