"""Tests that run every worked example in clients/python/examples against the real binary.

Each example runs as a user runs it (``python3 examples/x.py`` from
clients/python, in a fresh process) and its files are checked against
results derived by hand, not against the solver's own output.
"""

import csv
import itertools
import json
import math
import os
import shutil
import subprocess
import sys
import tempfile
import unittest
import xml.etree.ElementTree as ET
from pathlib import Path
from typing import Dict, List, Optional, Tuple

import support

CLIENT = Path(__file__).resolve().parents[1]
EXAMPLES = CLIENT / "examples"
CAUTION = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."
STANDARD_GRAVITY = 9.80665  # m/s², 3rd CGPM (1901)


def run_example(name: str, args: List[str], env: Optional[Dict[str, str]] = None) -> str:
    """run_example runs one example from clients/python and returns its standard output."""
    environ = dict(os.environ, GUSSET_BINARY=support.binary(), PYTHONDONTWRITEBYTECODE="1")
    environ.pop("GUSSET_EXAMPLES_OUT", None)
    environ.update(env or {})
    done = subprocess.run([sys.executable, str(Path("examples") / name)] + args, cwd=str(CLIENT), env=environ,
                          stdout=subprocess.PIPE, stderr=subprocess.PIPE, universal_newlines=True, timeout=60)
    if done.returncode != 0:
        raise AssertionError("%s failed with status %d:\n%s%s" % (name, done.returncode, done.stdout, done.stderr))
    return done.stdout


def close(value: float, expected: float, rel: float, abs_tol: float = 0.0) -> bool:
    return abs(value - expected) <= max(rel * abs(expected), abs_tol)


def pratt_member_forces(panels: int, a: float, h: float, p: float) -> List[Tuple[float, float]]:
    """pratt_member_forces returns (axial force, length) of every member of the walkway's Pratt truss.

    Derived by the method of sections (Ritter's method; Hibbeler,
    Structural Analysis, ch. 3, from memory) for n panels of width a and
    depth h (n even), end posts leaning in, inner diagonals sloping down to
    mid-span, a load P at each inner bottom node, pin and roller at the
    ends. Reactions R = (n − 1)P/2; the moment at bottom node i is
    M_i = P·a·i·(n − i)/2 and the shear in panel i is V_i = R − i·P; the
    diagonal's length is d = √(a² + h²). In the left half (right half by
    symmetry), panel i:
      bottom chord  +M_i/h (moments about U_i), +M_1/h in the end panel;
      top chord     −M_(i+1)/h (moments about L_(i+1)), panels 1..;
      end post      −R·d/h (vertical equilibrium of L0);
      diagonal      +V_i·d/h (vertical forces on the section);
      vertical U1   +P (L1 holds only the chords, U1-L1 and the load);
      vertical U_i  −V_i for 2 ≤ i < n/2 (vertical forces at U_i).
    The middle vertical carries nothing for n ≥ 4 (U_(n/2) holds only the
    top chord and it) and +P for n = 2, where the truss is two struts, a
    tie and a hanger: Z = P·h + P(a² + h²)/h + P·a²/h.
    """
    r = (panels - 1) * p / 2
    d = math.hypot(a, h)

    def moment(i: int) -> float:
        return p * a * i * (panels - i) / 2

    half = []
    for i in range(panels // 2):
        half.append((moment(max(i, 1)) / h, a))
        if i >= 1:
            half.append((-moment(i + 1) / h, a))
            half.append((p if i == 1 else -(r - i * p), h))
        half.append(((-r if i == 0 else r - i * p) * d / h, d))
    middle = (p if panels == 2 else 0.0, h)
    return half + half + [middle]


class WalkwayVariantsTest(unittest.TestCase):
    """walkway_variants.py: Pratt trusses of 2 to 8 panels over 18 m, 6 kN/m, tube sizing."""

    SPAN, LINE_LOAD = 18.0, 6.0  # the example's scenario
    PANELS = [2, 4, 6, 8]
    DEPTHS = [0.75 + 0.25 * i for i in range(16)]
    LIMIT, WEIGHT_DENSITY, CARBON_FACTOR = 2.35e5, 77.0, 1.55  # kN/m², kN/m³, kg CO2e/kg
    COLUMNS = ["variant", "depth_m", "panels", "max_force_kN", "load_path_kNm", "volume_m3", "mass_kg",
               "carbon_kgCO2e"]

    @classmethod
    def setUpClass(cls) -> None:
        cls.folder = tempfile.mkdtemp(prefix="gusset-example-test-")
        cls.stdout = run_example("walkway_variants.py", [], {"GUSSET_EXAMPLES_OUT": cls.folder})
        with open(os.path.join(cls.folder, "walkway-variants.csv"), newline="") as f:
            cls.header = next(csv.reader(f))
            f.seek(0)
            cls.rows = list(csv.DictReader(f))

    @classmethod
    def tearDownClass(cls) -> None:
        shutil.rmtree(cls.folder, ignore_errors=True)

    def test_table_has_a_row_per_variant(self) -> None:
        self.assertEqual(self.header, self.COLUMNS)
        self.assertEqual(sorted(os.listdir(self.folder)), ["walkway-variants.csv", "walkway-volume.svg"])
        got = sorted((int(r["panels"]), float(r["depth_m"])) for r in self.rows)
        self.assertEqual(got, sorted(itertools.product(self.PANELS, self.DEPTHS)))
        self.assertEqual(len({r["variant"] for r in self.rows}), len(self.rows))
        self.assertIn(CAUTION, self.stdout)

    def test_load_path_and_largest_force_by_method_of_sections(self) -> None:
        for row in self.rows:
            n, h = int(row["panels"]), float(row["depth_m"])
            a = self.SPAN / n
            forces = pratt_member_forces(n, a, h, self.LINE_LOAD * a)
            self.assertEqual(len(forces), 4 * n - 3)  # Maxwell's rule: b = 2j − 3 with j = 2n
            z = sum(abs(f) * length for f, length in forces)
            with self.subTest(variant=row["variant"]):
                self.assertTrue(close(float(row["load_path_kNm"]), z, 1e-9), (row["load_path_kNm"], z))
                biggest = max(abs(f) for f, _ in forces)
                self.assertTrue(close(float(row["max_force_kN"]), biggest, 1e-9), (row["max_force_kN"], biggest))

    def test_two_panel_load_path_in_closed_form(self) -> None:
        # The two-panel truss is two struts, a tie and a hanger under one
        # load P = 54 kN at mid-span (a = 9 m): Z = P·h + P(a² + h²)/h +
        # P·a²/h by joint equilibrium (hand calculation, common practice);
        # at h = 1 m that is 54 + 54·82 + 54·81 = 8856 kN·m.
        row = next(r for r in self.rows if r["panels"] == "2" and float(r["depth_m"]) == 1.0)
        self.assertTrue(close(float(row["load_path_kNm"]), 8856.0, 1e-9), row["load_path_kNm"])

    def test_volume_mass_and_carbon(self) -> None:
        # Every member needs at least |N|/σ of area to stay below the design
        # stress, so the volume is at least Σ|N|·L/σ = Z/σ with equal limits
        # (Maxwell 1870; Michell 1904). Mass is volume × weight density / g
        # (kN → N: × 1000), carbon is mass × factor (common practice).
        for row in self.rows:
            z, volume, mass = float(row["load_path_kNm"]), float(row["volume_m3"]), float(row["mass_kg"])
            with self.subTest(variant=row["variant"]):
                self.assertGreaterEqual(volume, z / self.LIMIT * (1 - 1e-12))
                self.assertTrue(close(mass, volume * self.WEIGHT_DENSITY * 1000 / STANDARD_GRAVITY, 1e-9))
                self.assertTrue(close(float(row["carbon_kgCO2e"]), mass * self.CARBON_FACTOR, 1e-9))

    def test_chart_draws_the_table(self) -> None:
        # The SVG must be well-formed XML (W3C, XML 1.0, 2008) with the
        # caution, axis titles with units, and one line per panel count whose
        # points are an affine image of the table's (depth, volume) pairs.
        svg = ET.parse(os.path.join(self.folder, "walkway-volume.svg")).getroot()
        ns = "{http://www.w3.org/2000/svg}"
        self.assertEqual(svg.tag, ns + "svg")
        children = list(svg)
        texts = ["".join(t.itertext()) for t in svg.iter(ns + "text")]
        self.assertIn(CAUTION, texts)
        self.assertIn("depth (m)", texts)
        self.assertIn("steel volume (m³)", texts)
        numbers = [t for t in texts if t.replace(".", "", 1).isdigit()]
        self.assertGreaterEqual(len(numbers), 8, "tick labels on both axes")
        legend = {}
        for line, label in zip(children, children[1:]):
            if line.tag == ns + "line" and line.get("stroke-width") == "2" and label.tag == ns + "text":
                legend[line.get("stroke")] = label.text
        lines = [p for p in children if p.tag == ns + "polyline"]
        self.assertEqual(sorted(legend.get(p.get("stroke"), "") for p in lines),
                         sorted("%d panels" % n for n in self.PANELS))
        for polyline in lines:
            panels = int(legend[polyline.get("stroke")].split()[0])
            data = sorted((float(r["depth_m"]), float(r["volume_m3"])) for r in self.rows if int(r["panels"]) == panels)
            points = [tuple(map(float, p.split(","))) for p in polyline.get("points").split()]
            self.assertEqual(len(points), len(data))
            (d0, v0), (d1, v1) = data[0], data[-1]
            (x0, y0), (x1, y1) = points[0], points[-1]
            for (d, v), (x, y) in zip(data, points):
                with self.subTest(panels=panels, depth=d):
                    self.assertAlmostEqual(x, x0 + (d - d0) / (d1 - d0) * (x1 - x0), delta=0.2)
                    self.assertAlmostEqual(y, y0 + (v - v0) / (v1 - v0) * (y1 - y0), delta=0.2)
            self.assertEqual(y0 < y1, v0 > v1, "larger volumes are drawn higher up")


class BellHangerSweepTest(unittest.TestCase):
    """bell_hanger_sweep.py: a 6 kN bell on two rods from anchors 2.4 m apart, drop swept 0.25–3 m."""

    A, P, LIMIT = 1.2, 6.0, 2.35e5  # half the anchor spacing (m), the bell (kN), design stress (kN/m²)

    @classmethod
    def setUpClass(cls) -> None:
        cls.folder = tempfile.mkdtemp(prefix="gusset-example-test-")
        cls.stdout = run_example("bell_hanger_sweep.py", [cls.folder])
        with open(os.path.join(cls.folder, "bell-sweep.csv"), newline="") as f:
            cls.rows = list(csv.DictReader(f))
        with open(os.path.join(cls.folder, "bell-optimum.json")) as f:
            cls.optimum = json.load(f)

    @classmethod
    def tearDownClass(cls) -> None:
        shutil.rmtree(cls.folder, ignore_errors=True)

    def load_path(self, h: float) -> float:
        # Each rod of length L = √(a² + h²) pulls N = P·L/(2h) by the
        # vertical equilibrium of the yoke (common practice), so
        # Z = 2·N·L = P(a² + h²)/h.
        return self.P * (self.A ** 2 + h ** 2) / h

    def test_every_step_streamed_and_printed_with_its_bar(self) -> None:
        lines = self.stdout.splitlines()
        steps = [line for line in lines if line.rstrip().endswith("#")]
        self.assertEqual(len(steps), 12)
        self.assertEqual(sorted(int(line.split()[0]) for line in steps), list(range(12)))
        for line in steps:
            index, depth, z, bar = line.split()
            self.assertTrue(close(float(z), self.load_path(float(depth)), 1e-3, 0.006), line)
            self.assertEqual(len(bar), round(float(z)))  # one mark per kN·m
        last_step = max(lines.index(line) for line in steps)
        self.assertTrue(lines[last_step + 1].startswith("Least load path"), "the optimum follows the steps")
        self.assertIn(CAUTION, self.stdout)

    def test_steps_follow_the_two_bar_load_path(self) -> None:
        self.assertEqual(len(self.rows), 12)
        for row in self.rows:
            h, z = float(row["depth_m"]), float(row["load_path_kNm"])
            with self.subTest(depth=h):
                self.assertTrue(close(z, self.load_path(h), 1e-9), (z, self.load_path(h)))
                # Rods only pull, so each is sized at N/σ exactly: V = Z/σ.
                self.assertTrue(close(float(row["volume_m3"]), z / self.LIMIT, 1e-9))

    def test_optimum_is_michells_45_degrees(self) -> None:
        # dZ/dh = P(1 − a²/h²) vanishes at h = a: rods at 45°, Z = 2Pa
        # (Michell 1904, "The limits of economy of material in
        # frame-structures", Phil. Mag. 8, p. 589). The grid (steps of
        # 0.25 m) misses h = a, so the refinement found it. A flat minimum
        # pins the parameter only to about √ε relative (Press et al.,
        # Numerical Recipes, §10.1, from memory): tolerance 1e-6 on h.
        self.assertFalse(any(abs(float(r["depth_m"]) - self.A) < 0.01 for r in self.rows))
        grid_best = min(self.rows, key=lambda r: self.load_path(float(r["depth_m"])))
        self.assertEqual(self.optimum["start_index"], int(grid_best["index"]))
        self.assertTrue(self.optimum["converged"])
        self.assertFalse(self.optimum["at_edge"])
        self.assertTrue(close(self.optimum["values"][0], self.A, 1e-6), self.optimum["values"])
        self.assertTrue(close(self.optimum["metrics"]["load_path"], 2 * self.P * self.A, 1e-12))
        self.assertTrue(close(self.optimum["metrics"]["volume"], 2 * self.P * self.A / self.LIMIT, 1e-12))


class GantryByForcesTest(unittest.TestCase):
    """gantry_by_forces.py: a three-panel gantry, one force-diagram point dragged, form redrawn and solved."""

    @classmethod
    def setUpClass(cls) -> None:
        # No folder given: the example makes a temporary one and says where.
        cls.stdout = run_example("gantry_by_forces.py", [])
        written = [line.split(":", 1)[1].strip() for line in cls.stdout.splitlines() if line.startswith("written:")]
        cls.file = Path(written[0])
        with open(str(cls.file)) as f:
            cls.record = json.load(f)

    @classmethod
    def tearDownClass(cls) -> None:
        shutil.rmtree(str(cls.file.parent), ignore_errors=True)

    def test_writes_into_a_temporary_folder(self) -> None:
        self.assertEqual(Path(tempfile.gettempdir()).resolve(), self.file.parent.parent.resolve())
        self.assertNotIn(str(CLIENT.parents[1]), str(self.file.resolve()))
        self.assertIn(CAUTION, self.stdout)

    def edited_segments(self) -> List[Tuple[float, float]]:
        points = {s["label"]: s["point"] for s in self.record["diagram"]["spaces"]}
        points[self.record["edited_face"]] = self.record["edited_point"]
        out = []
        for seg in self.record["diagram"]["members"]:
            a, b = seg["spaces"]
            out.append((points[b][0] - points[a][0], points[b][1] - points[a][1]))
        return out

    def member_vectors(self) -> List[Tuple[float, float]]:
        at = {n["id"]: n["at"] for n in self.record["form"]["nodes"]}
        out = []
        for member in self.record["model"]["members"]:
            a, b = member["ends"]
            out.append((at[b][0] - at[a][0], at[b][1] - at[a][1]))
        return out

    def test_original_diagram_by_hand(self) -> None:
        # Reactions by moments about the bearings: R_L0 = (14·6 + 8·3)/9 = 12
        # kN; the first bottom-chord bar by moments about U1: 12·3/2 = 18 kN
        # tension (method of sections, common practice).
        first = self.record["diagram"]["members"][0]
        self.assertEqual(first["member"], "L0-L1")
        self.assertTrue(close(first["force"], 18.0, 1e-9), first["force"])
        old = {s["label"]: s["point"] for s in self.record["diagram"]["spaces"]}[self.record["edited_face"]]
        self.assertEqual(self.record["edited_point"], [old[0] - 3.0, old[1]])

    def test_redrawn_members_are_parallel_to_the_edited_segments(self) -> None:
        # Corresponding lines of reciprocal figures are parallel (Maxwell
        # 1864, "On reciprocal figures and diagrams of forces", Phil. Mag.
        # 27): the cross product of each member with its segment vanishes.
        original = {n["id"]: n["at"] for n in self.record["model"]["nodes"]}
        for member, (mx, my), (sx, sy) in zip(self.record["model"]["members"], self.member_vectors(),
                                              self.edited_segments()):
            with self.subTest(member=member["id"]):
                a, b = member["ends"]
                was = math.hypot(original[b][0] - original[a][0], original[b][1] - original[a][1])
                self.assertGreater(math.hypot(mx, my), 0.5 * was, "the form did not collapse")
                self.assertLessEqual(abs(mx * sy - my * sx), 1e-9 * math.hypot(mx, my) * math.hypot(sx, sy))
        for node in self.record["form"]["nodes"]:
            if node["id"] in ("L0", "L3"):  # the bearings stay put
                self.assertEqual([round(v, 12) for v in node["at"]], original[node["id"]])
        self.assertGreater(max(n["moved"] for n in self.record["form"]["nodes"]), 0.05)

    def test_solved_forces_are_the_drawn_lengths(self) -> None:
        # In a reciprocal figure each line's length is the force in its
        # member (Maxwell 1864; Cremona, "Le figure reciproche nella statica
        # grafica", 1872, from memory), so solving the redrawn form gives
        # back the edited diagram: the dragged bar L0-L1 now carries 21 kN.
        forces = self.record["solved"]["axial_forces"]
        for member, force, (sx, sy) in zip(self.record["model"]["members"], forces, self.edited_segments()):
            with self.subTest(member=member["id"]):
                self.assertTrue(close(abs(force), math.hypot(sx, sy), 1e-9), (force, math.hypot(sx, sy)))
        self.assertTrue(close(forces[0], 21.0, 1e-9), forces[0])

    def test_redrawn_form_is_in_equilibrium(self) -> None:
        # ΣF = 0 at every pin (Newton's first law): members (tension pulls
        # each end towards the other), loads and reactions, summed here from
        # the solved forces on the redrawn geometry. Round-off only.
        model = self.record["redrawn_model"]
        solved = self.record["solved"]
        at = {n["id"]: n["at"] for n in model["nodes"]}
        total = {n: [0.0, 0.0] for n in at}
        for member, force in zip(model["members"], solved["axial_forces"]):
            a, b = member["ends"]
            dx, dy = at[b][0] - at[a][0], at[b][1] - at[a][1]
            length = math.hypot(dx, dy)
            total[a][0] += force * dx / length
            total[a][1] += force * dy / length
            total[b][0] -= force * dx / length
            total[b][1] -= force * dy / length
        for item in model["load_cases"][0]["loads"] + solved["reactions"]:
            total[item["node"]][0] += item["force"][0]
            total[item["node"]][1] += item["force"][1]
        scale = 22.0  # kN, the two signs
        for node, (fx, fy) in total.items():
            self.assertLessEqual(math.hypot(fx, fy), 1e-10 * scale, node)
        self.assertLessEqual(max(self.record["closure"]), 1e-9 * scale)


class ExamplesStayOutOfTheRepositoryTest(unittest.TestCase):
    def test_every_example_is_tested(self) -> None:
        tested = {"walkway_variants.py", "bell_hanger_sweep.py", "gantry_by_forces.py",
                  "dask_sharded_sweep.py"}  # the last in test_dask_example.py
        self.assertEqual({p.name for p in EXAMPLES.glob("*.py")}, tested)

    def test_missing_binary_says_how_to_build_it(self) -> None:
        # With GUSSET_BINARY naming nothing, the example stops with the
        # client's message instead of a traceback.
        folder = tempfile.mkdtemp(prefix="gusset-example-test-")
        try:
            environ = dict(os.environ, GUSSET_BINARY=os.path.join(folder, "no-such-gusset"))
            done = subprocess.run([sys.executable, str(Path("examples") / "gantry_by_forces.py"), folder],
                                  cwd=str(CLIENT), env=environ, stdout=subprocess.PIPE, stderr=subprocess.PIPE,
                                  universal_newlines=True, timeout=60)
            self.assertNotEqual(done.returncode, 0)
            self.assertIn("go build -o gusset ./cmd/gusset", done.stderr)
            self.assertNotIn("Traceback", done.stderr)
            self.assertEqual(os.listdir(folder), [])
        finally:
            shutil.rmtree(folder, ignore_errors=True)


if __name__ == "__main__":
    unittest.main()
