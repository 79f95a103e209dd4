"""Helpers for pattern loading and the envelope of a solve result.

``on_off_pattern`` builds a model's ``patterns`` entry: the permanent cases
with their factors in every generated combination and each variable case
on (``factor_on``) or off (``factor_off``); the server generates the
combinations "<id>/on:<case>+<case>..." and "<id>/all-off". A solve with
``envelope={"cases": [...], "omit_cases": False}`` (a pattern's id stands
for all its combinations; default every reported case) adds ``envelope``:
per node, support and member the largest and smallest value of each result
with the governing case (see the schema's Envelope). A member's enveloped
utilisation is None when some enveloped case could not check it; it never
leaves that case out.
"""

from typing import Any, Dict, Mapping, Optional, Sequence, Tuple

__all__ = ["on_off_pattern", "member_envelope", "governing"]


def on_off_pattern(
    pattern_id: str,
    variable: Sequence[str],
    permanent: Optional[Mapping[str, float]] = None,
    factor_on: float = 1.0,
    factor_off: float = 0.0,
    mode: str = "all",
) -> Dict[str, Any]:
    """on_off_pattern returns a ``patterns`` entry switching the cases in variable on and off.

    mode "all" generates every on/off pattern (2**n combinations, at most 10
    variable cases); "each" each variable case on alone.
    """
    entry: Dict[str, Any] = {
        "id": pattern_id,
        "variable": [{"case": c, "factor_on": factor_on, "factor_off": factor_off} for c in variable],
        "mode": mode,
    }
    if permanent:
        entry["permanent"] = dict(permanent)
    return entry


def member_envelope(result: Dict[str, Any], member_id: str) -> Dict[str, Any]:
    """member_envelope returns the envelope of the member called member_id.

    It raises KeyError when the result has no envelope or no such member.
    """
    envelope = result.get("envelope")
    if envelope is None:
        raise KeyError("the result has no envelope: ask solve for one with envelope={}")
    for entry in envelope["members"]:
        if entry["id"] == member_id:
            return entry
    raise KeyError("no member %r in the envelope" % (member_id,))


def governing(result: Dict[str, Any], member_id: str, quantity: str = "moment_z", bound: str = "max") -> Tuple[float, str, Optional[float]]:
    """governing returns (value, case id, distance or None) of one bound of a member's envelope.

    quantity is "axial", "shear_y", "moment_z", "shear_z", "torsion",
    "moment_y" or "utilisation"; bound is "max" or "min". It raises
    ValueError for a utilisation the envelope could not give (a case left
    it unchecked), with the reason.
    """
    entry = member_envelope(result, member_id)
    ranges = entry.get(quantity)
    if ranges is None:
        raise ValueError("member %r has no enveloped %s: %s" % (member_id, quantity, entry.get("utilisation_note", "a bar has no internal forces along it")))
    value = ranges[bound]
    return value["value"], value["case"], value.get("at")
