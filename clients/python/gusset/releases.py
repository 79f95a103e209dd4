"""A helper for end releases on beams.

A beam's ``releases`` lists, per end, the rotations released there in the
member's local axes: ``"rx"`` (torsion), ``"ry"`` and ``"rz"`` (bending);
a 2D beam has ``"rz"`` only. A released end carries no moment about those
axes, so two beams released at a shared node make a hinge. Bars take no
releases (their ends carry no moment already).
"""

from typing import Any, Dict, Iterable

__all__ = ["released"]

_COMPONENTS = ("rx", "ry", "rz")


def released(member: Dict[str, Any], first: Iterable[str] = (), second: Iterable[str] = ()) -> Dict[str, Any]:
    """released returns a copy of the beam ``member`` with the given releases.

    ``first`` and ``second`` list the components released at the first and
    second end. ``released(beam, second=["rz"])`` hinges a plane beam's
    second end. Raises ValueError for a component other than rx, ry, rz
    (the solver checks the rest: beams only, rz only in 2D, no repeats).
    """
    out = dict(member)
    releases = {}
    for name, comps in (("first", list(first)), ("second", list(second))):
        for c in comps:
            if c not in _COMPONENTS:
                raise ValueError("release component %r: use rx, ry or rz" % (c,))
        if comps:
            releases[name] = comps
    if releases:
        out["releases"] = releases
    else:
        out.pop("releases", None)
    return out
