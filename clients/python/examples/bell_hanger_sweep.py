"""A sweep that prints its curve as it streams: how far should the bell hang?

The scenario (our own invention): the ferry bell at Saltmarsh Landing, 6 kN
with its yoke, hangs from two steel rods anchored 2.4 m apart under the
landing stage's canopy beam. The rods meet at the yoke, a drop `depth`
below the beam. A short drop makes the rods flat and their pull large; a
long drop makes them long. We sweep the drop from 0.25 m to 3 m, print each
step as soon as Gusset has computed it, with a bar as long as its load path
(Σ|N|·L, the force times the length summed over the rods), and then the
optimum that Gusset refines by Brent's method.

Run from clients/python:

    python3 examples/bell_hanger_sweep.py [OUTPUT_FOLDER]

The steps (CSV) and the optimum (JSON) go into OUTPUT_FOLDER, else
$GUSSET_EXAMPLES_OUT, else a new temporary folder.
"""

import csv
import json
import math
import os
import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))  # the gusset package beside us
import gusset  # noqa: E402

HALF_SPAN = 1.2  # m, from the middle to each anchor
BELL = 6.0  # kN
KNM_PER_MARK = 1.0  # each '#' of a bar stands for 1 kN·m of load path
CAUTION = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."

# The model's geometry depends on the parameter "depth": the yoke sits at
# [0, "-depth"], an expression Gusset evaluates at every step of the sweep.
MODEL = {
    "dimension": 2,
    "units": {"length": "m", "force": "kN"},
    "parameters": {"depth": 1.0},
    "materials": [{"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 2.35e5,
                   "compression_limit": 2.35e5, "weight_density": 77.0, "carbon_factor": 1.55}],
    "sections": [{"id": "rod", "area": 1e-4}],
    "nodes": [{"id": "west", "at": [-HALF_SPAN, 0]},
              {"id": "east", "at": [HALF_SPAN, 0]},
              {"id": "yoke", "at": [0, "-depth"]}],
    "members": [{"id": "west-rod", "ends": ["west", "yoke"], "material": "steel", "section": "rod"},
                {"id": "east-rod", "ends": ["east", "yoke"], "material": "steel", "section": "rod"}],
    "supports": [{"node": "west", "fix": ["x", "y"]}, {"node": "east", "fix": ["x", "y"]}],
    "load_cases": [{"id": "bell", "loads": [{"node": "yoke", "force": [0, -BELL]}]}],
}


def main() -> None:
    folder = Path(sys.argv[1] if len(sys.argv) > 1 else os.environ.get("GUSSET_EXAMPLES_OUT")
                  or tempfile.mkdtemp(prefix="gusset-bell-"))
    folder.mkdir(parents=True, exist_ok=True)
    with gusset.Client() as client:
        sweep = client.sweep(
            MODEL,
            {"name": "depth", "from": 0.25, "to": 3.0, "count": 12},
            metrics=["load_path", "volume", "mass"],
            sizing={"shape": "tube", "diameter_to_thickness": 30},  # rods only pull: no buckling
            objective={"metric": "load_path", "goal": "minimise", "tolerance": 1e-9},
        )
        steps = []
        print("step  depth (m)  load path (kN·m)")
        for step in sweep:  # each step arrives as soon as it is computed, maybe out of order
            depth, z = step["values"][0], step["metrics"]["load_path"]
            print("%4d  %9.2f  %16.2f  %s" % (step["index"], depth, z, "#" * round(z / KNM_PER_MARK)))
            steps.append(step)
        result = sweep.result()  # the final answer, after the last step
    best = result["refinement"]
    depth, metrics = best["values"][0], best["metrics"]
    print("Least load path at depth %.4f m: %.3f kN·m, %.2f cm³ of steel (%.3f kg), after %d evaluations."
          % (depth, metrics["load_path"], metrics["volume"] * 1e6, metrics["mass"], best["evaluations"]))
    print("The rods then lean at %.1f° from the horizontal." % math.degrees(math.atan2(depth, HALF_SPAN)))

    steps.sort(key=lambda s: s["index"])
    with open(str(folder / "bell-sweep.csv"), "w", newline="") as f:
        writer = csv.writer(f)
        writer.writerow(["index", "depth_m", "load_path_kNm", "volume_m3", "mass_kg"])
        for s in steps:
            m = s["metrics"]
            writer.writerow([s["index"], s["values"][0], m["load_path"], m["volume"], m["mass"]])
    (folder / "bell-optimum.json").write_text(json.dumps(best, indent=2) + "\n", encoding="utf-8")
    print("steps and optimum:", folder)
    print(CAUTION)


if __name__ == "__main__":
    try:
        main()
    except gusset.GussetNotFound as err:
        sys.exit(str(err))
