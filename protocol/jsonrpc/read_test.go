package jsonrpc

import (
	"bufio"
	"bytes"
	"errors"
	"fmt"
	"io"
	"strings"
	"testing"
)

// readLineByAppend is the plain reading of a line, the reference for
// readLine: chunks appended to one buffer, the trailing \r and \n bytes
// cut, a line longer than limit reported with no data.
func readLineByAppend(r *bufio.Reader, limit int) ([]byte, bool, error) {
	var buf []byte
	tooLong := false
	for {
		chunk, err := r.ReadSlice('\n')
		if len(buf)+len(chunk) > limit+2 {
			tooLong = true
		}
		if !tooLong {
			buf = append(buf, chunk...)
		}
		if errors.Is(err, bufio.ErrBufferFull) {
			continue
		}
		buf = bytes.TrimRight(buf, "\r\n")
		if tooLong || len(buf) > limit {
			return nil, true, err
		}
		return buf, false, err
	}
}

// TestReadLineAgreesWithAppend reads inputs of short and long lines
// (several blocks of lineBlock, with the line ending at, just before and
// just after a block's end, \r\n split across two reads, runs of \r, a
// last line without an ending, lines at and beyond the limit) with
// readLine and with the plain reading, through a small reader buffer so
// that lines span many reads, and compares every line and error.
func TestReadLineAgreesWithAppend(t *testing.T) {
	long := func(n int, end string) string { return strings.Repeat("x", n) + end }
	inputs := map[string]string{
		"short":           "a\nbb\r\n\n\r\nccc",
		"block edges":     long(lineBlock-1, "\r\n") + long(lineBlock, "\n") + long(lineBlock+1, "\r\n") + long(lineBlock-2, "\r\r\n"),
		"several blocks":  long(3*lineBlock+17, "\n") + "tail",
		"ending in block": long(2*lineBlock-1, "\r") + "\n" + long(5, "\r"),
		"limit":           long(40, "\n") + long(41, "\r\n") + long(39, "\n") + long(100, "\n") + "ok\n",
		"limit long":      long(lineBlock+3, "\n") + long(lineBlock+2, "\r\n") + "after\n",
	}
	for name, input := range inputs {
		for _, limit := range []int{40, lineBlock + 2, 64 << 20} {
			t.Run(fmt.Sprintf("%s/limit=%d", name, limit), func(t *testing.T) {
				got := bufio.NewReaderSize(strings.NewReader(input), 16)
				want := bufio.NewReaderSize(strings.NewReader(input), 16)
				for k := 0; ; k++ {
					line, tooLong, err := readLine(got, limit)
					wantLine, wantTooLong, wantErr := readLineByAppend(want, limit)
					if !bytes.Equal(line, wantLine) || tooLong != wantTooLong || err != wantErr {
						t.Fatalf("line %d: got %d bytes, %v, %v; want %d bytes, %v, %v", k, len(line), tooLong, err, len(wantLine), wantTooLong, wantErr)
					}
					if cap(line) != len(line) {
						t.Errorf("line %d: capacity %d for %d bytes", k, cap(line), len(line))
					}
					if err == io.EOF {
						return
					}
				}
			})
		}
	}
}
