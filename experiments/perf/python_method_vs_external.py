#!/usr/bin/python3
"""A fill method written in Python, run in-process (gapmark.register_method)
against the same method run as an outside program (`external`), on the same
masks: 20 invented series x 2,000 hourly points (make_workload.py), random
masks at rate 0.1, 10 replicates (200 fills per method), error metrics only.
Also times, on one thread, the built-in `carry-forward` and `linear` on the
same masks and a Python method that returns its input, to say what a call
into Python costs over a built-in method.

The method is the same code both ways: carry the last observed value forward
(the first values take the first observation), in plain Python on a list,
so the external program needs no numpy import and the difference is the
cost of starting a program for every fill.

Prints its figures; it is a measurement, not a test.

  PYTHONPATH=build/python /usr/bin/python3 experiments/perf/python_method_vs_external.py [--threads N]
"""
import argparse
import json
import os
import subprocess
import sys
import tempfile
import time

import gapmark

HERE = os.path.dirname(os.path.abspath(__file__))

CARRY = '''
def carry(values):
    """Carries the last observed value forward; leading gaps take the first observation."""
    out = list(values)
    last = next((v for v in out if v == v), 0.0)
    for i, v in enumerate(out):
        if v != v:
            out[i] = last
        else:
            last = v
    return out
'''

PROGRAM = CARRY + '''
import sys
lines = sys.stdin.read().split("\\n")
rows = [line.split(",") for line in lines[1:] if line]
filled = carry([float(v) if v else float("nan") for _, v in rows])
sys.stdout.write("time,value\\n" + "".join(f"{t},{v!r}\\n" for (t, _), v in zip(rows, filled)))
'''

namespace = {}
exec(CARRY, namespace)
carry = namespace["carry"]


def in_process(values, request):
    return carry(values.tolist())


def no_op(values, request):
    """Returns its input: the cost of the call alone (its trials fail, as nothing is filled)."""
    return values


def run(spec, folder, threads, allow_external=False):
    (folder / "spec.json").write_text(json.dumps(spec))
    wall, cpu = time.perf_counter(), time.process_time()
    results = gapmark.run(folder / "spec.json", threads=threads, progress=False, allow_external=allow_external)
    wall, cpu = time.perf_counter() - wall, time.process_time() - cpu
    return results, wall, cpu


def main():
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--threads", type=int, default=os.cpu_count())
    args = parser.parse_args()
    import pathlib
    with tempfile.TemporaryDirectory(prefix="gapmark-perf-") as tmp:
        folder = pathlib.Path(tmp)
        subprocess.run([sys.executable, os.path.join(HERE, "make_workload.py"), "--series", "20", "--points", "2000",
                        "--out", str(folder / "rooms.csv")], check=True)
        (folder / "carry.py").write_text(PROGRAM)
        gapmark.register_method("py-carry", in_process, summary="carry forward, in Python")
        base = {"name": "python method vs external (invented data)", "seed": 3, "replicates": 10,
                "data": [{"file": "rooms.csv"}], "schemes": [{"name": "random", "rates": [0.1]}],
                "metrics": ["error"]}
        gapmark.register_method("py-no-op", no_op, summary="returns its input, in Python")
        timings = {}
        for label, methods, external, threads in [
                ("Python, in-process", ["py-carry"], False, args.threads),
                ("Python, external", [{"name": "external", "command": f"{sys.executable} carry.py"}], True,
                 args.threads),
                ("built-in carry-forward", ["carry-forward"], False, 1),
                ("built-in linear", ["linear"], False, 1),
                ("Python no-op", ["py-no-op"], False, 1),
                ("Python carry", ["py-carry"], False, 1)]:
            results, wall, cpu = run(dict(base, methods=methods), folder, threads, external)
            trials = results.trials
            fill_seconds = sum(results.json["timing"]["fill_seconds_by_method"].values())
            timings[label] = (wall, cpu, fill_seconds, len(trials), results)
            print(f"{label:24s} {threads} thread(s), {len(trials)} fills: {wall:7.3f} s wall, {cpu:7.3f} s CPU of "
                  f"this process, {1e3 * fill_seconds / len(trials):8.3f} ms per fill (fill time summed over threads)")
        a, b = timings["Python, in-process"][4].trials, timings["Python, external"][4].trials
        same = (a["rmse"].to_numpy() == b["rmse"].to_numpy()).all()
        print(f"in-process and external give the same RMSE in every trial: {same}")
        ratio = timings["Python, external"][0] / timings["Python, in-process"][0]
        fill_ratio = timings["Python, external"][2] / timings["Python, in-process"][2]
        print(f"in-process is {ratio:.0f}x faster than external in wall-clock time of the whole run "
              f"({fill_ratio:.0f}x in fill time), on {args.threads} thread(s)")
        per_fill = {k: 1e6 * v[2] / v[3] for k, v in timings.items()}
        print(f"one thread, per fill: built-in carry-forward {per_fill['built-in carry-forward']:.0f} us, "
              f"linear {per_fill['built-in linear']:.0f} us; Python method returning its input "
              f"{per_fill['Python no-op']:.0f} us (the call's cost: {per_fill['Python no-op'] - per_fill['built-in linear']:.0f} us "
              f"over linear); Python carry-forward {per_fill['Python carry']:.0f} us")


if __name__ == "__main__":
    main()
