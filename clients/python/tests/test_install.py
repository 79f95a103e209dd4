"""pip install ./clients/python works offline (issue: no index on the machine).

The client's build backend (_build/stdlib_backend.py) uses the standard
library alone, so pip's isolated build environment needs nothing from a
package index. The test installs with --no-index into a scratch folder and
imports the installed copy in a fresh interpreter.
"""

import os
import subprocess
import sys
import tempfile
import unittest
import zipfile
from pathlib import Path

HERE = Path(__file__).resolve().parent
PROJECT = HERE.parent


def _has_pip() -> bool:
    return subprocess.run([sys.executable, "-m", "pip", "--version"], capture_output=True).returncode == 0


class OfflineInstall(unittest.TestCase):
    def setUp(self):
        if not _has_pip():
            if os.environ.get("GUSSET_REQUIRE_CLIENTS") == "1":
                self.fail("pip is missing (GUSSET_REQUIRE_CLIENTS=1): .ci/run installs python3-pip")
            self.skipTest("pip is not installed")

    def test_pip_install_without_an_index(self):
        with tempfile.TemporaryDirectory() as target:
            env = dict(os.environ, PIP_NO_INDEX="1", PIP_DISABLE_PIP_VERSION_CHECK="1")
            done = subprocess.run(
                [sys.executable, "-m", "pip", "install", "--no-index", "--no-deps", "--target", target, str(PROJECT)],
                capture_output=True, text=True, env=env)
            self.assertEqual(done.returncode, 0, done.stdout + done.stderr)
            installed = Path(target) / "gusset"
            for name in ("__init__.py", "client.py", "errors.py", "binary.py", "py.typed"):
                self.assertTrue((installed / name).is_file(), name)
            probe = subprocess.run(
                [sys.executable, "-c", "import gusset, sys; print(gusset.__file__); print(hasattr(gusset, 'Client'))"],
                capture_output=True, text=True, env=dict(os.environ, PYTHONPATH=target), cwd=target)
            self.assertEqual(probe.returncode, 0, probe.stderr)
            self.assertTrue(probe.stdout.startswith(str(installed)), probe.stdout)
            self.assertIn("True", probe.stdout)

    def test_wheel_record_matches_contents(self):
        # PEP 427: RECORD lists every file with its sha256 and size.
        sys.path.insert(0, str(PROJECT / "_build"))
        try:
            import stdlib_backend
        finally:
            sys.path.pop(0)
        import base64
        import hashlib
        with tempfile.TemporaryDirectory() as out:
            name = stdlib_backend.build_wheel(out)
            self.assertEqual(name, "gusset-0.1.0-py3-none-any.whl")
            with zipfile.ZipFile(os.path.join(out, name)) as z:
                record = z.read("gusset-0.1.0.dist-info/RECORD").decode().splitlines()
                for line in record:
                    path, digest, size = line.rsplit(",", 2)
                    if path.endswith("RECORD"):
                        continue
                    data = z.read(path)
                    want = "sha256=" + base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
                    self.assertEqual(digest, want, path)
                    self.assertEqual(int(size), len(data), path)
                self.assertEqual(len(record), len(z.namelist()))


if __name__ == "__main__":
    unittest.main()
