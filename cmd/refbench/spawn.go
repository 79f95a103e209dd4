package main

import (
	"fmt"
	"os"
	"os/exec"
	"strconv"
	"strings"
	"syscall"
	"time"
)

// The peak resident memory of a child process is its ru_maxrss, but on
// Linux a process started by fork or vfork from a large parent begins
// with the parent's high-water mark: the kernel records the old address
// space's peak into the child's maxrss when the child calls exec, and Go's
// os/exec starts children with clone(CLONE_VM|CLONE_VFORK), so the old
// address space is refbench's own (over 1 GiB once it holds the 2D grid's
// system). Every child measured after the largest model then reported
// refbench's size. So each child is started by a small process of its
// own: refbench runs itself again with spawnFlag, which starts the child,
// waits for it and writes its wall time and ru_maxrss to a file. The
// spawner's own high-water mark (a few MiB) is then the floor the child
// starts from, below any child measured here.

// spawnFlag, as refbench's first argument, makes it the spawner:
//
//	refbench -spawn RESULT-FILE BIN ARGS...
//
// runs BIN ARGS with refbench's standard input, output and error and
// environment, and writes "wall-seconds peak-KiB exit-code" to RESULT-FILE.
const spawnFlag = "-spawn"

// spawned is what the spawner reports of one child.
type spawned struct {
	wall    time.Duration
	peakKiB int64
}

// spawnMain is the spawner's main.
func spawnMain(args []string) int {
	if len(args) < 2 {
		fmt.Fprintln(os.Stderr, "refbench: -spawn needs RESULT-FILE BIN [ARGS...]")
		return 2
	}
	cmd := exec.Command(args[1], args[2:]...)
	cmd.Stdin, cmd.Stdout, cmd.Stderr = os.Stdin, os.Stdout, os.Stderr
	start := time.Now()
	err := cmd.Run()
	wall := time.Since(start)
	code := 0
	if err != nil {
		code = 1
		if ee, ok := err.(*exec.ExitError); ok {
			code = ee.ExitCode()
		} else {
			fmt.Fprintln(os.Stderr, "refbench:", err)
		}
	}
	var peak int64
	if cmd.ProcessState != nil {
		if ru, ok := cmd.ProcessState.SysUsage().(*syscall.Rusage); ok {
			peak = ru.Maxrss // KiB on Linux
		}
	}
	if werr := os.WriteFile(args[0], fmt.Appendf(nil, "%.6f %d %d\n", wall.Seconds(), peak, code), 0o644); werr != nil {
		fmt.Fprintln(os.Stderr, "refbench:", werr)
		return 1
	}
	return code
}

// viaSpawner returns a command that runs bin with args through a spawner
// (refbench itself), which writes the child's wall time and peak to
// resultPath; read it with readSpawned once the command has run.
func viaSpawner(resultPath, bin string, args ...string) (*exec.Cmd, error) {
	self, err := os.Executable()
	if err != nil {
		return nil, err
	}
	return exec.Command(self, append([]string{spawnFlag, resultPath, bin}, args...)...), nil
}

// readSpawned reads what the spawner wrote.
func readSpawned(resultPath string) (spawned, error) {
	b, err := os.ReadFile(resultPath)
	if err != nil {
		return spawned{}, err
	}
	f := strings.Fields(string(b))
	if len(f) != 3 {
		return spawned{}, fmt.Errorf("spawner wrote %q", b)
	}
	wall, err1 := strconv.ParseFloat(f[0], 64)
	peak, err2 := strconv.ParseInt(f[1], 10, 64)
	if err1 != nil || err2 != nil {
		return spawned{}, fmt.Errorf("spawner wrote %q", b)
	}
	return spawned{wall: time.Duration(wall * float64(time.Second)), peakKiB: peak}, nil
}
