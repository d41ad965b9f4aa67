# SPDX-License-Identifier: MIT
"""period_decomposition beside the period_totals pass it starts from.

Run by hand (not a test):  /usr/bin/python3 tests/bench/bench_decomposition.py

1. 60 items x 262 weeks (cycle year, n_p 52: five years, robust STL), one
   row per item per day (1,834 days from a Monday).
2. 60 items x 1,826 days (cycle week, n_p 7: five years, robust STL), one row
   per item per day.
Each compares count(*) over period_decomposition with count(*) over
period_totals on the same source and spec: the difference is the time the
decomposition itself takes (the target: under 1 s each on this machine).
Best of three, the queries taking turns, so load from other work falls on
both alike; processor time beside wall-clock time.
"""
import datetime
import random

from bench_seasons import best_of, connect  # the same connection and timing rules

ITEMS = 60


def main():
    rng = random.Random(2026)
    db = connect()
    first = datetime.date(2021, 1, 4)  # a Monday
    for table, days in (("weekly_source", 262 * 7), ("daily_source", 1826)):
        db.execute(f"CREATE TABLE {table}(ts TEXT, item TEXT, amount REAL)")
        rows = [((first + datetime.timedelta(day)).isoformat(), f"item {item:02d}",
                 round(rng.lognormvariate(4, 0.5), 2)) for day in range(days) for item in range(ITEMS)]
        db.executemany(f"INSERT INTO {table} VALUES (?, ?, ?)", rows)
    for table, spec, cycle in (("weekly_source", "week", "year"), ("daily_source", "day", "week")):
        periods = db.execute(f"SELECT count(*) / {ITEMS} FROM period_decomposition('{table}', '{spec}', '{cycle}')"
                             ).fetchone()[0]
        best = best_of(db, {
            "period_totals": f"SELECT count(*) FROM period_totals('{table}', '{spec}')",
            "period_decomposition": f"SELECT count(*) FROM period_decomposition('{table}', '{spec}', '{cycle}')",
        })
        (tw, tc), (dw, dc) = best["period_totals"], best["period_decomposition"]
        print(f"{ITEMS} items x {periods} {spec}s, cycle {cycle}:")
        print(f"  period_totals         wall {tw * 1e3:8.1f} ms   cpu {tc * 1e3:8.1f} ms")
        print(f"  period_decomposition  wall {dw * 1e3:8.1f} ms   cpu {dc * 1e3:8.1f} ms   "
              f"{dc / tc:5.2f}x period_totals")
        print(f"  the decomposition beyond the pass: cpu {(dc - tc) * 1e3:8.1f} ms "
              f"({(dc - tc) / ITEMS * 1e3:.2f} ms per item; target under 1 s)")


if __name__ == "__main__":
    main()
