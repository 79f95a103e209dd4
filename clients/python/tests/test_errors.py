"""Tests of the mapping from wire errors to exceptions."""

import json
import subprocess
import unittest

import support  # noqa: F401 (puts the package on sys.path)
from support import gusset


class ErrorClassTest(unittest.TestCase):
    def test_codes(self) -> None:
        # The codes come from the published schema's ErrorCode definition
        # (`gusset schema`), the one table the server's codes and these
        # classes are generated from; the reserved codes are JSON-RPC 2.0's
        # (section 5.1).
        schema = json.loads(subprocess.run([support.binary(), "schema"], check=True, capture_output=True).stdout)
        table = schema["$defs"]["ErrorCode"]["oneOf"]
        self.assertGreaterEqual(len(table), 20)
        for entry in [e for e in table if -32768 <= e["const"] <= -32000]:
            self.assertIn(entry["const"], (-32700, -32600, -32601, -32602, -32603) + tuple(range(-32099, -31999)))
        for entry in table:
            code, kind = entry["const"], entry["title"]
            with self.subTest(code=code):
                cls = gusset.error_class(code)
                self.assertEqual((cls.CODE, cls.KIND), (code, kind))
                self.assertEqual(cls.__name__, "".join(w[:1].upper() + w[1:] for w in kind.split()))
                self.assertIs(getattr(gusset, cls.__name__), cls)
                err = gusset.from_wire({"code": code, "message": "m", "data": {"kind": "k", "problems": []}})
                self.assertIsInstance(err, cls)
                self.assertIsInstance(err, gusset.GussetError)
                self.assertEqual(err.code, code)
        self.assertEqual(sorted(c.CODE for c in gusset.errors.WIRE_ERRORS), sorted(e["const"] for e in table))
        self.assertIs(gusset.error_class(4242), gusset.GussetError)

    def test_fields(self) -> None:
        wire = {
            "code": 1002,
            "message": "The structure is a mechanism.",
            "data": {
                "kind": "unstable structure",
                "problems": [{"path": "/params/model/nodes/1", "message": "free to move in y"}],
                "detail": {"freedoms": [{"node": "B", "component": "y"}]},
            },
        }
        err = gusset.from_wire(wire, request_id=7, method="solve")
        self.assertEqual(err.message, "The structure is a mechanism.")
        self.assertEqual(err.kind, "unstable structure")
        self.assertEqual(err.problems, [("/params/model/nodes/1", "free to move in y")])
        self.assertEqual(err.problems[0].path, "/params/model/nodes/1")
        self.assertEqual(err.detail["freedoms"][0]["node"], "B")
        self.assertEqual((err.request_id, err.method), (7, "solve"))

    def test_malformed_error_objects(self) -> None:
        for wire in (None, "boom", {}, {"code": "x"}, {"code": 1000, "data": {"problems": "no"}}):
            with self.subTest(wire=wire):
                err = gusset.from_wire(wire)
                self.assertIsInstance(err, gusset.GussetError)
                self.assertTrue(err.message)

    def test_timeout_is_builtin_timeout(self) -> None:
        self.assertTrue(issubclass(gusset.RequestTimeout, TimeoutError))
        self.assertTrue(issubclass(gusset.RequestTimeout, gusset.GussetError))


if __name__ == "__main__":
    unittest.main()
