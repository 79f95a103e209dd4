"""Helpers that read the iteration report of a solve result.

A model with one-sided members (``"type": "cable"``, or ``"behaviour":
"tension-only"`` / ``"compression-only"`` on a bar), or a solve with
``second_order={...}`` (P-Delta), is solved case by case by iteration; each
such case of the result carries ``iteration``: the solves made, the
numeric factorisations, the ids of the members left slack, and for second
order the amplification and an upper bound of the critical load factor.
These helpers collect them by case id.
"""

from typing import Any, Dict, List, Optional

__all__ = ["slack_members", "amplification"]


def slack_members(result: Dict[str, Any]) -> Dict[str, List[str]]:
    """slack_members returns {case id: ids of the members left slack}.

    A case solved by superposition (no one-sided members, no second order)
    has no iteration report and is left out.
    """
    out: Dict[str, List[str]] = {}
    for case in result.get("cases", []):
        report = case.get("iteration")
        if report is not None:
            out[case["id"]] = list(report.get("slack_members", []))
    return out


def amplification(result: Dict[str, Any]) -> Dict[str, Optional[float]]:
    """amplification returns {case id: second-order amplification} for a second-order solve.

    The amplification is the largest nodal translation over that of the
    first-order solve; None where the report has none (nothing moved in the
    first solve, or the solve was not second order).
    """
    out: Dict[str, Optional[float]] = {}
    for case in result.get("cases", []):
        report = case.get("iteration")
        if report is not None:
            out[case["id"]] = report.get("amplification")
    return out
