"""Tests of the member-result helpers against a simple span solved by the real binary.

Expected values are the beam tables' (Young & Budynas, Roark's Formulas for
Stress and Strain, 7th ed., 2002, Table 8.1 case 2e; from memory): a span L
under w has M(x) = wx(L - x)/2, wL^2/8 at mid-span, and deflects 5wL^4/384EI.
"""

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


if __name__ == "__main__":
    unittest.main()
