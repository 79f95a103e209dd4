"""A large sweep split into shards and run as tasks on Dask's distributed scheduler.

The scenario (our own invention): the roof trusses of the Tarrow Mill
weaving shed span 30 m in twelve 2.5 m panels. Two parameters shape them:
the depth at the supports and the extra rise of a curved top chord at
mid-span. We sweep both over a grid (24 × 24 = 576 steps by default) for
the load path, the largest displacement and the largest utilisation.

Gusset's sweep takes ``"shard": {"index": i, "count": n}`` and then
computes only the steps whose global index modulo n is i. Here each shard
is one Dask task. Every Dask worker process holds ONE long-lived Gusset
process (started by a worker plugin when the worker starts, closed when it
stops), so a task costs a request, not a process start. The shards'
steps are merged by their global index; the merged result is compared
with one Gusset process's unsharded answer and must be identical, byte
for byte, once both are written as JSON the same way.

Run from clients/python (Debian: apt-get install python3-distributed):

    python3 examples/dask_sharded_sweep.py [--grid 24] [--shards 8] [--workers 2] [--scheduler ADDRESS]

Without --scheduler it starts a LocalCluster of worker processes on this
machine. On a real cluster, start a scheduler and workers the usual way
(``dask scheduler`` on one machine, ``dask worker tcp://HOST:8786`` on
each of the others, each worker machine with this client and a gusset
binary on PATH or in GUSSET_BINARY), then pass ``--scheduler
tcp://HOST:8786``: the same plugin starts one Gusset process in every
worker, the same tasks run there, and the merge is the same. The merged
result goes to OUTPUT (default: merged-sweep.json in $GUSSET_EXAMPLES_OUT
or a temporary folder).
"""

import argparse
import json
import os
import sys
import tempfile
from pathlib import Path

CLIENT_DIR = str(Path(__file__).resolve().parent.parent)
sys.path.insert(0, CLIENT_DIR)  # the gusset package beside us
import gusset  # noqa: E402

CAUTION = "Preliminary design aid: a qualified engineer must check the design against the local codes and standards."
SPAN, PANELS, LOAD = 30.0, 12, 18.0  # m, panels, kN at each inner bottom node


def shed_truss():
    """The shed's truss: bottom chord straight, top chord at depth + rise·4x(L−x)/L², Warren diagonals."""
    a = SPAN / PANELS
    nodes, members = [], []
    for i in range(PANELS + 1):
        x = a * i
        nodes.append({"id": "B%d" % i, "at": [x, 0]})
        shape = 4 * x * (SPAN - x) / SPAN ** 2
        nodes.append({"id": "T%d" % i, "at": [x, "depth + rise * %r" % shape]})

    def bar(p, q):
        members.append({"id": p + q, "ends": [p, q], "material": "steel", "section": "chs"})
    for i in range(PANELS):
        bar("B%d" % i, "B%d" % (i + 1))
        bar("T%d" % i, "T%d" % (i + 1))
        if i % 2 == 0:
            bar("B%d" % i, "T%d" % (i + 1))
        else:
            bar("T%d" % i, "B%d" % (i + 1))
    for i in range(PANELS + 1):
        bar("B%d" % i, "T%d" % i)
    loads = [{"node": "B%d" % i, "force": [0, -LOAD]} for i in range(1, PANELS)]
    return {
        "dimension": 2,
        "units": {"length": "m", "force": "kN"},
        "parameters": {"depth": 1.5, "rise": 1.0},
        "materials": [{"id": "steel", "elastic_modulus": 2.1e8, "tension_limit": 3.55e5, "compression_limit": 3.55e5}],
        "sections": [{"id": "chs", "area": 3.2e-3, "second_moment": 8.0e-6}],
        "nodes": nodes,
        "members": members,
        "supports": [{"node": "B0", "fix": ["x", "y"]}, {"node": "B%d" % PANELS, "fix": ["y"]}],
        "load_cases": [{"id": "snow and roofing", "loads": loads}],
    }


def sweep_params(grid):
    return {
        "model": shed_truss(),
        "parameters": [{"name": "depth", "from": 1.0, "to": 7.0, "count": grid},
                       {"name": "rise", "from": 0.0, "to": 4.0, "count": grid}],
        "metrics": ["load_path", "max_displacement", "max_utilisation"],
        "steps": "full",
    }


class GussetPlugin:
    """A Dask worker plugin: one long-lived Gusset process per worker.

    Dask calls setup when the worker starts (or when the plugin is
    registered with a running worker) and teardown when it stops. The
    client lives on the worker object, so every task on that worker
    shares it; Gusset answers requests from several threads in any order.
    """

    name = "gusset"

    def __init__(self, binary=None):
        self.binary = binary

    def setup(self, worker):
        worker.gusset_client = gusset.Client(self.binary)

    def teardown(self, worker):
        client = getattr(worker, "gusset_client", None)
        if client is not None:
            client.close()


def run_shard(params, index, count):
    """One Dask task: a shard of the sweep on this worker's Gusset process."""
    from distributed import get_worker
    client = get_worker().gusset_client
    shard = dict(params, shard={"index": index, "count": count})
    result = client.call("sweep-parameter", shard)
    return {"worker": get_worker().address, "result": result}


def merge(shards):
    """Merges the shards' results into the result one process gives for the whole sweep.

    Steps are put back in global index order; totals and parameters are
    the same in every shard; failures add up. A sweep without an
    objective has no best step (-1), sharded or not.
    """
    first = shards[0]
    steps = sorted((s for r in shards for s in r["steps"]), key=lambda s: s["index"])
    merged = {}
    for key, value in first.items():
        if key == "steps":
            merged[key] = steps
        elif key == "failed":
            merged[key] = sum(r["failed"] for r in shards)
        else:
            merged[key] = value
    if merged.get("best", -1) != -1 or "refinement" in merged:
        raise ValueError("a sharded sweep takes no objective: run the refinement as one request")
    if len(steps) != merged["total"] or [s["index"] for s in steps] != list(range(merged["total"])):
        raise ValueError("the shards do not cover the sweep: %d steps of %d" % (len(steps), merged["total"]))
    return merged


def canonical(result):
    """One way of writing a result as JSON, for a byte-for-byte comparison."""
    return json.dumps(result, sort_keys=True, separators=(",", ":"), allow_nan=False).encode()


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("output", nargs="?", help="file for the merged result (JSON)")
    parser.add_argument("--grid", type=int, default=24, help="steps along each parameter")
    parser.add_argument("--shards", type=int, default=8, help="number of shards (tasks)")
    parser.add_argument("--workers", type=int, default=2, help="LocalCluster worker processes")
    parser.add_argument("--scheduler", help="address of a running Dask scheduler (default: a LocalCluster)")
    args = parser.parse_args(argv)

    from distributed import Client as DaskClient, LocalCluster

    params = sweep_params(args.grid)
    # Worker processes start afresh: they find the gusset package through
    # PYTHONPATH (on a real cluster, pip install ./clients/python on each).
    os.environ["PYTHONPATH"] = os.pathsep.join(p for p in [CLIENT_DIR, os.environ.get("PYTHONPATH", "")] if p)
    cluster = None
    if args.scheduler:
        dask = DaskClient(args.scheduler)
    else:
        cluster = LocalCluster(n_workers=args.workers, threads_per_worker=1, processes=True,
                               dashboard_address=None, silence_logs=40)
        dask = DaskClient(cluster)
    try:
        dask.register_worker_plugin(GussetPlugin(os.environ.get("GUSSET_BINARY")), name="gusset")
        futures = [dask.submit(run_shard, params, i, args.shards, pure=False) for i in range(args.shards)]
        answers = dask.gather(futures)
    finally:
        dask.close()
        if cluster is not None:
            cluster.close()
    merged = merge([a["result"] for a in answers])
    workers = sorted({a["worker"] for a in answers})

    with gusset.Client() as one:
        whole = one.call("sweep-parameter", params)
    same = canonical(merged) == canonical(whole)

    out = Path(args.output) if args.output else Path(os.environ.get("GUSSET_EXAMPLES_OUT") or tempfile.mkdtemp()) / "merged-sweep.json"
    out.write_bytes(canonical(merged))
    ok = [s for s in merged["steps"] if not s.get("error")]
    best = min(ok, key=lambda s: s["metrics"]["load_path"])
    print("Tarrow Mill shed trusses: %d steps in %d shards on %d Dask workers" % (merged["total"], args.shards, len(workers)))
    print("least load path %.1f kN·m at depth %.3f m, rise %.3f m (%d steps failed)" % (
        best["metrics"]["load_path"], best["values"][0], best["values"][1], merged["failed"]))
    print("merged result identical to one process's: %s" % ("yes" if same else "NO"))
    print("written to %s" % out)
    print(CAUTION)
    return 0 if same else 1


if __name__ == "__main__":
    sys.exit(main())
