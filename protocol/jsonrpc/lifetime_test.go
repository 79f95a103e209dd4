package jsonrpc

import (
	"bytes"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"runtime"
	"strings"
	"testing"
	"weak"

	"gusset/protocol"
)

// TestLineReleasedWhileHandlerRuns checks that a request's line (which
// its params alias) is not kept live by the server while the handler goes
// on after decoding them: the in-flight table and the stream hold the
// call through the whole of the work, and a large model's line is tens of
// megabytes the engine could use. Both a line parsed on the reader and
// one parsed off it (from bigLine on) are checked.
func TestLineReleasedWhileHandlerRuns(t *testing.T) {
	for _, size := range []int{1 << 10, bigLine + 1<<10} {
		t.Run(fmt.Sprintf("bytes=%d", size), func(t *testing.T) {
			released := make(chan bool, 1)
			s := &Server{Name: "test", Version: "0", Limits: protocol.Limits{Workers: 1}}
			s.Handle(protocol.Method{Name: "hold"}, func(ctx context.Context, p json.RawMessage, st Stream) (any, error) {
				line := weak.Make(&p[0])
				p = nil
				st.Progress("decoded", 1, 1, nil)
				gone := false
				for range 5 {
					runtime.GC()
					if gone = line.Value() == nil; gone {
						break
					}
				}
				released <- gone
				return true, nil
			})
			padding := strings.Repeat("x", size)
			input := fmt.Sprintf(`{"jsonrpc":"2.0","id":1,"method":"hold","params":{"padding":%q}}`+"\n", padding)
			var out bytes.Buffer
			if _, err := s.Serve(context.Background(), io.MultiReader(strings.NewReader(input)), &out); err != nil {
				t.Fatal(err)
			}
			if !<-released {
				t.Errorf("the %d-byte line was still live while the handler ran", len(input))
			}
			if !bytes.Contains(out.Bytes(), []byte(`"result":true`)) {
				t.Errorf("no result: %s", out.Bytes())
			}
		})
	}
}
