"""Helpers that read a solve result's results along members by member id.

A solve result holds, per case, ``members``: one entry per model member,
aligned with ``model["members"]`` (None for a bar), each beam's with its ``id``, the internal forces
and displacements at its stations, and the exact extremes along it (see the
schema's MemberResult). These helpers find them by id so that a host need
not keep the member order.
"""

from typing import Any, Dict, Iterator, List, Optional, Tuple

__all__ = ["member_result", "member_results", "moment_diagram"]


def member_result(case: Dict[str, Any], member_id: str) -> Dict[str, Any]:
    """member_result returns one case's results along the member called member_id.

    case is one entry of a solve result's ``cases``. It raises KeyError when
    the case has no member of that id.
    """
    for entry in case.get("members", []):
        if entry is not None and entry.get("id") == member_id:
            return entry
    raise KeyError("no beam %r in case %r (bars have no results along them)" % (member_id, case.get("id")))


def member_results(result: Dict[str, Any], member_id: str) -> Iterator[Tuple[str, Dict[str, Any]]]:
    """member_results yields (case id, results along the member) for every case of a solve result."""
    for case in result.get("cases", []):
        yield case["id"], member_result(case, member_id)


def moment_diagram(case: Dict[str, Any], member_id: str, axis: str = "z") -> List[Tuple[float, float]]:
    """moment_diagram returns [(distance from the first end, moment)] at the member's stations.

    axis is "z" (the in-plane moment of a 2D frame) or "y" (3D). The list is
    empty when the solve asked for no stations or the member is a bar.
    """
    entry = member_result(case, member_id)
    moments: Optional[List[float]] = entry.get("moment_" + axis)
    if not moments:
        return []
    return list(zip(entry["stations"], moments))
