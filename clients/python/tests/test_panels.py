"""Tests of inclined supports and area loads through the real binary.

The triangle A(0,0), B(4,0), C(2,2), pinned at A, B on a roller on a 30
degree incline, 12 kN down at C: moments about A give the roller's normal
reaction N = 6/cos(30) = 6.928203 kN, globally (-6 tan 30, 6) (rigid-body
statics with a smooth inclined support, as in R. C. Hibbeler, Engineering
Mechanics: Statics, from memory). A 6 x 4 panel pitched at atan(3/4) under
snow of 0.8 per plan area totals 0.8 x 24 = 19.2 kN, a quarter at each
pinned corner (statics).
"""

import math
import unittest

import support
from support import gusset


def triangle():
    bar = {"material": "steel", "section": "bar"}
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": 2e8}],
        "sections": [{"id": "bar", "area": 1e-3}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [4, 0]}, {"id": "C", "at": [2, 2]}],
        "members": [dict(bar, id="AB", ends=["A", "B"]), dict(bar, id="BC", ends=["B", "C"]),
                    dict(bar, id="AC", ends=["A", "C"])],
        "supports": [{"node": "A", "fix": ["x", "y"]},
                     gusset.inclined_support("B", ["y"], [[math.sqrt(3), 1]])],
        "load_cases": [{"id": "apex", "loads": [{"node": "C", "force": [0, -12]}]}],
    }


def pitched():
    ids = "ABCD"
    points = [[0, 0, 0], [6, 0, 0], [6, 4, 3], [0, 4, 3]]
    return {
        "dimension": 3,
        "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
        "sections": [{"id": "hollow", "area": 4e-3, "second_moment": 2e-5}],
        "nodes": [{"id": ids[i], "at": p} for i, p in enumerate(points)],
        "members": [{"id": ids[i] + ids[(i + 1) % 4], "ends": [ids[i], ids[(i + 1) % 4]],
                     "material": "steel", "section": "hollow", "type": "beam"} for i in range(4)],
        "supports": [{"node": n, "fix": ["x", "y", "z"]} for n in ids],
        "load_cases": [{"id": "snow", "area_loads": [
            gusset.area_load(["A", "B", "C", "D"], value=[0, 0, -0.8], projected=True)]}],
    }


class PanelsTest(unittest.TestCase):
    def test_inclined_roller(self):
        with gusset.Client(support.binary()) as client:
            result = client.solve(triangle())
        local = gusset.local_reactions(result)["apex"]
        self.assertEqual(list(local), ["B"])
        self.assertAlmostEqual(local["B"][1], 6 / math.cos(math.pi / 6), places=9)
        self.assertAlmostEqual(local["B"][0], 0, places=9)
        b = result["cases"][0]["reactions"][1]["force"]
        self.assertAlmostEqual(b[0], -6 * math.tan(math.pi / 6), places=9)
        self.assertAlmostEqual(b[1], 6, places=9)

    def test_projected_snow(self):
        with gusset.Client(support.binary()) as client:
            result = client.solve(pitched())
        for r in result["cases"][0]["reactions"]:
            self.assertAlmostEqual(r["force"][2], 19.2 / 4, places=9)

    def test_builders_refuse(self):
        with self.assertRaises(ValueError):
            gusset.area_load(["A", "B", "C"])
        with self.assertRaises(ValueError):
            gusset.area_load(["A", "B", "C"], pressure=1, value=[0, 0, -1])
        with self.assertRaises(ValueError):
            gusset.inclined_support("B", ["y"], [])

    def test_planarity_refused(self):
        model = pitched()
        model["nodes"][2]["at"] = [6, 4, 4]
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.InvalidModel) as caught:
                client.solve(model)
        paths = [p.path for p in caught.exception.problems]
        self.assertTrue(any(p.startswith("/params/model/load_cases/0/area_loads/0/nodes/") for p in paths), paths)


if __name__ == "__main__":
    unittest.main()
