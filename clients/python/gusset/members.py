"""Helpers that read a solve result's results along members by member id.

A solve result holds, per case, ``members``: one entry per model member,
aligned with ``model["members"]`` (None for a bar), each beam's with its ``id``, the internal forces
and displacements at its stations, and the exact extremes along it (see the
schema's MemberResult). These helpers find them by id so that a host need
not keep the member order.
"""

from typing import Any, Dict, Iterator, List, Optional, Tuple

__all__ = ["member_check", "member_result", "member_results", "moment_diagram"]


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


def member_check(case: Dict[str, Any], model: Dict[str, Any], member_id: str) -> Dict[str, Any]:
    """member_check returns the checks of the member called member_id in one case.

    case is one entry of a solve result's ``cases`` and model the model it
    solved (its ``members`` give the order). The dict has ``checked``
    (every check the member needs was made), ``utilisation`` (the largest
    of them, None unless checked) and ``axial_utilisation``: the axial
    check alone, None where it was not made. For a member not fully
    checked (a bar carrying loads across it, a beam without a section
    modulus) the axial part is a part of the check, never the whole: the
    result's ``unchecked`` says what is missing. It raises KeyError when
    the model has no member of that id.
    """
    for index, member in enumerate(model.get("members", [])):
        if member.get("id") == member_id:
            break
    else:
        raise KeyError("no member %r in the model" % (member_id,))
    utilisation = case["utilisation"][index]
    parts = case.get("axial_utilisation")
    entry = (case.get("members") or [None] * (index + 1))[index]
    if parts is not None:
        axial = parts[index]
    elif entry is not None:
        axial = entry.get("axial_utilisation")
    else:
        axial = utilisation  # a bar checked whole: its only check is axial
    return {"checked": utilisation is not None, "utilisation": utilisation, "axial_utilisation": axial}
