package schema

import (
	"encoding/json"
	"reflect"
	"sync"
	"testing"

	"gusset/protocol"
)

// TestStartValidatorWaitsForTheSchemas validates at once after
// StartValidator, from several goroutines, and checks the answers are
// NewValidator's; a definition that does not exist makes every
// validation an internal error rather than a pass.
func TestStartValidatorWaitsForTheSchemas(t *testing.T) {
	params := map[string]string{"solve": "SolveParams"}
	want, err := NewValidator(params)
	if err != nil {
		t.Fatal(err)
	}
	inputs := []json.RawMessage{
		json.RawMessage(`{"model":{"dimension":2,"nodes":[],"members":[]}}`),
		json.RawMessage(`{"model":{"dimension":4}}`),
		json.RawMessage(`{"modle":{}}`),
	}
	v := StartValidator(params)
	var wg sync.WaitGroup
	for _, in := range inputs {
		wg.Add(1)
		go func() {
			defer wg.Done()
			if got, exp := v.ValidateFull("solve", in), want.ValidateFull("solve", in); !reflect.DeepEqual(got, exp) {
				t.Errorf("%s: got %+v, want %+v", in, got, exp)
			}
		}()
	}
	wg.Wait()
	broken := StartValidator(map[string]string{"solve": "NoSuchParams"})
	if e := broken.ValidateFull("solve", inputs[0]); e == nil || e.Code != protocol.CodeInternal {
		t.Errorf("a schema that does not compile gives %+v, want an internal error", e)
	}
	if _, err := NewValidator(map[string]string{"solve": "NoSuchParams"}); err == nil {
		t.Error("NewValidator compiled a definition that does not exist")
	}
}
