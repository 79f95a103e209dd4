package jsonrpc

import (
	"strings"
	"testing"
	"time"

	"gusset/protocol"
)

// BenchmarkCancelBehindLargeLine measures how long a cancel written just
// after a large request line waits for its answer: the reader must not
// parse the large line before it reads the cancel. One op is one large
// line (46 MiB of params) and one cancel; the metric cancel-ms is the time
// from the end of the large line's write to the cancel's answer.
func BenchmarkCancelBehindLargeLine(b *testing.B) {
	big := `{"jsonrpc":"2.0","id":"big","method":"echo","params":{"s":[` +
		strings.Repeat(`"abcdefghij",`, 46<<20/13) + `"x"]}}`
	var total time.Duration
	for i := 0; i < b.N; i++ {
		p := startPipe(testServer(protocol.Limits{Workers: 2}))
		p.send(`{"jsonrpc":"2.0","id":"long","method":"slow"}`)
		for m := p.next(b); m.Method != "progress"; m = p.next(b) {
		}
		p.send(big)
		start := time.Now()
		p.send(`{"jsonrpc":"2.0","id":"c","method":"cancel","params":{"request":"long"}}`)
		for m := p.next(b); string(m.ID) != `"c"`; m = p.next(b) {
		}
		total += time.Since(start)
		p.in.Close()
		go func() {
			for {
				if _, err := p.out.ReadBytes('\n'); err != nil {
					return
				}
			}
		}()
		<-p.done
	}
	b.ReportMetric(float64(total.Milliseconds())/float64(b.N), "cancel-ms")
}
