//go:build !linux

package sparse

// adviseHugePages does nothing where madvise's huge-page advice is not
// available (see hugepages_linux.go).
func adviseHugePages(v []float64) {}
