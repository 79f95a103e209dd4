package main

import "testing"

// TestCountingWriterKeepsLastLine: the head of the last line is kept
// however the output is split into writes (progress lines first, then
// the final response).
func TestCountingWriterKeepsLastLine(t *testing.T) {
	out := `{"method":"progress"}` + "\n" + `{"method":"progress"}` + "\n" + `{"id":1,"result":{"x":[1,2,3]}}` + "\n"
	for _, size := range []int{1, 3, 7, len(out)} {
		var c countingWriter
		for i := 0; i < len(out); i += size {
			if n, _ := c.Write([]byte(out[i:min(i+size, len(out))])); n != min(size, len(out)-i) {
				t.Fatalf("write of %d bytes returned %d", min(size, len(out)-i), n)
			}
		}
		if string(c.lastHead) != `{"id":1,"result":{"x":[1,2,3]}}` || c.n != int64(len(out)) {
			t.Errorf("writes of %d: last line %q, %d bytes", size, c.lastHead, c.n)
		}
	}
}
