"""Shared helpers of the client tests: the binary under test, models and fake servers."""

import os
import shutil
import stat
import subprocess
import sys
import tempfile
import unittest
from pathlib import Path
from typing import Any, Dict, List, Optional

HERE = Path(__file__).resolve().parent
sys.path.insert(0, str(HERE.parent))  # the gusset package, without installing it

import gusset  # noqa: E402

_built: Optional[str] = None


def binary() -> str:
    """binary returns the gusset binary under test.

    It is GUSSET_BINARY when set (the Go test sets it), else the one the
    client itself would find, else one built now with the go command from
    this checkout. Without any of them the calling test is skipped.
    """
    global _built
    if os.environ.get("GUSSET_BINARY"):
        return gusset.find_binary()
    try:
        return gusset.find_binary()
    except gusset.GussetNotFound:
        pass
    if _built is None:
        go = shutil.which("go")
        root = HERE.parents[2]
        if go is None or not (root / "go.mod").is_file():
            raise unittest.SkipTest("no gusset binary: set GUSSET_BINARY or build it with go build -o gusset ./cmd/gusset")
        out = Path(tempfile.mkdtemp(prefix="gusset-pytest-")) / "gusset"
        subprocess.run([go, "build", "-o", str(out), "./cmd/gusset"], cwd=str(root), check=True)
        _built = str(out)
    return _built


_methods: Optional[List[str]] = None


def methods() -> List[str]:
    """methods lists the methods the binary under test offers."""
    global _methods
    if _methods is None:
        with gusset.Client(binary()) as client:
            _methods = client.methods()
    return _methods


def bar_model(pull: float, length: float = 4.0, modulus: float = 2.1e8, area: float = 1.0e-3) -> Dict[str, Any]:
    """bar_model is one bar along x, pinned at A, on a roller at B, pulled at B by ``pull`` along +x."""
    return {
        "dimension": 2,
        "units": {"length": "m", "force": "kN"},
        "materials": [{"id": "steel", "elastic_modulus": modulus}],
        "sections": [{"id": "rod", "area": area}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [length, 0]}],
        "members": [{"id": "AB", "ends": ["A", "B"], "material": "steel", "section": "rod"}],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["y"]}],
        "load_cases": [{"id": "pull", "loads": [{"node": "B", "force": [pull, 0]}]}],
    }


def grid_truss(n: int) -> Dict[str, Any]:
    """grid_truss is an n×n braced square grid on a pinned base: a model big enough to take a while."""
    def node(i: int, j: int) -> str:
        return "n%d_%d" % (i, j)

    members = []
    for i in range(n + 1):
        for j in range(n + 1):
            ends = []
            if i < n:
                ends.append((node(i, j), node(i + 1, j)))
            if j < n:
                ends.append((node(i, j), node(i, j + 1)))
            if i < n and j < n:
                ends.append((node(i, j), node(i + 1, j + 1)))
            for a, b in ends:
                members.append({"id": "%s-%s" % (a, b), "ends": [a, b], "material": "steel", "section": "rod"})
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
        "sections": [{"id": "rod", "area": 1.0e-3}],
        "nodes": [{"id": node(i, j), "at": [i, j]} for i in range(n + 1) for j in range(n + 1)],
        "members": members,
        "supports": [{"node": node(i, 0), "fix": ["x", "y"]} for i in range(n + 1)],
        "load_cases": [{"id": "wind", "loads": [{"node": node(i, n), "force": [1, -1]} for i in range(n + 1)]}],
    }


FAKE_SERVER = r'''
import json, sys, time
mode = sys.argv[sys.argv.index("--mode") + 1]
for line in sys.stdin:
    message = json.loads(line)
    if mode == "garbage":
        sys.stdout.write("this line is not JSON\n")
        sys.stdout.flush()
    if mode == "die":
        sys.stderr.write("fatal: the fake server gives up\n")
        sys.stderr.flush()
        sys.exit(3)
    if mode == "slow":
        time.sleep(0.2)
    answer = {"jsonrpc": "2.0", "id": message["id"], "result": {"method": message["method"]}}
    sys.stdout.write(json.dumps(answer) + "\n")
    sys.stdout.flush()
'''


def fake_binary(directory: str) -> str:
    """fake_binary writes a tiny stand-in server and returns its path.

    Started with ``--mode garbage`` it writes a non-JSON line before each
    answer; with ``--mode die`` it writes to stderr and exits at the first
    request; with ``--mode slow`` it answers after 0.2 s.
    """
    if os.name != "posix":
        raise unittest.SkipTest("fake binaries are scripts with a #! line")
    path = Path(directory) / "fake-gusset"
    path.write_text("#!%s\n%s" % (sys.executable, FAKE_SERVER))
    path.chmod(path.stat().st_mode | stat.S_IXUSR)
    return str(path)


def stop(pid: int) -> None:
    """stop sends SIGSTOP and returns once every thread of the process has stopped.

    kill returns before a busy multi-threaded process has finished stopping,
    and a request sent in that window could still be answered.
    """
    import signal
    import time

    os.kill(pid, signal.SIGSTOP)
    tasks = Path("/proc/%d/task" % pid)
    if not tasks.is_dir():
        time.sleep(0.2)
        return
    deadline = time.monotonic() + 5.0
    while time.monotonic() < deadline:
        states = []
        for task in tasks.iterdir():
            try:
                states.append((task / "stat").read_text().rsplit(")", 1)[1].split()[0])
            except (OSError, IndexError):
                pass
        if states and all(state in ("T", "t") for state in states):
            return
        time.sleep(0.005)
    raise AssertionError("process %d did not stop within 5 s" % pid)
