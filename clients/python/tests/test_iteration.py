"""Tests of one-sided members, cables and second order through the real binary.

The X-braced panel (4 m wide, 3 m high, diagonals 5 m, cos(theta) = 0.8, A
and B pinned, H = 12 kN at D): the sway shortens BD, which goes slack, and
joint equilibrium by hand gives N_AC = H / cos(theta) = 15 kN and
N_DC = -H = -12 kN (derived in engine/stiffness/activeset_test.go). The
taut string (two cables of 3 m and 5 m, pretension T = 400 kN, a 2 kN load
across at the joint): to first order in the deflection the tension stays
T, so the joint's equilibrium T*d/a + T*d/b = P gives d = P*a*b / (T*L)
(small-deflection taut string, derived here; H. M. Irvine, Cable
Structures, 1981, ch. 1, from memory), and the second solve repeats the
first: amplification 1.
"""

import unittest

import support
from support import gusset


def braced():
    rod = {"material": "steel", "section": "rod"}
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": 2e8}],
        "sections": [{"id": "rod", "area": 1e-3}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [4, 0]}, {"id": "C", "at": [4, 3]}, {"id": "D", "at": [0, 3]}],
        "members": [dict(rod, id="AD", ends=["A", "D"]), dict(rod, id="BC", ends=["B", "C"]),
                    dict(rod, id="DC", ends=["D", "C"]), dict(rod, id="AC", ends=["A", "C"], type="cable"),
                    dict(rod, id="BD", ends=["B", "D"], behaviour="tension-only")],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["x", "y"]}],
        "load_cases": [{"id": "wind", "loads": [{"node": "D", "force": [12, 0]}]}],
    }


def string(a=3.0, b=5.0, tension=400.0):
    cable = {"material": "wire", "section": "strand", "type": "cable", "pretension": tension}
    return {
        "dimension": 2,
        "materials": [{"id": "wire", "elastic_modulus": 1e6}],
        "sections": [{"id": "strand", "area": 1}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "C", "at": [a, 0]}, {"id": "B", "at": [a + b, 0]}],
        "members": [dict(cable, id="AC", ends=["A", "C"]), dict(cable, id="CB", ends=["C", "B"])],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["x", "y"]}],
        "load_cases": [{"id": "point", "loads": [{"node": "C", "force": [0, -2]}]}],
    }


class IterationTest(unittest.TestCase):
    def test_slack_diagonal(self):
        with gusset.Client(support.binary()) as client:
            result = client.solve(braced())
        forces = result["cases"][0]["axial_forces"]
        self.assertAlmostEqual(forces[3], 15.0, places=9)
        self.assertAlmostEqual(forces[2], -12.0, places=9)
        self.assertEqual(forces[4], 0.0)
        self.assertEqual(gusset.slack_members(result), {"wind": ["BD"]})

    def test_taut_string(self):
        a, b, tension, load = 3.0, 5.0, 400.0, 2.0
        with gusset.Client(support.binary()) as client:
            result = client.solve(string(a, b, tension), second_order={})
            with self.assertRaises(gusset.UnstableStructure):
                client.solve(string(a, b, tension))  # no second order: a mechanism
        case = result["cases"][0]
        self.assertAlmostEqual(case["displacements"][1][1], -load * a * b / (tension * (a + b)), places=12)
        self.assertAlmostEqual(gusset.amplification(result)["point"], 1.0, places=9)
        self.assertEqual(gusset.slack_members(result), {"point": []})


if __name__ == "__main__":
    unittest.main()
