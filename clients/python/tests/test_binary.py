"""Tests of how the client finds the binary."""

import os
import stat
import tempfile
import unittest
from pathlib import Path

import support  # noqa: F401 (puts the package on sys.path)
from support import gusset


def executable(directory: str, name: str = "gusset") -> str:
    path = Path(directory) / name
    path.write_text("#!/bin/sh\n")
    path.chmod(path.stat().st_mode | stat.S_IXUSR)
    return str(path)


@unittest.skipUnless(os.name == "posix", "uses executable scripts")
class FindBinaryTest(unittest.TestCase):
    def test_order(self) -> None:
        with tempfile.TemporaryDirectory() as a, tempfile.TemporaryDirectory() as b, \
                tempfile.TemporaryDirectory() as c, tempfile.TemporaryDirectory() as d:
            given, configured, on_path, built = (executable(x) for x in (a, b, c, d))
            env = {"GUSSET_BINARY": configured, "PATH": c}
            hints = [Path(built)]
            self.assertEqual(gusset.find_binary(given, env, hints), os.path.realpath(given))
            self.assertEqual(gusset.find_binary(None, env, hints), os.path.realpath(configured))
            self.assertEqual(gusset.find_binary(None, {"PATH": c}, hints), on_path)
            self.assertEqual(gusset.find_binary(None, {"PATH": ""}, hints), os.path.realpath(built))

    def test_nothing_found_says_how_to_build(self) -> None:
        with tempfile.TemporaryDirectory() as empty:
            with self.assertRaises(gusset.GussetNotFound) as caught:
                gusset.find_binary(None, {"PATH": empty}, [Path(empty) / "gusset"])
        message = str(caught.exception)
        self.assertIn("go build -o gusset ./cmd/gusset", message)
        self.assertIn("GUSSET_BINARY", message)
        self.assertEqual(len(caught.exception.searched), 2)

    def test_bad_setting_is_not_skipped_over(self) -> None:
        # A wrong GUSSET_BINARY is an error, not a reason to run some other
        # gusset found on PATH.
        with tempfile.TemporaryDirectory() as c:
            executable(c)
            with self.assertRaises(gusset.GussetNotFound) as caught:
                gusset.find_binary(None, {"GUSSET_BINARY": "/nonexistent/gusset", "PATH": c}, [])
        self.assertIn("/nonexistent/gusset", str(caught.exception))

    def test_not_executable(self) -> None:
        with tempfile.TemporaryDirectory() as a:
            path = Path(a) / "gusset"
            path.write_text("not a program")
            with self.assertRaises(gusset.GussetNotFound):
                gusset.find_binary(str(path), {"PATH": ""}, [])


if __name__ == "__main__":
    unittest.main()
