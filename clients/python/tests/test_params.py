"""Every method takes its whole params dict positionally, as on the wire.

Each method is called twice on the real binary, once with the params dict
as its first argument and once with the model and keywords, and the two
answers (or the two errors) must be the same. The two-bar truss's figures
are checked against statics by hand: bars from (0, 0) and (8, 0) to an
apex at (4, 3) carrying 10 kN down, so sin θ = 3/5, each bar carries
N = −P / (2 sin θ) = −8.333 kN over 5 m, and the load path is
Σ|N|·L = 2 × 8.333 × 5 = 83.33 kN·m (common practice).
"""

import unittest

import support  # puts the gusset package on the path

import gusset  # noqa: E402

TWO_BAR = {
    "dimension": 2,
    "units": {"length": "m", "force": "kN"},
    "parameters": {"h": 3},
    "materials": [{"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 2.35e5, "compression_limit": 2.35e5,
                   "mass_density": 7.85}],
    "sections": [{"id": "tube", "area": 0.002, "second_moment": 3e-6}],
    "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [8, 0]}, {"id": "C", "at": [4, "h"]}],
    "members": [{"id": "AC", "ends": ["A", "C"], "material": "steel", "section": "tube"},
                {"id": "BC", "ends": ["B", "C"], "material": "steel", "section": "tube"}],
    "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["x", "y"]}],
    "load_cases": [{"id": "point", "loads": [{"node": "C", "force": [0, -10]}]}],
}

LAYOUT = {
    "domain": {"outline": [[0, 0], [4, 0], [4, 2], [0, 2]]},
    "divisions": [4, 2],
    "supports": [{"at": [0, 0], "fix": ["x", "y"]}, {"at": [4, 0], "fix": ["y"]}],
    "cases": [{"id": "point", "loads": [{"at": [2, 0], "force": [0, -10]}]}],
    "tension_limit": 235,
    "compression_limit": 235,
}


def outcome(thunk):
    """outcome returns the answer, or the error's type and message."""
    try:
        return thunk()
    except gusset.GussetError as e:
        return (type(e).__name__, str(e))


class ParamsPositionally(unittest.TestCase):
    @classmethod
    def setUpClass(cls):
        cls.client = gusset.Client(support.binary())

    @classmethod
    def tearDownClass(cls):
        cls.client.close()

    def both(self, name, whole, *args, **keywords):
        method = getattr(self.client, name)
        by_dict = outcome(lambda: method(whole))
        by_keywords = outcome(lambda: method(*args, **keywords))
        self.assertEqual(by_dict, by_keywords, name)
        return by_dict

    def test_solve(self):
        r = self.both("solve", {"model": TWO_BAR, "cases": ["point"]}, TWO_BAR, cases=["point"])
        for n in r["cases"][0]["axial_forces"]:
            self.assertAlmostEqual(n, -10 / (2 * 0.6), places=9)

    def test_keywords_add_to_the_dict(self):
        r = self.client.solve({"model": TWO_BAR}, cases=["point"])
        self.assertEqual([c["id"] for c in r["cases"]], ["point"])

    def test_reciprocate(self):
        self.both("reciprocate", {"model": TWO_BAR, "case": "point"}, TWO_BAR, case="point")

    def test_load_path(self):
        r = self.both("load_path", {"model": TWO_BAR}, TWO_BAR)
        self.assertAlmostEqual(r["cases"][0]["load_path"], 2 * (10 / 1.2) * 5, places=6)

    def test_sweep_parameter_and_sweep(self):
        axis = {"name": "h", "values": [2, 3, 4]}
        r = self.both("sweep_parameter", {"model": TWO_BAR, "parameters": axis, "metrics": ["load_path"]},
                      TWO_BAR, axis, metrics=["load_path"])
        # At h = 3 the load path is the 83.33 kN·m above.
        self.assertAlmostEqual(r["steps"][1]["metrics"]["load_path"], 2 * (10 / 1.2) * 5, places=6)
        streamed = self.client.sweep({"model": TWO_BAR, "parameters": [axis], "metrics": ["load_path"]}).result()
        self.assertEqual(streamed, r)

    def test_optimise_layout(self):
        self.both("optimise_layout", LAYOUT, **LAYOUT)

    def test_modes(self):
        self.both("modes", {"model": TWO_BAR, "kind": "vibration", "count": 1}, TWO_BAR, "vibration", count=1)

    def test_find_form(self):
        self.both("find_form", {"model": TWO_BAR, "force_density": -2.0, "case": "point"}, TWO_BAR,
                  force_density=-2.0, case="point")


if __name__ == "__main__":
    unittest.main()
