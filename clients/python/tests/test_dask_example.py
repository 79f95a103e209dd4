"""The Dask example runs a sharded sweep on a LocalCluster of worker processes.

Debian's python3-distributed (installed by .ci/run) provides Dask; the
test runs the example as a user would, with an interpreter that has it
(this one, or Debian's /usr/bin/python3), and checks that the shards'
merge is the one process's result: every global index once, in order,
and identical JSON (the example's own comparison, checked again here on
the file it writes).
"""

import json
import os
import subprocess
import sys
import tempfile
import unittest
from pathlib import Path

import support

CLIENT = Path(__file__).resolve().parents[1]


def dask_python():
    for candidate in (sys.executable, "/usr/bin/python3"):
        if os.path.exists(candidate) and subprocess.run(
                [candidate, "-c", "import distributed"], capture_output=True).returncode == 0:
            return candidate
    return None


class DaskShardedSweep(unittest.TestCase):
    def test_shards_on_a_local_cluster_merge_to_one_process_result(self):
        python = dask_python()
        if python is None:
            if os.environ.get("GUSSET_REQUIRE_CLIENTS") == "1":
                self.fail("Dask's distributed is missing (GUSSET_REQUIRE_CLIENTS=1): .ci/run installs python3-distributed")
            self.skipTest("Dask's distributed is not installed")
        with tempfile.TemporaryDirectory() as out:
            merged_file = Path(out) / "merged.json"
            env = dict(os.environ, GUSSET_BINARY=support.binary(), PYTHONDONTWRITEBYTECODE="1")
            done = subprocess.run([python, "examples/dask_sharded_sweep.py", "--grid", "6", "--shards", "3",
                                   "--workers", "2", str(merged_file)],
                                  cwd=str(CLIENT), env=env, capture_output=True, text=True, timeout=180)
            self.assertEqual(done.returncode, 0, done.stdout + done.stderr)
            self.assertIn("identical to one process's: yes", done.stdout)
            self.assertIn("on 2 Dask workers", done.stdout)
            merged = json.loads(merged_file.read_text())
            self.assertEqual(merged["total"], 36)
            self.assertEqual([s["index"] for s in merged["steps"]], list(range(36)))
            # Step k of a 6 × 6 grid has depth index k // 6 and rise index
            # k % 6 (the first parameter varies slowest), on the ranges the
            # example declares: depth 1..7 m, rise 0..4 m.
            for s in merged["steps"]:
                i, j = divmod(s["index"], 6)
                self.assertAlmostEqual(s["values"][0], 1.0 + 6.0 * i / 5, places=12)
                self.assertAlmostEqual(s["values"][1], 4.0 * j / 5, places=12)


if __name__ == "__main__":
    unittest.main()
