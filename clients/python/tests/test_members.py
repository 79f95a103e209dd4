"""Tests of the member-result helpers against a simple span solved by the real binary.

Expected values are the beam tables' (Young & Budynas, Roark's Formulas for
Stress and Strain, 7th ed., 2002, Table 8.1 case 2e; from memory): a span L
under w has M(x) = wx(L - x)/2, wL^2/8 at mid-span, and deflects 5wL^4/384EI.
"""

import math
import unittest

import support
from support import gusset

L, W, E, I = 10.0, 10.0, 2.1e8, 1e-4


def span_model():
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": E, "tension_limit": 2.35e5, "compression_limit": 2.35e5}],
        "sections": [{"id": "deck", "area": 0.01, "second_moment": I, "section_modulus": 1e-3}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [L, 0]}],
        "members": [{"id": "span", "ends": ["A", "B"], "material": "steel", "section": "deck", "type": "beam"}],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["y"]}],
        "load_cases": [{"id": "udl", "member_loads": [{"member": "span", "kind": "uniform", "value": [0, -W]}]}],
    }


class MemberHelpersTest(unittest.TestCase):
    def test_span_by_id(self):
        with gusset.Client(support.binary()) as client:
            result = client.call("solve", {"model": span_model(), "stations": 5})
        case = result["cases"][0]
        span = gusset.member_result(case, "span")
        self.assertAlmostEqual(span["peak_moment_z"]["value"], W * L * L / 8, places=9)
        self.assertAlmostEqual(span["peak_deflection_y"]["value"], -5 * W * L ** 4 / (384 * E * I), places=12)
        diagram = gusset.moment_diagram(case, "span")
        self.assertEqual(len(diagram), 5)
        for x, m in diagram:
            self.assertAlmostEqual(m, W * x * (L - x) / 2, places=9)
        self.assertEqual([cid for cid, _ in gusset.member_results(result, "span")], ["udl"])
        with self.assertRaises(KeyError):
            gusset.member_result(case, "missing")

    def test_member_check(self):
        """member_check on the span (bending wL^2/8 over W*f = 125/235, Roark)
        and on two 5 m bars A (0, 0) - B (4, 3) - C (8, 0) carrying their own
        weight W = 77*0.005*5 kN across them under 100 kN at B: by hand
        statics the foot of each carries N = -(100 + W)/(2 sin t) - (W/2) sin t
        (sin t = 3/5), checked as |N|/(chi*A*fc) with chi from EN 1993-1-1
        eq. (6.49), curve d (alpha 0.76); they bend as simple spans, but the
        section gives no section modulus, so their bending is not checked and
        only the axial part is known."""
        truss = {
            "dimension": 2,
            "materials": [{"id": "steel", "elastic_modulus": E, "tension_limit": 2.35e5, "compression_limit": 2.35e5, "weight_density": 77}],
            "sections": [{"id": "s", "area": 0.005, "second_moment": I}],
            "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [4, 3]}, {"id": "C", "at": [8, 0]}],
            "members": [{"id": "AB", "ends": ["A", "B"], "material": "steel", "section": "s"},
                        {"id": "BC", "ends": ["B", "C"], "material": "steel", "section": "s"}],
            "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "C", "fix": ["x", "y"]}],
            "load_cases": [{"id": "dead", "self_weight": True, "loads": [{"node": "B", "force": [0, -100]}]}],
        }
        with gusset.Client(support.binary()) as client:
            span = client.call("solve", {"model": span_model()})["cases"][0]
            bars = client.call("solve", {"model": truss})["cases"][0]
        check = gusset.member_check(span, span_model(), "span")
        self.assertTrue(check["checked"])
        self.assertAlmostEqual(check["utilisation"], W * L * L / 8 / (1e-3 * 2.35e5), places=12)
        self.assertEqual(check["axial_utilisation"], 0)
        weight, sin = 77 * 0.005 * 5, 0.6
        foot = (100 + weight) / (2 * sin) + weight / 2 * sin
        squash, critical = 0.005 * 2.35e5, math.pi ** 2 * E * I / 25
        slenderness = math.sqrt(squash / critical)
        phi = 0.5 * (1 + 0.76 * (slenderness - 0.2) + slenderness ** 2)
        chi = 1 / (phi + math.sqrt(phi * phi - slenderness ** 2))
        check = gusset.member_check(bars, truss, "AB")
        self.assertFalse(check["checked"])
        self.assertIsNone(check["utilisation"])
        self.assertAlmostEqual(check["axial_utilisation"], foot / (chi * squash), places=12)
        with self.assertRaises(KeyError):
            gusset.member_check(bars, truss, "missing")


if __name__ == "__main__":
    unittest.main()
