package clients

import (
	"bufio"
	"context"
	"encoding/json"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strconv"
	"strings"
	"sync"
	"testing"
	"time"
)

// requireClients reports whether a missing interpreter fails the test
// rather than skipping it.
func requireClients() bool { return os.Getenv("GUSSET_REQUIRE_CLIENTS") == "1" }

var (
	buildOnce sync.Once
	buildPath string
	buildErr  error
	buildLog  []byte
)

// binary builds the gusset command once per test process into a temporary
// directory and returns its path.
func binary(tb testing.TB) string {
	tb.Helper()
	buildOnce.Do(func() {
		dir, err := os.MkdirTemp("", "gusset-clients-")
		if err != nil {
			buildErr = err
			return
		}
		buildPath = filepath.Join(dir, "gusset")
		if runtime.GOOS == "windows" {
			buildPath += ".exe"
		}
		cmd := exec.Command("go", "build", "-o", buildPath, "gusset/cmd/gusset")
		buildLog, buildErr = cmd.CombinedOutput()
	})
	if buildErr != nil {
		tb.Fatalf("go build gusset/cmd/gusset: %v\n%s", buildErr, buildLog)
	}
	return buildPath
}

// interpreter finds a program and checks its version, skipping the test
// (or failing it under GUSSET_REQUIRE_CLIENTS=1) when it is missing or too
// old.
func interpreter(t *testing.T, name string, versionArgs []string, atLeast [2]int) string {
	t.Helper()
	missing := func(format string, args ...any) {
		t.Helper()
		if requireClients() {
			t.Fatalf(format+" (GUSSET_REQUIRE_CLIENTS=1 makes this a failure)", args...)
		}
		t.Skipf(format, args...)
	}
	path, err := exec.LookPath(name)
	if err != nil {
		missing("%s is not installed: its client's tests are skipped", name)
		return ""
	}
	out, err := exec.Command(path, versionArgs...).Output()
	if err != nil {
		missing("%s does not report its version: %v", name, err)
		return ""
	}
	fields := strings.FieldsFunc(strings.TrimSpace(string(out)), func(r rune) bool { return r == '.' || r == 'v' })
	if len(fields) < 2 {
		missing("%s reports an odd version %q", name, out)
		return ""
	}
	major, _ := strconv.Atoi(fields[0])
	minor, _ := strconv.Atoi(fields[1])
	if major < atLeast[0] || (major == atLeast[0] && minor < atLeast[1]) {
		missing("%s is version %s; the client needs %d.%d or later", name, strings.TrimSpace(string(out)), atLeast[0], atLeast[1])
		return ""
	}
	return path
}

// runSuite runs a client's test suite from the root of the repository with
// GUSSET_BINARY set, and fails with its output when it fails.
func runSuite(t *testing.T, bin string, program string, args ...string) {
	t.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Minute)
	defer cancel()
	cmd := exec.CommandContext(ctx, program, args...)
	cmd.Dir = ".."
	cmd.Env = append(os.Environ(), "GUSSET_BINARY="+bin, "PYTHONDONTWRITEBYTECODE=1", "NO_COLOR=1")
	out, err := cmd.CombinedOutput()
	if err != nil {
		t.Fatalf("%s %s: %v\n%s", program, strings.Join(args, " "), err, out)
	}
	if testing.Verbose() {
		t.Logf("%s %s:\n%s", program, strings.Join(args, " "), tail(out, 40))
	}
}

// tail returns the last n lines of out.
func tail(out []byte, n int) string {
	lines := strings.Split(strings.TrimRight(string(out), "\n"), "\n")
	if len(lines) > n {
		lines = lines[len(lines)-n:]
	}
	return strings.Join(lines, "\n")
}

// TestClients runs the Python and Node clients' own test suites against
// the binary built from this tree.
func TestClients(t *testing.T) {
	bin := binary(t)
	t.Run("python", func(t *testing.T) {
		t.Parallel()
		python := interpreter(t, "python3", []string{"-c", "import sys; print('%d.%d' % sys.version_info[:2])"}, [2]int{3, 8})
		runSuite(t, bin, python, "-m", "unittest", "discover", "-s", "clients/python/tests", "-v")
	})
	t.Run("node", func(t *testing.T) {
		t.Parallel()
		node := interpreter(t, "node", []string{"--version"}, [2]int{20, 0})
		runSuite(t, bin, node, "--test", "clients/node/test/")
	})
}

// pipe is a server process driven one line at a time, without a client
// library: the baseline the clients' overhead is measured against.
type pipe struct {
	cmd *exec.Cmd
	in  io.WriteCloser
	out *bufio.Reader
}

func startPipe(tb testing.TB) *pipe {
	tb.Helper()
	cmd := exec.Command(binary(tb), "serve", "--jobs", "1")
	in, err := cmd.StdinPipe()
	if err != nil {
		tb.Fatal(err)
	}
	out, err := cmd.StdoutPipe()
	if err != nil {
		tb.Fatal(err)
	}
	if err := cmd.Start(); err != nil {
		tb.Fatal(err)
	}
	p := &pipe{cmd: cmd, in: in, out: bufio.NewReaderSize(out, 1<<20)}
	tb.Cleanup(func() {
		in.Close()
		cmd.Wait()
	})
	return p
}

// roundTrip sends one line and reads lines until the final response.
func (p *pipe) roundTrip(tb testing.TB, line []byte) []byte {
	if _, err := p.in.Write(line); err != nil {
		tb.Fatal(err)
	}
	for {
		answer, err := p.out.ReadBytes('\n')
		if err != nil {
			tb.Fatal(err)
		}
		if !strings.Contains(string(answer[:min(len(answer), 40)]), `"method":"progress"`) {
			return answer
		}
	}
}

// barModel is one bar pulled along its axis; the clients' benchmarks send
// the same model.
const barModel = `{"dimension":2,"materials":[{"id":"steel","elastic_modulus":2.1e8}],"sections":[{"id":"rod","area":1e-3}],` +
	`"nodes":[{"id":"A","at":[0,0]},{"id":"B","at":[4,0]}],"members":[{"id":"AB","ends":["A","B"],"material":"steel","section":"rod"}],` +
	`"supports":[{"node":"A","fix":["x","y"]},{"node":"B","fix":["y"]}],"load_cases":[{"id":"pull","loads":[{"node":"B","force":[7,0]}]}]}`

// BenchmarkPipe measures one small request at a time through the server's
// standard input and output from Go: the time the clients' figures are
// compared with.
func BenchmarkPipe(b *testing.B) {
	p := startPipe(b)
	var info struct {
		Result struct {
			Methods []struct{ Name string } `json:"methods"`
		} `json:"result"`
	}
	if err := json.Unmarshal(p.roundTrip(b, []byte(`{"jsonrpc":"2.0","id":0,"method":"describe"}`+"\n")), &info); err != nil {
		b.Fatal(err)
	}
	requests := []struct{ name, method, params string }{{"describe", "describe", "{}"}}
	for _, m := range info.Result.Methods {
		if m.Name == "solve" {
			requests = append(requests, struct{ name, method, params string }{"solve-bar", "solve", `{"model":` + barModel + `}`})
		}
	}
	for _, r := range requests {
		line := []byte(fmt.Sprintf(`{"jsonrpc":"2.0","id":1,"method":%q,"params":%s}`+"\n", r.method, r.params))
		b.Run(r.name, func(b *testing.B) {
			for range 20 {
				p.roundTrip(b, line)
			}
			b.ResetTimer()
			for b.Loop() {
				p.roundTrip(b, line)
			}
		})
	}
}
