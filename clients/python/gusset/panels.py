"""Helpers for inclined supports and area loads.

A support with ``directions`` (one vector in 2D, one or two in 3D) has axes
of its own: its ``fix``, ``springs`` and ``displacement`` name components
along them, and its reaction in a solve result carries ``local_force`` (and
``local_moment``) beside the global ``force``. An area load spreads a
pressure (normal to a flat, convex panel of 3 or more nodes of a 3D model)
or a force per area along a global direction to the panel's nodes, or to
its edge members one way or two ways, with the panel's total conserved
exactly. These helpers build the dicts the model takes and read the local
reactions back.
"""

from typing import Any, Dict, List, Optional, Sequence

__all__ = ["inclined_support", "area_load", "local_reactions"]


def inclined_support(node: str, fix: Sequence[str], directions: Sequence[Sequence[float]],
                     springs: Optional[Dict[str, float]] = None,
                     displacement: Optional[Dict[str, float]] = None) -> Dict[str, Any]:
    """inclined_support returns a support whose components act along its own axes.

    ``directions`` is one vector (local x; in 2D local y follows a quarter
    turn anticlockwise) or, in 3D, two (the second fixes local y). A roller
    on a 30 degree incline in 2D is
    ``inclined_support("B", ["y"], [[3 ** 0.5, 1]])``.
    """
    if not 1 <= len(directions) <= 2:
        raise ValueError("directions takes one or two vectors")
    out: Dict[str, Any] = {"node": node, "fix": list(fix), "directions": [list(d) for d in directions]}
    if springs:
        out["springs"] = dict(springs)
    if displacement:
        out["displacement"] = dict(displacement)
    return out


def area_load(nodes: Sequence[str], pressure: Optional[float] = None, value: Optional[Sequence[float]] = None,
              projected: bool = False, to: Optional[str] = None, span: Optional[str] = None,
              span_direction: Optional[Sequence[float]] = None) -> Dict[str, Any]:
    """area_load returns an entry of a load case's ``area_loads``.

    Give exactly one of ``pressure`` (force per area normal to the panel; a
    positive pressure presses on the face the right-hand-rule normal of
    the node order points out of) and ``value`` (a global force per area
    vector; ``projected=True`` measures the area on the plane normal to
    it, as snow per plan area). ``to="members"`` with ``span="one-way"``
    (and ``span_direction``) or ``"two-way"`` spreads a rectangular panel
    to its edge members.
    """
    if (pressure is None) == (value is None):
        raise ValueError("give exactly one of pressure and value")
    out: Dict[str, Any] = {"nodes": list(nodes)}
    if pressure is not None:
        out["pressure"] = pressure
    else:
        out["value"] = list(value)  # type: ignore[arg-type]
    if projected:
        out["projected"] = True
    if to is not None:
        out["to"] = to
    if span is not None:
        out["span"] = span
    if span_direction is not None:
        out["span_direction"] = list(span_direction)
    return out


def local_reactions(result: Dict[str, Any]) -> Dict[str, Dict[str, List[float]]]:
    """local_reactions returns {case id: {node id: local_force}} for supports with directions.

    Supports in global axes report no local force and are left out.
    """
    out: Dict[str, Dict[str, List[float]]] = {}
    for case in result.get("cases", []):
        local = {r["node"]: list(r["local_force"]) for r in case.get("reactions", []) if "local_force" in r}
        out[case["id"]] = local
    return out
