#!/usr/bin/env python3
"""Writes the raw-data walk-through files: an INVENTED event log and an
INVENTED sensor log from an invented coastal fish farm ("Skerry Bay"),
pens P1, P2 and P4, 2 to 22 March 2026 (three weeks), times in UTC.

Nothing here is measured. The numbers come from simple formulas plus
pseudo-random noise at a fixed seed, so anyone can regenerate the same files:

    python3 experiments/raw/make_event_log.py experiments/raw

Only the Python standard library is used. Two files, in the long layout
(group column first, then time, then values), rows as loggers send them:

feeder_events.csv   pen, time, feed_kg
    One row per feeder dispense: meals around 07:00, 12:00 and 17:00, a
    dispense every few minutes for about 40 minutes, none at night, so most
    hours have no rows at all: there nothing happened and the truth is zero.
    The load cell of a feeder sometimes fails for a few hours: the dispense
    rows are still written, with feed_kg empty (missing values).

water_quality.csv   pen, time, oxygen_mg_l, salinity_psu, turbidity_ntu
    One row every 15 minutes per pen, from a logger that is sometimes down:
      - outages: no rows for hours (missing records: the truth is unknown);
      - radio dropouts of one or two rows, more often at night;
      - after reconnecting, the logger re-sends a few rows (duplicates) and
        some arrive late (out of order);
      - the oxygen probe drops its reading when oxygen is low (below about
        5.6 mg/L): the row is there, the cell is empty (missing values that
        depend on the value itself);
      - the salinity probe is cleaned on Wednesday mornings (empty cells).
"""
import math
import random
import sys
from datetime import datetime, timedelta
from pathlib import Path

SEED = 20260302
START = datetime(2026, 3, 2, 0, 0)   # a Monday
DAYS = 21
PENS = ["P1", "P2", "P4"]
MEALS = [7, 12, 17]


def iso(t: datetime) -> str:
    return t.strftime("%Y-%m-%dT%H:%M:%SZ")


def feeder_events(rng: random.Random) -> list:
    rows = []
    # load-cell faults: (pen, day, first hour, hours)
    faults = {("P1", 4, 11, 3), ("P2", 9, 6, 8), ("P4", 15, 16, 2), ("P2", 17, 11, 2)}
    for pen_index, pen in enumerate(PENS):
        appetite = 1.0
        for day in range(DAYS):
            appetite = min(1.2, max(0.5, 0.7 * appetite + 0.3 + rng.gauss(0.0, 0.08)))
            for meal in MEALS:
                t = START + timedelta(days=day, hours=meal, minutes=rng.randint(-6, 8), seconds=rng.randint(0, 59))
                end = t + timedelta(minutes=rng.randint(32, 48))
                while t < end:
                    dose = max(0.2, (2.2 + 0.3 * pen_index + 0.01 * day) * appetite + rng.gauss(0.0, 0.35))
                    hour = t.hour
                    failed = any(p == pen and d == day and h0 <= hour < h0 + n for p, d, h0, n in faults)
                    rows.append((pen, t, "" if failed else f"{dose:.2f}"))
                    t += timedelta(seconds=rng.randint(100, 260))
    rows.sort(key=lambda r: (r[1], r[0]))  # one controller log, time order
    return rows


def water_quality(rng: random.Random) -> list:
    steps = DAYS * 96
    # outages: (pen, first step, steps) -> no rows at all
    outages = {"P1": [(4 * 96 + 40, 24), (13 * 96 + 70, 9)],
               "P2": [(8 * 96 + 10, 120), (16 * 96 + 50, 16)],
               "P4": [(11 * 96 + 30, 36)]}
    rows = []
    for pen_index, pen in enumerate(PENS):
        noise = 0.0
        salinity = 33.4 + 0.2 * pen_index
        turbidity = 2.0
        down = set()
        for first, n in outages[pen]:
            down.update(range(first, first + n))
        for k in range(steps):
            t = START + timedelta(minutes=15 * k)
            day = k / 96.0
            hour = t.hour + t.minute / 60.0
            noise = 0.93 * noise + rng.gauss(0.0, 0.06)
            oxygen = (7.2 - 0.25 * pen_index - 0.02 * day + 1.1 * math.sin(2 * math.pi * (hour - 9.5) / 24.0) + noise)
            salinity += rng.gauss(0.0, 0.01) + 0.002 * (33.4 + 0.2 * pen_index - salinity)
            turbidity = max(0.3, 0.9 * turbidity + 0.1 * 2.0 + rng.gauss(0.0, 0.25)
                            + (1.5 if any(abs(hour - m - 0.5) < 0.5 for m in MEALS) else 0.0) * rng.random())
            if k in down:
                continue
            night = hour < 6 or hour >= 21
            if rng.random() < (0.012 if night else 0.003):
                continue  # a radio dropout
            ox = f"{oxygen:.2f}"
            if oxygen < 5.6 and rng.random() < 0.6:
                ox = ""  # the probe drops low readings
            sal = f"{salinity:.3f}"
            if t.isoweekday() == 3 and 8 <= t.hour < 10:
                sal = ""  # weekly cleaning
            rows.append([pen, iso(t), ox, sal, f"{turbidity:.2f}"])
        # after each outage the logger re-sends its last rows (duplicates), and
        # one row arrives late (out of order)
        for first, n in outages[pen]:
            resend = [r for r in rows if r[0] == pen and START + timedelta(minutes=15 * (first - 3)) <= datetime.strptime(r[1], "%Y-%m-%dT%H:%M:%SZ") < START + timedelta(minutes=15 * first)]
            at = next(i for i, r in enumerate(rows) if r[0] == pen and datetime.strptime(r[1], "%Y-%m-%dT%H:%M:%SZ") >= START + timedelta(minutes=15 * (first + n)))
            rows[at + 1:at + 1] = [list(r) for r in resend]
            late = rows.pop(at + 6)
            rows.insert(at + 9, late)
    return rows


def main() -> None:
    out = Path(sys.argv[1] if len(sys.argv) > 1 else ".")
    rng = random.Random(SEED)
    with open(out / "feeder_events.csv", "w", newline="\n") as f:
        f.write("pen,time,feed_kg\n")
        for pen, t, kg in feeder_events(rng):
            f.write(f"{pen},{iso(t)},{kg}\n")
    with open(out / "water_quality.csv", "w", newline="\n") as f:
        f.write("pen,time,oxygen_mg_l,salinity_psu,turbidity_ntu\n")
        for row in water_quality(rng):
            f.write(",".join(row) + "\n")


if __name__ == "__main__":
    main()
