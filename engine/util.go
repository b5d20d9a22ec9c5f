package engine

import (
	"sort"
	"strconv"
)

func sortInts(s []int) { sort.Ints(s) }

func strconvU(n uint64) string { return strconv.FormatUint(n, 10) }
