"""Design by forces: edit the force diagram of a sign gantry, get the form back.

The scenario (our own invention): a steel gantry spans 9 m over Wendle
Street in three 3 m panels, 2 m deep, pinned at the west footing (L0) and
on a sliding bearing at the east one (L3). Two direction signs hang from
its bottom chord: 14 kN at L1 and 8 kN at L2.

1. reciprocate draws Maxwell's reciprocal force diagram: every space of the
   form (lettered outside, numbered inside, Bow's notation) becomes a point,
   every member a segment as long as its force.
2. We drag the point of the first panel's face 3 kN to the left. That asks
   the first bottom-chord bar (L0-L1) for 3 kN more tension. The drag runs
   along the bottom chord's direction, so the chord stays straight and the
   two footings can stay where they are.
3. reciprocate with edit redraws the form so that every member is parallel
   to its edited segment; we print how far each node moved.
4. solve analyses the redrawn gantry by the stiffness method: its member
   forces are the lengths we drew, and every node is in equilibrium (the
   closure error is round-off).

Run from clients/python:

    python3 examples/gantry_by_forces.py [OUTPUT_FOLDER]

The diagrams, the redrawn form and the forces go into gantry-round-trip.json
in OUTPUT_FOLDER, else $GUSSET_EXAMPLES_OUT, else a new temporary folder.
"""

import copy
import json
import math
import os
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))  # the gusset package beside us
import gusset  # noqa: E402

DRAG = -3.0  # kN, along x in the force diagram
CAUTION = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."

NODES = {"L0": [0, 0], "L1": [3, 0], "L2": [6, 0], "L3": [9, 0], "U1": [3, 2], "U2": [6, 2]}
BARS = ["L0-L1", "L1-L2", "L2-L3", "U1-U2", "L0-U1", "U2-L3", "U1-L1", "U2-L2", "U1-L2"]
MODEL = {
    "dimension": 2,
    "units": {"length": "m", "force": "kN"},
    "materials": [{"id": "steel", "elastic_modulus": 2.1e8}],
    "sections": [{"id": "box", "area": 0.003}],
    "nodes": [{"id": k, "at": v} for k, v in NODES.items()],
    "members": [{"id": b, "ends": b.split("-"), "material": "steel", "section": "box"} for b in BARS],
    "supports": [{"node": "L0", "fix": ["x", "y"]}, {"node": "L3", "fix": ["y"]}],
    "load_cases": [{"id": "signs", "loads": [{"node": "L1", "force": [0, -14]}, {"node": "L2", "force": [0, -8]}]}],
}


def closure(model: dict, case: dict) -> list:
    """closure returns, per node, |Σ forces| (kN): member forces, loads and reactions.

    A member in tension (N > 0) pulls each of its ends towards the other.
    """
    at = {n["id"]: n["at"] for n in model["nodes"]}
    total = {n: [0.0, 0.0] for n in at}
    for member, force in zip(model["members"], case["axial_forces"]):
        a, b = member["ends"]
        dx, dy = at[b][0] - at[a][0], at[b][1] - at[a][1]
        length = math.hypot(dx, dy)
        for node, sign in ((a, 1.0), (b, -1.0)):
            total[node][0] += sign * force * dx / length
            total[node][1] += sign * force * dy / length
    for load in model["load_cases"][0]["loads"]:
        total[load["node"]][0] += load["force"][0]
        total[load["node"]][1] += load["force"][1]
    for reaction in case["reactions"]:
        total[reaction["node"]][0] += reaction["force"][0]
        total[reaction["node"]][1] += reaction["force"][1]
    return [math.hypot(*total[n]) for n in at]


def main() -> None:
    folder = Path(sys.argv[1] if len(sys.argv) > 1 else os.environ.get("GUSSET_EXAMPLES_OUT")
                  or tempfile.mkdtemp(prefix="gusset-gantry-"))
    folder.mkdir(parents=True, exist_ok=True)
    with gusset.Client() as client:
        # 1. The force diagram of the gantry as drawn.
        diagram = client.reciprocate(MODEL)
        points = {s["label"]: s["point"] for s in diagram["spaces"]}
        spaces = {seg["member"]: seg["spaces"] for seg in diagram["members"]}
        print("Force diagram: member, its two spaces, force (kN, tension +)")
        for seg in diagram["members"]:
            print("  %-6s %-5s %8.2f" % (seg["member"], "-".join(seg["spaces"]), seg["force"]))

        # 2. The face inside the first panel is the numbered space that
        # L0-L1 and L0-U1 share; move its point.
        face = (set(spaces["L0-L1"]) & set(spaces["L0-U1"])).pop()
        old = points[face]
        new = [old[0] + DRAG, old[1]]
        print("Moving point %s from (%.2f, %.2f) to (%.2f, %.2f)" % (face, old[0], old[1], new[0], new[1]))

        # 3. The form that fits the edited diagram.
        edited = client.reciprocate(MODEL, edit={"points": {face: new}})
        form = edited["form"]
        print("Redrawn form (residual %.1e m): node, old position, new position, moved (m)" % form["residual"])
        for node in form["nodes"]:
            was = NODES[node["id"]]
            x, y = (round(v, 3) + 0.0 for v in node["at"])  # + 0.0 turns -0.0 into 0.0
            print("  %-3s (%5.2f, %5.2f) -> (%6.3f, %6.3f)  %.3f" % (node["id"], was[0], was[1], x, y, node["moved"]))

        # 4. Solve the redrawn gantry: the forces found are those drawn.
        redrawn = copy.deepcopy(MODEL)
        for node, new_node in zip(redrawn["nodes"], form["nodes"]):
            node["at"] = new_node["at"]
        case = client.solve(redrawn)["cases"][0]
    points[face] = new
    print("Member forces of the redrawn gantry (kN): drawn |segment| and found by solve")
    for member, force in zip(BARS, case["axial_forces"]):
        a, b = spaces[member]
        drawn = math.hypot(points[b][0] - points[a][0], points[b][1] - points[a][1])
        print("  %-6s %8.3f %9.3f %s" % (member, drawn, force, "tension" if force > 0 else "compression"))
    errors = closure(redrawn, case)
    print("Closure error: largest |Σ forces| at a node %.1e kN" % max(errors))

    record = {"model": MODEL, "edited_face": face, "edited_point": new, "diagram": diagram,
              "form": form, "redrawn_model": redrawn, "solved": case, "closure": errors}
    (folder / "gantry-round-trip.json").write_text(json.dumps(record, indent=1) + "\n", encoding="utf-8")
    print("written:", folder / "gantry-round-trip.json")
    print(CAUTION)


if __name__ == "__main__":
    try:
        main()
    except gusset.GussetNotFound as err:
        sys.exit(str(err))
