"""Tests of the mapping from wire errors to exceptions."""

import unittest

import support  # noqa: F401 (puts the package on sys.path)
from support import gusset


class ErrorClassTest(unittest.TestCase):
    def test_codes(self) -> None:
        # JSON-RPC's reserved codes come from the JSON-RPC 2.0 specification
        # (section 5.1); the server's own and the application codes from
        # /work/shared/DESIGN.md, "Wire protocol", and protocol/message.go.
        table = [
            (-32700, gusset.ParseError),
            (-32600, gusset.InvalidRequest),
            (-32601, gusset.MethodNotFound),
            (-32602, gusset.InvalidParams),
            (-32603, gusset.InternalError),
            (-32000, gusset.Cancelled),
            (-32001, gusset.LimitExceeded),
            (-32002, gusset.Overloaded),
            (-32003, gusset.ShuttingDown),
            (-32004, gusset.TimeLimit),
            (1000, gusset.InvalidModel),
            (1001, gusset.ExpressionError),
            (1002, gusset.UnstableStructure),
            (1003, gusset.NotPlanar),
            (1004, gusset.NotInEquilibrium),
            (1005, gusset.WrongDimension),
            (1006, gusset.MissingData),
            (1007, gusset.Infeasible),
            (1008, gusset.NoSolution),
            (1009, gusset.UnknownCase),
        ]
        for code, cls in table:
            with self.subTest(code=code):
                self.assertIs(gusset.error_class(code), cls)
                err = gusset.from_wire({"code": code, "message": "m", "data": {"kind": "k", "problems": []}})
                self.assertIsInstance(err, cls)
                self.assertIsInstance(err, gusset.GussetError)
                self.assertEqual(err.code, code)
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
