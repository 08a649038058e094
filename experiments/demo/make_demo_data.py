#!/usr/bin/env python3
"""Writes the demo data set: INVENTED hourly readings from an invented coastal
fish farm, pen 3 ("Skerry Bay"), 1 March to 29 May 2026 (90 days).

Nothing here is measured. The numbers come from simple formulas plus
pseudo-random noise at a fixed seed, so anyone can regenerate the same file:

    python3 experiments/demo/make_demo_data.py > experiments/demo/pen3_hourly.csv

Only the Python standard library is used. The variables are built to need
different fill methods:
  dissolved_oxygen_mg_l  smooth daily cycle (photosynthesis by day, respiration
                         by night) on a slow seasonal rise, AR(1) noise
  feed_dispensed_kg      bursts at the feeding times 07:00, 12:00 and 17:00,
                         zero otherwise; less on windy days
  water_level_m          semidiurnal tide (periods about 12.42 h and 12 h)
  salinity_psu           slow drift with freshwater pulses after spring melt
  pump_energy_kwh        daily duty cycle and a lighter weekend schedule
A few logger outages leave real gaps (empty cells) in two columns.
"""
import math
import random
import sys
from datetime import datetime, timedelta

SEED = 20260301
HOURS = 90 * 24
START = datetime(2026, 3, 1, 0, 0)


def main() -> None:
    rng = random.Random(SEED)
    out = sys.stdout
    out.write("time,dissolved_oxygen_mg_l,feed_dispensed_kg,water_level_m,salinity_psu,pump_energy_kwh\n")
    do_noise = 0.0
    salinity = 33.6
    wind = 0.0
    outages = {"dissolved_oxygen_mg_l": [(400, 406), (1333, 1341)], "salinity_psu": [(900, 930)]}
    for h in range(HOURS):
        t = START + timedelta(hours=h)
        day = h / 24.0
        hour = t.hour
        # dissolved oxygen: daily cycle peaking mid-afternoon, slow rise, AR(1) noise
        do_noise = 0.85 * do_noise + rng.gauss(0.0, 0.08)
        oxygen = 8.1 + 0.012 * day + 0.9 * math.sin(2 * math.pi * (hour - 9) / 24) + do_noise
        # feed: bursts at fixed feeding times, reduced in windy spells, zero otherwise
        if hour == 0:
            wind = min(1.0, max(0.0, 0.6 * wind + rng.uniform(-0.2, 0.5)))
        feed = 0.0
        if hour in (7, 12, 17):
            feed = max(0.0, (38.0 + 0.08 * day) * (1.0 - 0.5 * wind) + rng.gauss(0.0, 2.5))
        # water level: two semidiurnal constituents and a little surge noise
        level = (2.1 + 1.15 * math.cos(2 * math.pi * h / 12.42)
                 + 0.32 * math.cos(2 * math.pi * h / 12.0 + 0.7) + rng.gauss(0.0, 0.03))
        # salinity: random-walk drift, freshwater pulses in late April
        salinity += rng.gauss(0.0, 0.015) + 0.0004 * (33.6 - salinity)
        melt = 1.4 * math.exp(-((day - 55.0) / 6.0) ** 2)
        sal = salinity - melt
        # pump energy: daily duty cycle, lighter weekends, noise
        weekend = t.isoweekday() >= 6
        duty = 0.55 + 0.35 * math.sin(2 * math.pi * (hour - 6) / 24) ** 2 * (hour >= 6 and hour <= 20)
        energy = (14.0 if not weekend else 10.5) * duty + rng.gauss(0.0, 0.35)
        row = {
            "dissolved_oxygen_mg_l": f"{oxygen:.3f}",
            "feed_dispensed_kg": f"{feed:.2f}",
            "water_level_m": f"{level:.3f}",
            "salinity_psu": f"{sal:.3f}",
            "pump_energy_kwh": f"{energy:.3f}",
        }
        for column, spans in outages.items():
            if any(a <= h < b for a, b in spans):
                row[column] = ""
        out.write(t.strftime("%Y-%m-%dT%H:%M") + "," + ",".join(row.values()) + "\n")


if __name__ == "__main__":
    main()
