package jsonrpc_test

import (
	"context"
	"encoding/json"
	"fmt"
	"os"
	"strings"

	"gusset/protocol"
	"gusset/protocol/jsonrpc"
)

// Serving requests: a method is registered with its handler, and Serve
// answers each line of the input, one response per request, as each
// finishes (a parse error at once, on the reader); a request without
// an id is a notification and gets no response, and a line that is not
// JSON gets -32700 with a null id (JSON-RPC 2.0, sections 4.1 and 5.1).
func ExampleServer_Serve() {
	s := &jsonrpc.Server{Name: "example", Version: "1", Limits: protocol.Limits{Workers: 1}}
	s.Handle(protocol.Method{Name: "add", Summary: "Adds two numbers."},
		func(ctx context.Context, params json.RawMessage, st jsonrpc.Stream) (any, error) {
			var p struct{ A, B float64 }
			if err := json.Unmarshal(params, &p); err != nil {
				return nil, protocol.NewError(protocol.CodeInvalidParams, "invalid params", err.Error())
			}
			return map[string]float64{"sum": p.A + p.B}, nil
		})
	in := strings.NewReader(`{"jsonrpc":"2.0","id":1,"method":"add","params":{"A":2,"B":3}}` + "\n" +
		`{"jsonrpc":"2.0","method":"add","params":{"A":1,"B":1}}` + "\n" +
		`{"jsonrpc":"2.0","id":"x","method":"add","params":{"A":0.5,"B":0.25}}` + "\n" + `not json` + "\n")
	failures, err := s.Serve(context.Background(), in, os.Stdout)
	fmt.Println(failures, err)
	// Unordered output:
	// {"jsonrpc":"2.0","id":1,"result":{"sum":5}}
	// {"jsonrpc":"2.0","id":"x","result":{"sum":0.75}}
	// {"jsonrpc":"2.0","id":null,"error":{"code":-32700,"message":"The line is not valid JSON: invalid character 'o' in literal null (expecting 'u'). Send one JSON-RPC request object per line.","data":{"kind":"parse error","problems":[]}}}
	// 1 <nil>
}
