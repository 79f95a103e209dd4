"""Tests of pattern loading and envelopes through the real binary.

Two equal spans L = 5 m, a live load q = 8 kN/m on each span as its own
case, all on/off patterns. Clapeyron's equation of three moments (Timoshenko
& Young, Theory of Structures, 1965, section 9.1; worked here): with both
spans loaded 4*M_B = -2*q*L**2/4, M_B = -q*L**2/8 = -25 kN*m (the support
moment); with span 1 alone M_B = -q*L**2/16, and span 1's moment
q*x*(L - x)/2 + M_B*x/L is largest at x = L/2 + M_B/(q*L) = 7L/16, where it
is 49*q*L**2/512 = 19.140625 kN*m (the beam tables' 0.0957 qL**2, from
memory). The material has no limits, so the utilisation is unchecked.
"""

import unittest

import support
from support import gusset


def two_spans(length=5.0, q=8.0):
    beam = {"material": "steel", "section": "deck", "type": "beam"}
    return {
        "dimension": 2,
        "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
        "sections": [{"id": "deck", "area": 5e-3, "second_moment": 8e-5}],
        "nodes": [{"id": "A", "at": [0, 0]}, {"id": "B", "at": [length, 0]}, {"id": "C", "at": [2 * length, 0]}],
        "members": [dict(beam, id="AB", ends=["A", "B"]), dict(beam, id="BC", ends=["B", "C"])],
        "supports": [{"node": "A", "fix": ["x", "y"]}, {"node": "B", "fix": ["y"]}, {"node": "C", "fix": ["y"]}],
        "load_cases": [
            {"id": "Q1", "member_loads": [{"member": "AB", "kind": "uniform", "value": [0, -q]}]},
            {"id": "Q2", "member_loads": [{"member": "BC", "kind": "uniform", "value": [0, -q]}]},
        ],
        "patterns": [gusset.on_off_pattern("live", ["Q1", "Q2"])],
    }


class EnvelopeTest(unittest.TestCase):
    def test_two_spans(self):
        with gusset.Client(support.binary()) as client:
            result = client.solve(two_spans(), envelope={"cases": ["live"], "omit_cases": True})
        self.assertEqual(result["cases"], [])
        self.assertEqual(result["envelope"]["cases"], ["live/all-off", "live/on:Q1", "live/on:Q2", "live/on:Q1+Q2"])
        value, case, at = gusset.governing(result, "AB", "moment_z", "max")
        self.assertAlmostEqual(value, 19.140625, places=9)
        self.assertEqual(case, "live/on:Q1")
        self.assertAlmostEqual(at, 35 / 16, places=9)
        value, case, at = gusset.governing(result, "AB", "moment_z", "min")
        self.assertAlmostEqual(value, -25.0, places=9)
        self.assertEqual(case, "live/on:Q1+Q2")
        self.assertAlmostEqual(at, 5.0, places=12)
        self.assertIsNone(gusset.member_envelope(result, "AB")["utilisation"])
        with self.assertRaises(ValueError):
            gusset.governing(result, "AB", "utilisation")

    def test_unknown_id(self):
        with gusset.Client(support.binary()) as client:
            with self.assertRaises(gusset.GussetError) as caught:
                client.solve(two_spans(), envelope={"cases": ["snow"]})
        self.assertEqual(caught.exception.problems[0].path, "/params/envelope/cases/0")


if __name__ == "__main__":
    unittest.main()
