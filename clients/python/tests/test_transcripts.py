"""Replays testdata/transcripts through the Python client (STYLE.md: the
clients replay the transcripts the Go tests check), with the same subset
matching as cmd/gusset/transcript_test.go: the expected values in each
NAME.want.json are derived by hand and name their source under "_source".

The client numbers its own requests, so a transcript line is replayed only
when the client can send it as it is: a JSON-RPC 2.0 request object with an
id, a method other than cancel (which names the transcript's ids), object
params with finite numbers, and an id used once. Lines that exercise the
framing itself (not JSON, no method, notifications) stay with the Go tests.
"""

import json
import math
import unittest
from pathlib import Path
from typing import Any, Dict, List, Optional, Tuple

import support
from support import gusset

TRANSCRIPTS = Path(__file__).resolve().parents[3] / "testdata" / "transcripts"


def finite(value: Any) -> bool:
    """finite reports whether every number in value is finite."""
    if isinstance(value, float):
        return math.isfinite(value)
    if isinstance(value, dict):
        return all(finite(v) for v in value.values())
    if isinstance(value, list):
        return all(finite(v) for v in value)
    return True


def replayable(lines: List[str]) -> List[Tuple[str, str, Optional[Dict[str, Any]]]]:
    """replayable returns (raw id, method, params) of the lines the client can send."""
    parsed = []
    seen: Dict[str, int] = {}
    for line in lines:
        try:
            request = json.loads(line)
        except ValueError:
            continue
        if not isinstance(request, dict) or request.get("jsonrpc") != "2.0" or "id" not in request:
            continue
        raw_id = json.dumps(request["id"], separators=(",", ":"))
        seen[raw_id] = seen.get(raw_id, 0) + 1
        method, params = request.get("method"), request.get("params")
        if not isinstance(method, str) or method == "cancel":
            continue
        if params is not None and (not isinstance(params, dict) or not finite(params)):
            continue
        parsed.append((raw_id, method, params))
    return [p for p in parsed if seen[p[0]] == 1]


def as_response(call: "gusset.Call") -> Dict[str, Any]:
    """as_response turns a finished call back into the wire response's fields."""
    try:
        return {"result": call.result()}
    except gusset.GussetError as err:
        data: Dict[str, Any] = {"kind": err.kind, "problems": [{"path": p.path, "message": p.message} for p in err.problems]}
        if err.detail is not None:
            data["detail"] = err.detail
        return {"error": {"code": err.code, "message": err.message, "data": data}}


def mismatch(want: Any, got: Any, path: str = "") -> Optional[str]:
    """mismatch returns where got differs from the subset want, or None."""
    if isinstance(want, dict):
        if isinstance(want.get("approx"), (int, float)):
            rel = float(want.get("rel", 0))
            if not isinstance(got, (int, float)) or abs(got - want["approx"]) > rel * abs(want["approx"]):
                return "%s: want %r within %g relative, got %r" % (path, want["approx"], rel, got)
            return None
        if not isinstance(got, dict):
            return "%s: want an object, got %r" % (path, got)
        for key, value in want.items():
            if key not in got:
                return "%s/%s: missing" % (path, key)
            found = mismatch(value, got[key], path + "/" + key)
            if found:
                return found
        return None
    if isinstance(want, list):
        if not isinstance(got, list):
            return "%s: want an array, got %r" % (path, got)
        if want and isinstance(want[0], dict) and "approx" not in want[0]:
            for i, element in enumerate(want):
                if all(mismatch(element, g) for g in got):
                    return "%s/%d: no element matches %r" % (path, i, element)
            return None
        if len(want) != len(got):
            return "%s: want %d elements, got %d" % (path, len(want), len(got))
        for i, (w, g) in enumerate(zip(want, got)):
            found = mismatch(w, g, "%s/%d" % (path, i))
            if found:
                return found
        return None
    if isinstance(want, (int, float)) and not isinstance(want, bool):
        if not isinstance(got, (int, float)) or isinstance(got, bool) or abs(got - want) > 1e-12 + 1e-9 * abs(want):
            return "%s: want %r, got %r" % (path, want, got)
        return None
    if want != got:
        return "%s: want %r, got %r" % (path, want, got)
    return None


class TranscriptTest(unittest.TestCase):
    def test_transcripts(self) -> None:
        inputs = sorted(TRANSCRIPTS.glob("*.in.jsonl"))
        self.assertTrue(inputs, "no transcripts under %s" % TRANSCRIPTS)
        with gusset.Client(support.binary()) as client:
            for path in inputs:
                name = path.name[: -len(".in.jsonl")]
                with self.subTest(transcript=name):
                    want = json.loads(path.with_name(name + ".want.json").read_text(encoding="utf-8"))
                    self.assertIn("_source", want)
                    lines = path.read_text(encoding="utf-8").splitlines()
                    calls = {raw_id: client.start(method, params) for raw_id, method, params in replayable(lines)}
                    checked = 0
                    for raw_id, call in calls.items():
                        got = as_response(call)
                        if raw_id not in want:
                            continue
                        found = mismatch(want[raw_id], got)
                        self.assertIsNone(found, "id %s: %s" % (raw_id, found))
                        checked += 1
                    self.assertGreater(checked, 0, "no expected response could be replayed")


if __name__ == "__main__":
    unittest.main()
