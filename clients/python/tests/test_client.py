"""Tests of gusset.Client against the real binary."""

import json
import logging
import os
import signal
import subprocess
import tempfile
import threading
import time
import unittest
from pathlib import Path
from typing import Any, Dict, List, Optional

import support
from support import gusset


def close_within(value: float, expected: float, rel: float) -> bool:
    return abs(value - expected) <= rel * abs(expected)


class DescribeTest(unittest.TestCase):
    def test_describe_matches_published_schema(self) -> None:
        # The schema id and method names are checked against `gusset schema`,
        # the published JSON Schema, and the JSON-RPC methods every server
        # must offer (DESIGN.md, "Wire protocol").
        schema = json.loads(subprocess.run([support.binary(), "schema"], check=True,
                                           stdout=subprocess.PIPE).stdout)
        with gusset.Client(support.binary()) as client:
            info = client.describe()
        self.assertEqual(info["name"], "gusset")
        self.assertEqual(info["schema_id"], schema["$id"])
        names = [m["name"] for m in info["methods"]]
        self.assertIn("describe", names)
        self.assertIn("cancel", names)
        for method in info["methods"]:
            self.assertIn(method["params"], schema["$defs"], method["name"])
        self.assertGreater(info["limits"]["max_line_bytes"], 0)


class PairingTest(unittest.TestCase):
    def test_threads_get_their_own_answers(self) -> None:
        # Each thread sends requests whose answers differ and checks that it
        # got its own: describe, an unknown method whose error names it, and
        # (when solve exists) a pulled bar whose axial force equals the pull
        # by the equilibrium of node B and whose extension is PL/(EA)
        # (Hooke's law; Gere & Goodno, Mechanics of Materials, eq. 2-3, from
        # memory).
        has_solve = "solve" in support.methods()
        failures = []
        with gusset.Client(support.binary(), jobs=2) as client:
            def worker(thread: int) -> None:
                try:
                    for i in range(40):
                        kind = i % 3
                        if kind == 0:
                            self.assertEqual(client.describe()["name"], "gusset")
                        elif kind == 1 or not has_solve:
                            name = "no-such-method-%d-%d" % (thread, i)
                            with self.assertRaises(gusset.MethodNotFound) as caught:
                                client.call(name)
                            self.assertIn(name, caught.exception.message)
                        else:
                            pull = 1.0 + thread * 100 + i
                            result = client.solve(support.bar_model(pull))
                            case = result["cases"][0]
                            self.assertTrue(close_within(case["axial_forces"][0], pull, 1e-9))
                            extension = pull * 4.0 / (2.1e8 * 1.0e-3)
                            self.assertTrue(close_within(case["displacements"][1][0], extension, 1e-9))
                except BaseException as err:  # reported by the main thread
                    failures.append(err)

            threads = [threading.Thread(target=worker, args=(t,)) for t in range(8)]
            for t in threads:
                t.start()
            for t in threads:
                t.join()
        if failures:
            raise failures[0]

    def test_ids_increase(self) -> None:
        with gusset.Client(support.binary()) as client:
            first = client.start("describe")
            second = client.start("describe")
            self.assertLess(first.id, second.id)
            self.assertEqual(first.result()["name"], second.result()["name"])


class ErrorTest(unittest.TestCase):
    def test_schema_error_carries_pointer(self) -> None:
        # -32602 is invalid params in JSON-RPC 2.0 (specification, section 5.1).
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.InvalidParams) as caught:
                client.call("cancel", {"request": [1]})
        err = caught.exception
        self.assertEqual(err.code, -32602)
        self.assertEqual(err.kind, "invalid params")
        self.assertIn("/params/request", [p.path for p in err.problems])
        self.assertIn("/params/request", str(err))

    def test_unknown_method(self) -> None:
        # -32601 is method not found in JSON-RPC 2.0 (specification, section 5.1).
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.MethodNotFound) as caught:
                client.call("frobnicate")
        self.assertEqual(caught.exception.code, -32601)
        self.assertEqual([p.path for p in caught.exception.problems], ["/method"])

    def test_dangling_node_points_at_member_end(self) -> None:
        if "solve" not in support.methods():
            self.skipTest("solve is not registered in this binary")
        model = support.bar_model(7.0)
        model["members"][0]["ends"] = ["A", "Z"]
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.GussetError) as caught:
                client.solve(model)
        err = caught.exception
        self.assertIn(err.code, (1000, -32602))
        self.assertIsInstance(err, gusset.error_class(err.code))
        self.assertIn("/params/model/members/0/ends/1", [p.path for p in err.problems])

    def test_mechanism_is_unstable_structure(self) -> None:
        # A bar pinned at one end only and loaded across itself turns about
        # the pin: a mechanism (Maxwell's rule, b - 2j + k = 1 - 4 + 2 < 0).
        if "solve" not in support.methods():
            self.skipTest("solve is not registered in this binary")
        model = support.bar_model(7.0)
        model["supports"] = [{"node": "A", "fix": ["x", "y"]}]
        model["load_cases"][0]["loads"][0]["force"] = [0, -5]
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.UnstableStructure) as caught:
                client.solve(model)
        self.assertEqual(caught.exception.code, 1002)
        self.assertIsNotNone(caught.exception.detail)


class CancelTest(unittest.TestCase):
    def test_cancel_of_finished_request(self) -> None:
        with gusset.Client(support.binary()) as client:
            call = client.start("describe")
            call.result()
            self.assertFalse(client.cancel(call))
            self.assertFalse(client.cancel(987654))

    def test_cancel_in_flight(self) -> None:
        if "solve" not in support.methods():
            self.skipTest("solve is not registered: no request lasts long enough to cancel")
        with gusset.Client(support.binary()) as client:
            call = client.start("solve", {"model": support.grid_truss(60)})
            self.assertTrue(call.cancel())
            with self.assertRaises(gusset.Cancelled) as caught:
                call.result()
            self.assertEqual(caught.exception.code, -32000)
            self.assertEqual(client.describe()["name"], "gusset")


def process_state(pid: int) -> Optional[str]:
    """process_state is the state letter in /proc/PID/stat, or None once
    the process is gone (it may be reaped between any two reads)."""
    try:
        stat = Path("/proc/%d/stat" % pid).read_text()
    except OSError:
        return None
    return stat.rsplit(")", 1)[1].split()[0]


def fully_ended(pid: int) -> bool:
    """fully_ended says a killed process has let go of its pipes: it is
    gone, or a zombie whose every thread has exited. A multi-threaded
    process's leader shows "Z" while its other threads are still being
    torn down, and the threads share the open files, so until the last
    one exits a line written to its standard input is still accepted."""
    if process_state(pid) is None:
        return True
    try:
        threads = os.listdir("/proc/%d/task" % pid)
    except OSError:
        return True
    return process_state(pid) == "Z" and len(threads) <= 1


class StreamTest(unittest.TestCase):
    def test_progress_streams_before_result(self) -> None:
        if "solve" not in support.methods():
            self.skipTest("solve is not registered in this binary")
        with gusset.Client(support.binary()) as client:
            call = client.start("solve", {"model": support.grid_truss(60)})
            seen = list(call)
            self.assertTrue(call.done())
            self.assertGreater(len(seen), 0)
            for item in seen:
                self.assertEqual(item.request, call.id)
                self.assertTrue(item.stage)
                self.assertLessEqual(item.done, item.total or item.done)
            self.assertEqual(len(call.result()["cases"]), 1)

    def test_sweep_steps_stream(self) -> None:
        # A single bar carrying axial force N over length L has load path
        # |N|·L (Maxwell, "On reciprocal figures, frames, and diagrams of
        # forces", 1870; the load path is the sum of |force| × length), and a
        # bar pulled by P carries N = P, so the load path is P·span.
        if "sweep-parameter" not in support.methods():
            self.skipTest("sweep-parameter is not registered in this binary")
        pull = 10.0
        model = support.bar_model(pull)
        model["parameters"] = {"span": 4.0}
        model["nodes"][1]["at"] = ["span", 0]
        spans = [2.0, 3.0, 4.0, 5.0, 6.0]
        with gusset.Client(support.binary()) as client:
            sweep = client.sweep(model, {"name": "span", "values": spans}, metrics=["load_path"])
            streamed = list(sweep)
            result = sweep.result()
            from_callback = []
            final = client.sweep_parameter(model, {"name": "span", "values": spans}, metrics=["load_path"],
                                           on_step=from_callback.append)
        self.assertEqual(sorted(step["index"] for step in streamed), list(range(len(spans))))
        for step in streamed:
            span = step["values"][0]
            self.assertEqual(span, spans[step["index"]])
            self.assertTrue(close_within(step["metrics"]["load_path"], pull * span, 1e-9), step)
        self.assertEqual([step["index"] for step in result["steps"]], list(range(len(spans))))
        self.assertEqual(len(from_callback), len(spans))
        self.assertEqual(final["steps"], result["steps"])


class TimeoutTest(unittest.TestCase):
    def test_timeout_cancels_and_client_goes_on(self) -> None:
        if "solve" not in support.methods():
            self.skipTest("solve is not registered: no request lasts long enough")
        with gusset.Client(support.binary()) as client:
            begun = time.monotonic()
            with self.assertRaises(gusset.RequestTimeout) as caught:
                client.call("solve", {"model": support.grid_truss(60)}, timeout=0.05)
            self.assertIsInstance(caught.exception, TimeoutError)
            self.assertLess(time.monotonic() - begun, 2.0)
            self.assertEqual(client.describe()["name"], "gusset")

    @unittest.skipUnless(hasattr(signal, "SIGSTOP"), "needs SIGSTOP")
    def test_answer_that_never_comes(self) -> None:
        with gusset.Client(support.binary()) as client:
            client.describe()
            support.stop(client.pid)
            try:
                begun = time.monotonic()
                with self.assertRaises(TimeoutError):
                    client.describe(timeout=0.2)
                elapsed = time.monotonic() - begun
                self.assertGreaterEqual(elapsed, 0.2)
                self.assertLess(elapsed, 2.0)
            finally:
                os.kill(client.pid, signal.SIGCONT)
            self.assertEqual(client.describe(timeout=5)["name"], "gusset")


class ProcessTest(unittest.TestCase):
    def test_binary_missing(self) -> None:
        with self.assertRaises(gusset.GussetNotFound) as caught:
            gusset.Client("/nonexistent/gusset")
        self.assertIn("go build -o gusset ./cmd/gusset", str(caught.exception))

    @unittest.skipUnless(hasattr(signal, "SIGKILL"), "needs SIGKILL")
    def test_killed_mid_request_then_restart(self) -> None:
        with gusset.Client(support.binary()) as client:
            first = client.pid
            support.stop(first)  # so the request is surely in flight
            call = client.start("describe")
            os.kill(first, signal.SIGKILL)
            with self.assertRaises(gusset.ProcessDied) as caught:
                call.result(timeout=5)
            self.assertEqual(caught.exception.returncode, -signal.SIGKILL)
            self.assertIn("SIGKILL", str(caught.exception))
            self.assertEqual(client.describe()["name"], "gusset")
            self.assertNotEqual(client.pid, first)

    @unittest.skipUnless(os.path.isdir("/proc/self"), "needs /proc")
    def test_killed_while_idle_next_call_restarts(self) -> None:
        # The call right after the death, before the client's reader has
        # noticed it, must go to a new process and succeed.
        with gusset.Client(support.binary()) as client:
            first = client.pid
            os.kill(first, signal.SIGKILL)
            while not fully_ended(first):
                time.sleep(0.001)
            self.assertEqual(client.describe(timeout=10)["name"], "gusset")
            self.assertNotEqual(client.pid, first)

    def test_death_reports_stderr_tail(self) -> None:
        with tempfile.TemporaryDirectory() as directory:
            with gusset.Client(support.fake_binary(directory), args=["--mode", "die"]) as client:
                with self.assertRaises(gusset.ProcessDied) as caught:
                    client.describe(timeout=5)
        self.assertEqual(caught.exception.returncode, 3)
        self.assertIn("fatal: the fake server gives up", caught.exception.stderr)
        self.assertIn("fatal: the fake server gives up", str(caught.exception))

    def test_non_json_line_is_reported(self) -> None:
        with tempfile.TemporaryDirectory() as directory:
            with gusset.Client(support.fake_binary(directory), args=["--mode", "garbage"]) as client:
                with self.assertLogs("gusset", logging.WARNING) as logs:
                    with self.assertRaises(gusset.ProtocolError) as caught:
                        client.describe(timeout=5)
        self.assertEqual(caught.exception.line, "this line is not JSON")
        self.assertTrue(any("this line is not JSON" in line for line in logs.output))

    def test_close_waits_for_answers(self) -> None:
        with tempfile.TemporaryDirectory() as directory:
            client = gusset.Client(support.fake_binary(directory), args=["--mode", "slow"])
            call = client.start("describe")
            client.close()
            self.assertEqual(call.result(timeout=0), {"method": "describe"})
            self.assertIsNone(client.pid)
            with self.assertRaises(gusset.ClientClosed):
                client.describe()

    def test_context_manager_ends_process(self) -> None:
        with gusset.Client(support.binary()) as client:
            pid = client.pid
            self.assertIsNotNone(pid)
        self.assertIsNone(client.pid)


class LayoutTest(unittest.TestCase):
    def test_joint_cost_switches_layout(self) -> None:
        # A load P = 1 hanging below pins at (-1, 1), (1, 1) and (0, 2.5):
        # two ties at 45 degrees need volume 2P/sigma and cost 2 + sqrt(2)s
        # with a joint cost s per member, the vertical tie 2.5P/sigma and
        # 2.5 + s (hand results from equilibrium at the loaded node; the
        # joint cost after Parkes 1975, from memory).
        if "optimise-layout" not in support.methods():
            self.skipTest("optimise-layout not offered")
        pins = [{"at": p, "fix": ["x", "y"]} for p in ([-1, 1], [1, 1], [0, 2.5])]
        cases = [{"id": "P", "loads": [{"at": [0, 0], "force": [0, -1]}]}]
        nodes = [[0, 0], [-1, 1], [1, 1], [0, 2.5]]
        with gusset.Client(support.binary()) as client:
            plain = client.optimise_layout(supports=pins, cases=cases, nodes=nodes,
                                           tension_limit=1, compression_limit=1)
            costly = client.optimise_layout(supports=pins, cases=cases, nodes=nodes,
                                            tension_limit=1, compression_limit=1, joint_cost=2)
        self.assertEqual(len(plain["members"]), 2)
        self.assertTrue(close_within(plain["volume"], 2, 1e-7))
        self.assertEqual(len(costly["members"]), 1)
        self.assertTrue(close_within(costly["volume"], 2.5, 1e-7))
        self.assertTrue(close_within(costly["objective"], 4.5, 1e-7))

    def test_tripod_in_space(self) -> None:
        # A load P = 10 down at the origin hangs from supports (2, 1, 2),
        # (-2, 1, 2), (1, -2, 2), each 3 away: equilibrium of the loaded
        # node gives N = 3.75, 6.25 and 5 (all tension), volume 15 * 3 = 45
        # with sigma = 1 (hand result; the dual bound that no layout over
        # these nodes needs less is derived in
        # testdata/transcripts/layout-tripod.want.json).
        if "optimise-layout" not in support.methods():
            self.skipTest("optimise-layout not offered")
        legs = [[2, 1, 2], [-2, 1, 2], [1, -2, 2]]
        rounds: List[Dict[str, Any]] = []
        with gusset.Client(support.binary()) as client:
            lay = client.optimise_layout(
                dimension=3, nodes=[[0, 0, 0]] + legs + [[0, 0, 1], [0, 0, 2], [1, 0, 1]],
                supports=[{"at": p, "fix": ["x", "y", "z"]} for p in legs],
                cases=[{"id": "hang", "loads": [{"at": [0, 0, 0], "force": [0, 0, -10]}]}],
                tension_limit=1, compression_limit=1, on_round=rounds.append)
        self.assertTrue(close_within(lay["volume"], 45, 1e-7))
        forces = sorted(m["forces"][0] for m in lay["members"])
        for got, want in zip(forces, [3.75, 5, 6.25]):
            self.assertTrue(close_within(got, want, 1e-7))
        self.assertEqual(lay["model"]["dimension"], 3)
        self.assertGreaterEqual(len(rounds), 1)
        self.assertEqual(rounds[-1]["added"], 0)


class FindFormTest(unittest.TestCase):
    def test_hanging_chain(self) -> None:
        # A chain of 4 unit panels under P = 10 at its inner nodes with
        # q = 5 hangs at y_i = (P/2q)·i·(i − n) = i(i − 4): −3, −4, −3
        # (closed form of the funicular polygon, derived in the Go tests).
        # Maxwell's theorem (Maxwell 1870) gives its load path: all in
        # tension, Z = M = P·(3 + 4 + 3) + H·4 with H = q·1 = 5, so 120.
        if "find-form" not in support.methods():
            self.skipTest("find-form not offered")
        ids = "ABCDE"
        model = {
            "dimension": 2,
            "materials": [{"id": "rope", "elastic_modulus": 1e8}],
            "sections": [{"id": "s", "area": 1e-4}],
            "nodes": [{"id": n, "at": [i, 0]} for i, n in enumerate(ids)],
            "members": [{"id": a + b, "ends": [a, b], "material": "rope", "section": "s"} for a, b in zip(ids, ids[1:])],
            "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "E", "fix": ["x", "y"]}],
            "load_cases": [{"id": "hang", "loads": [{"node": n, "force": [0, -10]} for n in "BCD"]}],
        }
        with gusset.Client(support.binary()) as client:
            found = client.find_form(model, force_density=5)
            again = client.load_path(found["model"], cases=[found["model_case"]], forces=found["forces"])
        heights = [p[1] for p in found["coordinates"]]
        for got, want in zip(heights, [0, -3, -4, -3, 0]):
            self.assertTrue(close_within(got, want, 1e-12), heights)
        self.assertEqual(found["network"], "tension")
        self.assertTrue(close_within(found["load_path"]["load_path"], 120, 1e-12))
        self.assertTrue(close_within(again["cases"][0]["load_path"], 120, 1e-12))


class ModesTest(unittest.TestCase):
    def test_spring_held_strut(self) -> None:
        # A rigid strut of length L = 4 pinned at its foot, its head held
        # sideways by a spring k = 50 and loaded by P = 10: it buckles at
        # λ = k·L/P = 20 (Timoshenko and Gere, Theory of Elastic Stability,
        # 1961, §1.1; from memory). With a mass M = 2 at the head it sways at
        # ω = √(k/M) = 5 rad/s (a single-freedom oscillator).
        if "modes" not in support.methods():
            self.skipTest("modes not offered")
        model = {
            "dimension": 2,
            "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
            "sections": [{"id": "rod", "area": 0.002}],
            "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [0, 4], "mass": 2}],
            "members": [{"id": "AB", "ends": ["A", "B"], "material": "steel", "section": "rod"}],
            "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": [], "springs": {"x": 50}}],
            "load_cases": [{"id": "down", "loads": [{"node": "B", "force": [0, -10]}]}],
        }
        with gusset.Client(support.binary()) as client:
            buckling = client.modes(model, "buckling", count=1)
            vibration = client.modes(model, "vibration", count=1)
        self.assertTrue(close_within(buckling["critical_factor"], 20, 1e-9))
        self.assertTrue(close_within(vibration["modes"][0]["angular_frequency"], 5, 1e-9))
        self.assertIn("imperfections", buckling["caution"])


if __name__ == "__main__":
    unittest.main()
