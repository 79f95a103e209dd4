"""A generative workflow: many truss variants for the Ottery Pier walkway.

The scenario (our own invention): at Kestle Bay, a timber walkway runs out
along Ottery Pier on a pair of steel trusses, each spanning 18 m between
pier heads and carrying 6 kN per metre run (crowd and deck) on its bottom
chord. Which truss uses the least steel? We build Pratt trusses with 2, 4, 6
and 8 panels and depths from 0.75 m to 4.5 m, send every variant to Gusset
at once, and write a table (CSV) and a chart (SVG) of the steel needed.

Run from clients/python:

    python3 examples/walkway_variants.py [OUTPUT_FOLDER]

The files go into OUTPUT_FOLDER, else $GUSSET_EXAMPLES_OUT, else a new
temporary folder. The binary is found as gusset.Client finds it
($GUSSET_BINARY, gusset on PATH, or the root of the repository).
"""

import csv
import math
import os
import sys
import tempfile
from concurrent.futures import ThreadPoolExecutor
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent.parent))  # the gusset package beside us
import gusset  # noqa: E402

SPAN = 18.0  # m, between pier heads
LINE_LOAD = 6.0  # kN per metre run, on the bottom chord
PANELS = [2, 4, 6, 8]
DEPTHS = [0.75 + 0.25 * i for i in range(16)]  # m: 0.75, 1.0, ..., 4.5
CAUTION = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."

# Structural steel: E 210 GPa, design stress 235 MPa both ways, 77 kN/m³,
# 1.55 kg CO2e per kg (stresses in kN/m², since the model is in m and kN).
STEEL = {"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 2.35e5, "compression_limit": 2.35e5,
         "weight_density": 77.0, "carbon_factor": 1.55}
# Members are sized as round tubes with diameter 30 times the wall, so that
# long struts get more steel against buckling.
SIZING = {"shape": "tube", "diameter_to_thickness": 30}


def pratt_truss(panels: int, depth: float) -> dict:
    """pratt_truss builds one variant of an even number of panels: bottom nodes L0..Ln, top nodes U1..Un-1.

    The end posts lean in (L0-U1 and Un-1-Ln); the diagonals of the inner
    panels slope down towards mid-span, so under gravity they pull and the
    verticals push. A panel load sits on each inner bottom node; the half
    panels at the ends go straight into the bearings and load no member.
    """
    a = SPAN / panels
    nodes = [{"id": "L%d" % i, "at": [i * a, 0.0]} for i in range(panels + 1)]
    nodes += [{"id": "U%d" % i, "at": [i * a, depth]} for i in range(1, panels)]
    pairs = [("L%d" % i, "L%d" % (i + 1)) for i in range(panels)]  # bottom chord
    pairs += [("U%d" % i, "U%d" % (i + 1)) for i in range(1, panels - 1)]  # top chord
    pairs += [("U%d" % i, "L%d" % i) for i in range(1, panels)]  # verticals
    for i in range(panels):  # one diagonal per panel, leaning towards mid-span
        if i < panels // 2:
            pairs.append(("L0", "U1") if i == 0 else ("U%d" % i, "L%d" % (i + 1)))
        else:
            pairs.append(("U%d" % i, "L%d" % (i + 1)) if i == panels - 1 else ("L%d" % i, "U%d" % (i + 1)))
    panel_load = LINE_LOAD * a
    return {
        "dimension": 2,
        "units": {"length": "m", "force": "kN"},
        "materials": [STEEL],
        "sections": [{"id": "tube", "area": 0.002, "second_moment": 3e-6}],  # a start: load-path sizes each member
        "nodes": nodes,
        "members": [{"id": "%s-%s" % p, "ends": list(p), "material": "steel", "section": "tube"} for p in pairs],
        "supports": [{"node": "L0", "fix": ["x", "y"]}, {"node": "L%d" % panels, "fix": ["y"]}],
        "load_cases": [{"id": "crowd", "loads": [{"node": "L%d" % i, "force": [0, -panel_load]}
                                                 for i in range(1, panels)]}],
    }


def evaluate(client: gusset.Client, panels: int, depth: float) -> dict:
    """evaluate sends one variant to load-path and keeps what the table needs."""
    result = client.load_path(pratt_truss(panels, depth), sizing=SIZING)
    total = result["totals"]["all"]
    return {
        "variant": "pratt-%d-%.2f" % (panels, depth),
        "depth_m": depth,
        "panels": panels,
        "max_force_kN": max(abs(f) for f in result["members"]["force"]),
        "load_path_kNm": total["load_path"],
        "volume_m3": total["volume"],
        "mass_kg": total["mass"],
        "carbon_kgCO2e": total["carbon"],
    }


def nice_ticks(low: float, high: float, count: int = 6) -> list:
    """nice_ticks returns round tick values (1, 2 or 5 times a power of ten) covering [low, high]."""
    raw = (high - low) / count
    power = 10.0 ** math.floor(math.log10(raw))
    step = next(m * power for m in (1, 2, 5, 10) if m * power >= raw)
    # The 1e-9 keeps a bound that is already a tick from gaining one more.
    return [i * step for i in range(math.floor(low / step + 1e-9), math.ceil(high / step - 1e-9) + 1)]


def chart(rows: list) -> str:
    """chart draws volume against depth, one line per panel count, as SVG text."""
    width, height, left, right, top, bottom = 760, 500, 80, 170, 70, 90
    xs = nice_ticks(0, max(r["depth_m"] for r in rows))
    ys = nice_ticks(0, max(r["volume_m3"] for r in rows))
    px = lambda x: left + (x - xs[0]) / (xs[-1] - xs[0]) * (width - left - right)  # noqa: E731
    py = lambda y: height - bottom - (y - ys[0]) / (ys[-1] - ys[0]) * (height - top - bottom)  # noqa: E731
    out = ['<svg xmlns="http://www.w3.org/2000/svg" width="%d" height="%d" font-family="DejaVu Sans, Liberation Sans, Arial, sans-serif" font-size="12">'
           % (width, height),
           '<rect width="100%" height="100%" fill="white"/>',
           '<text x="%d" y="28" font-size="16">Ottery Pier walkway: steel volume of Pratt trusses, 18 m span</text>'
           % left,
           '<text x="%d" y="48">6 kN/m on the bottom chord; members sized as steel tubes'
           ' (D/t = 30, 235 MPa), buckling included</text>' % left]
    for x in xs:  # vertical grid lines with their labels
        out.append('<line x1="%.1f" y1="%d" x2="%.1f" y2="%d" stroke="#ddd"/>' % (px(x), top, px(x), height - bottom))
        out.append('<text x="%.1f" y="%d" text-anchor="middle">%g</text>' % (px(x), height - bottom + 18, round(x, 6)))
    for y in ys:
        out.append('<line x1="%d" y1="%.1f" x2="%d" y2="%.1f" stroke="#ddd"/>' % (left, py(y), width - right, py(y)))
        out.append('<text x="%d" y="%.1f" text-anchor="end">%g</text>' % (left - 6, py(y) + 4, round(y, 6)))
    out.append('<path d="M%d %d V%d H%d" fill="none" stroke="black"/>' % (left, top, height - bottom, width - right))
    out.append('<text x="%.1f" y="%d" text-anchor="middle">depth (m)</text>'
               % ((left + width - right) / 2, height - bottom + 40))
    out.append('<text transform="translate(22 %.1f) rotate(-90)" text-anchor="middle">steel volume (m³)</text>'
               % ((top + height - bottom) / 2))
    # Gusset's palette (engine/render/style.go), told apart by dash too.
    colours = ["#2b1d72", "#c96f00", "#007a6c", "#262626"]
    dashes = ["none", "9 3 2 3", "5 3", "1.5 3"]
    for k, panels in enumerate(PANELS):
        line = [r for r in rows if r["panels"] == panels]
        points = " ".join("%.1f,%.1f" % (px(r["depth_m"]), py(r["volume_m3"])) for r in line)
        out.append('<polyline points="%s" fill="none" stroke="%s" stroke-dasharray="%s" stroke-width="2"/>'
                   % (points, colours[k], dashes[k]))
        for r in line:
            out.append('<circle cx="%.1f" cy="%.1f" r="3" fill="%s"/>'
                       % (px(r["depth_m"]), py(r["volume_m3"]), colours[k]))
        ly = top + 20 + 22 * k  # the legend, right of the plot
        out.append('<line x1="%d" y1="%d" x2="%d" y2="%d" stroke="%s" stroke-dasharray="%s" stroke-width="2"/>'
                   % (width - right + 20, ly, width - right + 50, ly, colours[k], dashes[k]))
        out.append('<text x="%d" y="%d">%d panels</text>' % (width - right + 58, ly + 4, panels))
    out.append('<text x="%d" y="%d" font-style="italic">%s</text>' % (left, height - 20, CAUTION))
    out.append("</svg>")
    return "\n".join(out) + "\n"


def main() -> None:
    folder = Path(sys.argv[1] if len(sys.argv) > 1 else os.environ.get("GUSSET_EXAMPLES_OUT")
                  or tempfile.mkdtemp(prefix="gusset-walkway-"))
    folder.mkdir(parents=True, exist_ok=True)
    variants = [(n, h) for n in PANELS for h in DEPTHS]
    # One process serves every request; eight threads keep eight requests in
    # flight at once, and the client pairs each answer with its request.
    with gusset.Client() as client, ThreadPoolExecutor(max_workers=8) as pool:
        rows = list(pool.map(lambda v: evaluate(client, *v), variants))

    table = folder / "walkway-variants.csv"
    with open(str(table), "w", newline="") as f:
        writer = csv.DictWriter(f, fieldnames=list(rows[0]))
        writer.writeheader()
        writer.writerows(rows)
    picture = folder / "walkway-volume.svg"
    picture.write_text(chart(rows), encoding="utf-8")

    best = min(rows, key=lambda r: r["volume_m3"])
    print("%d variants sent; least steel: %d panels, %.2f m deep, %.4f m³ (%.0f kg, %.0f kg CO2e)"
          % (len(rows), best["panels"], best["depth_m"], best["volume_m3"], best["mass_kg"], best["carbon_kgCO2e"]))
    print("table:", table)
    print("chart:", picture)
    print(CAUTION)


if __name__ == "__main__":
    try:
        main()
    except gusset.GussetNotFound as err:
        sys.exit(str(err))
