package main

import (
	"bufio"
	"fmt"
	"os"
	"strconv"

	"gusset/engine/sparse"
)

// writeMatrixMarket writes the lower triangle of a as a real symmetric
// Matrix Market coordinate file (1-based indices, full precision).
func writeMatrixMarket(path string, a *sparse.Matrix) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := bufio.NewWriterSize(f, 1<<20)
	fmt.Fprintf(w, "%%%%MatrixMarket matrix coordinate real symmetric\n%d %d %d\n", a.N, a.N, a.Nonzeros())
	buf := make([]byte, 0, 64)
	for j := range a.N {
		for p := a.ColPtr[j]; p < a.ColPtr[j+1]; p++ {
			buf = strconv.AppendInt(buf[:0], int64(a.RowIdx[p]+1), 10)
			buf = append(buf, ' ')
			buf = strconv.AppendInt(buf, int64(j+1), 10)
			buf = append(buf, ' ')
			buf = strconv.AppendFloat(buf, a.Val[p], 'g', -1, 64)
			buf = append(buf, '\n')
			w.Write(buf)
		}
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// writeVector writes one number a line.
func writeVector(path string, x []float64) error {
	f, err := os.Create(path)
	if err != nil {
		return err
	}
	w := bufio.NewWriter(f)
	buf := make([]byte, 0, 32)
	for _, v := range x {
		buf = strconv.AppendFloat(buf[:0], v, 'g', -1, 64)
		buf = append(buf, '\n')
		w.Write(buf)
	}
	if err := w.Flush(); err != nil {
		f.Close()
		return err
	}
	return f.Close()
}

// readVector reads one number a line.
func readVector(path string, n int) ([]float64, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, err
	}
	defer f.Close()
	s := bufio.NewScanner(f)
	x := make([]float64, 0, n)
	for s.Scan() {
		v, err := strconv.ParseFloat(s.Text(), 64)
		if err != nil {
			return nil, err
		}
		x = append(x, v)
	}
	if len(x) != n {
		return nil, fmt.Errorf("%s holds %d numbers, want %d", path, len(x), n)
	}
	return x, s.Err()
}
