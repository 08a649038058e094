#!/usr/bin/python3
"""Invented benchmark data: hourly power draw (kW) of invented cold-storage
rooms. Every value is made up by this script; no real site is described.

Each room has its own base load, a daily cycle (door openings by day,
defrost cycles), a weekly dip, AR(1) noise and a few real gaps (a meter
offline for some hours), so that masks must work around missing values.

  /usr/bin/python3 experiments/perf/make_workload.py --series 200 --points 2000 --out rooms.csv
  /usr/bin/python3 experiments/perf/make_workload.py --series 10000 --points 1000 --files 10 --out big.csv

With --files K the rooms are split over K files (big_01.csv ...), each a
complete wide table; a spec lists them all. Same arguments, same bytes.
"""
import argparse

import numpy as np


def make_block(rng, first_room, rooms, points):
    t = np.arange(points)
    base = rng.uniform(8.0, 40.0, rooms)
    daily = rng.uniform(0.5, 4.0, rooms)
    shift = rng.uniform(0, 2 * np.pi, rooms)
    weekly = rng.uniform(0.0, 1.5, rooms)
    phi = rng.uniform(0.5, 0.95, rooms)
    sigma = rng.uniform(0.2, 1.0, rooms)
    values = np.empty((points, rooms))
    noise = np.zeros(rooms)
    shocks = rng.standard_normal((points, rooms))
    for i in range(points):
        noise = phi * noise + sigma * shocks[i]
        values[i] = (base + daily * np.sin(2 * np.pi * t[i] / 24 + shift)
                     - weekly * ((t[i] // 24) % 7 >= 5) + noise)
    # Real gaps: each room loses a few stretches of 1 to 12 hours.
    for r in range(rooms):
        for _ in range(rng.integers(0, 4)):
            start = rng.integers(0, points - 12)
            values[start:start + rng.integers(1, 13), r] = np.nan
    names = [f"room_{first_room + r:05d}" for r in range(rooms)]
    return names, values


def write_csv(path, names, values):
    points = values.shape[0]
    start = np.datetime64("2031-01-06T00:00")
    times = start + np.arange(points) * np.timedelta64(1, "h")
    with open(path, "w", encoding="utf-8", newline="\n") as out:
        out.write("time," + ",".join(names) + "\n")
        for i in range(points):
            cells = ["" if np.isnan(v) else f"{v:.4f}" for v in values[i]]
            out.write(str(times[i]) + "," + ",".join(cells) + "\n")


def main():
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--series", type=int, default=200)
    parser.add_argument("--points", type=int, default=2000)
    parser.add_argument("--files", type=int, default=1)
    parser.add_argument("--seed", type=int, default=20261201)
    parser.add_argument("--out", required=True)
    args = parser.parse_args()
    rng = np.random.default_rng(args.seed)
    per_file = -(-args.series // args.files)
    stem = args.out[:-4] if args.out.endswith(".csv") else args.out
    first = 0
    for k in range(args.files):
        rooms = min(per_file, args.series - first)
        if rooms <= 0:
            break
        names, values = make_block(rng, first, rooms, args.points)
        path = args.out if args.files == 1 else f"{stem}_{k + 1:02d}.csv"
        write_csv(path, names, values)
        first += rooms


if __name__ == "__main__":
    main()
