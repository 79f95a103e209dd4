"""benchmark measures the Python client's requests per second and its overhead.

Usage: python3 benchmark.py [--binary PATH] [--requests N]

For each small request (describe, and a one-bar solve when the binary has
solve) it times, over one process:

- raw: the request line written to a plain pipe and the answer line read
  back, with no JSON work in Python: the server plus the pipe;
- call: Client.call one request at a time (latency);
- pipelined: Client.start for a batch of 64, then every result;
- threads: four threads each calling one request at a time.

The client's overhead per request is call minus raw. Wall times are the
least of five rounds (other work on the machine only ever adds time); the
CPU columns are this Python process's processor time per request in the
raw and call modes, which other load inflates far less, so their
difference is the steadier measure of the client's own cost.
"""

import argparse
import json
import subprocess
import sys
import threading
import time
from pathlib import Path
from typing import Any, Callable, Dict, List, Optional, Tuple

sys.path.insert(0, str(Path(__file__).resolve().parent))

import gusset  # noqa: E402

BAR = {
    "dimension": 2,
    "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
    "sections": [{"id": "rod", "area": 1.0e-3}],
    "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [4, 0]}],
    "members": [{"id": "AB", "ends": ["A", "B"], "material": "steel", "section": "rod"}],
    "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["y"]}],
    "load_cases": [{"id": "pull", "loads": [{"node": "B", "force": [7, 0]}]}],
}


ROUNDS = 5


def timed(count: int, run: Callable[[], None]) -> float:
    """timed returns the least wall seconds per request over ROUNDS runs of run, which makes count requests."""
    best = float("inf")
    for _ in range(ROUNDS):
        begun = time.perf_counter()
        run()
        best = min(best, time.perf_counter() - begun)
    return best / count


def cpu_timed(count: int, run: Callable[[], None]) -> float:
    """cpu_timed returns this process's processor seconds per request of run."""
    begun = time.process_time()
    run()
    return (time.process_time() - begun) / count


def raw_pipe(binary: str, method: str, params: Optional[Dict[str, Any]], count: int) -> Tuple[float, float]:
    process = subprocess.Popen([binary, "serve", "--jobs", "1"], stdin=subprocess.PIPE, stdout=subprocess.PIPE)
    assert process.stdin is not None and process.stdout is not None
    lines = [(json.dumps({"jsonrpc": "2.0", "id": i, "method": method, "params": params or {}}) + "\n").encode()
             for i in range(count + 50)]
    for line in lines[count:]:  # warm up
        process.stdin.write(line)
        process.stdin.flush()
        process.stdout.readline()

    def run() -> None:
        for line in lines[:count]:
            process.stdin.write(line)
            process.stdin.flush()
            process.stdout.readline()

    seconds, cpu = timed(count, run), cpu_timed(count, run)
    process.stdin.close()
    process.wait()
    return seconds, cpu


def with_client(binary: str, method: str, params: Optional[Dict[str, Any]],
                count: int) -> Tuple[float, float, float, float]:
    with gusset.Client(binary, jobs=1) as client:
        for _ in range(50):
            client.call(method, params)

        def sequential() -> None:
            for _ in range(count):
                client.call(method, params)

        def pipelined() -> None:
            for _ in range(0, count, 64):
                calls = [client.start(method, params, keep_progress=False) for _ in range(64)]
                for call in calls:
                    call.result()

        def threads() -> None:
            share = count // 4
            workers = [threading.Thread(target=lambda: [client.call(method, params) for _ in range(share)])
                       for _ in range(4)]
            for w in workers:
                w.start()
            for w in workers:
                w.join()

        return (timed(count, sequential), cpu_timed(count, sequential), timed(count // 64 * 64, pipelined),
                timed(count // 4 * 4, threads))


def main(argv: List[str]) -> None:
    parser = argparse.ArgumentParser(description=__doc__.split("\n")[0])
    parser.add_argument("--binary", default=None)
    parser.add_argument("--requests", type=int, default=1000, help="requests per round")
    options = parser.parse_args(argv)
    binary = gusset.find_binary(options.binary)
    with gusset.Client(binary) as client:
        methods = client.methods()
    cases = [("describe", None)]
    if "solve" in methods:
        cases.append(("solve", {"model": BAR}))
    print("Python %s, %d requests per round, best of %d rounds, one process with --jobs 1"
          % (sys.version.split()[0], options.requests, ROUNDS))
    print("%-9s %8s %8s %8s %8s %10s %9s %9s %9s" % ("request", "raw", "call", "pipeline", "threads",
                                                    "overhead", "raw CPU", "call CPU", "CPU over"))
    for method, params in cases:
        raw, raw_cpu = raw_pipe(binary, method, params, options.requests)
        call, cpu, pipelined, threads = with_client(binary, method, params, options.requests)
        print("%-9s %8.1f %8.1f %8.1f %8.1f %10.1f %9.1f %9.1f %9.1f"
              % (method, raw * 1e6, call * 1e6, pipelined * 1e6, threads * 1e6, (call - raw) * 1e6,
                 raw_cpu * 1e6, cpu * 1e6, (cpu - raw_cpu) * 1e6))
    print("all in µs per request (requests per second = 10⁶ / µs); overhead = call − raw")


if __name__ == "__main__":
    main(sys.argv[1:])
