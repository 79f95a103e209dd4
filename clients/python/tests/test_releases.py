"""End releases through the real binary.

A Gerber beam: supports A (pin), B and C (rollers) at 0, 6 and 12 m with a
hinge G at 7.5 m, 10 kN/m over the whole length. Statics by hand (R. C.
Hibbeler, Structural Analysis, compound beams, from memory): the suspended
part GC is simply supported, so R_C = 10 x 4.5 / 2 = 22.5 kN; moments about A
of the overhanging part A-B-G give R_B = 75 kN, and R_A = 22.5 kN; the
hogging moment at B is 10 x 1.5^2 / 2 + 22.5 x 1.5 = 45 kN m, and the moment
at the hinge is zero.
"""

import unittest

import support
from support import gusset


def gerber():
    beam = {"material": "steel", "section": "deck", "type": "beam"}
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
        "sections": [{"id": "deck", "area": 4e-3, "second_moment": 8e-6}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [6, 0]},
                  {"id": "G", "at": [7.5, 0]}, {"id": "C", "at": [12, 0]}],
        "members": [dict(beam, id="AB", ends=["A", "B"]),
                    gusset.released(dict(beam, id="BG", ends=["B", "G"]), second=["rz"]),
                    dict(beam, id="GC", ends=["G", "C"])],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["y"]}, {"node": "C", "fix": ["y"]}],
        "load_cases": [{"id": "udl", "member_loads": [
            {"member": m, "kind": "uniform", "value": [0, -10]} for m in ("AB", "BG", "GC")]}],
    }


class ReleasesTest(unittest.TestCase):
    def test_helper(self):
        beam = {"id": "b", "type": "beam"}
        self.assertEqual(gusset.released(beam, first=["rz"])["releases"], {"first": ["rz"]})
        self.assertNotIn("releases", gusset.released(beam))
        self.assertNotIn("releases", beam)
        with self.assertRaises(ValueError):
            gusset.released(beam, second=["z"])

    def test_gerber_beam(self):
        with gusset.Client(support.binary()) as client:
            result = client.solve(gerber(), stations=3)
            case = result["cases"][0]
            reactions = [r["force"][1] for r in case["reactions"]]
            for got, want in zip(reactions, [22.5, 75, 22.5]):
                self.assertAlmostEqual(got, want, places=9)
            bg = gusset.member_result(case, "BG")
            self.assertAlmostEqual(bg["moment_z"][0], -45, places=9)
            self.assertAlmostEqual(bg["moment_z"][-1], 0, places=9)
            bad = gerber()
            bad["members"][0] = gusset.released(dict(bad["members"][0], type="bar"), first=["rz"])
            with self.assertRaises(gusset.InvalidModel) as caught:
                client.solve(bad)
            self.assertEqual(caught.exception.problems[0].path, "/params/model/members/0/releases")


if __name__ == "__main__":
    unittest.main()
