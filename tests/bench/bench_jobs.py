# SPDX-License-Identifier: MIT
"""Report jobs timed four ways, each way in its own process (tests/bench/run.sh runs this).

    /usr/bin/python3 tests/bench/bench_jobs.py [rows]

Ways: almanac with period_totals (where it applies), almanac with GROUP BY,
the plain SQLite SQL a user would write without almanac, and pandas end to
end (read the rows from the same database, compute). SQL ways run in the real
`sqlite3` shell; every process is measured by /usr/bin/time (wall seconds
including process start and writing the answer, peak resident memory).
Prints one table with each of the issue's targets marked met or NOT met, the
bare scan as the floor; at 10,000,000 rows and more also the almanac ways'
peak memory at 1,000,000 rows beside it; and the index-on-the-expression
recipe. Asserts nothing about time, but exits 1 when the ways' answers to a job
differ (same_answers.py: keys, counts, sums within stated rounding bounds).
Best of ALMANAC_BENCH_REPEAT runs (3 from 1,000,000 rows, else 1). Last, the
period_totals passes at 1, 2, 3, 4 and 8 threads (almanac_threads), with the
ratio of 2 threads to 1, peak memory, and a check that every thread count
gives bit-identical rows (exit 1 if not); `--threads` prints only that table.
"""
import datetime
import os
import pathlib
import shutil
import sqlite3
import subprocess
import sys
import tempfile

import same_answers

ROOT = pathlib.Path(__file__).resolve().parents[2]
MODULE = os.environ.get("ALMANAC_MODULE", str(ROOT / "build" / "almanac.so"))
ROWS = int(sys.argv[1]) if len(sys.argv) > 1 and not sys.argv[1].startswith("-") else 10_000_000
THREADS_ONLY = "--threads" in sys.argv  # only the table of thread counts (parallel_passes)
CACHE = pathlib.Path(os.environ.get("ALMANAC_BENCH_CACHE", ROOT / "build" / "bench"))
# Best of three at full size; the quick run CI makes (100,000 rows) runs once.
REPEAT = int(os.environ.get("ALMANAC_BENCH_REPEAT", "3" if ROWS >= 1_000_000 else "1"))
ITEMS = 60
START = "2021-01-01"  # five years of sales
SECONDS = 5 * 365 * 86400

# A deterministic scramble of the row number stands in for a seeded random
# generator, so SQLite itself writes 10,000,000 rows in seconds.
GENERATE = f"""
CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL);
WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < {{ROWS}}),
h(i, a, b) AS (SELECT i, (i * 2654435761 + 97) % 4294967291, (i * 40503 + 12345) % 1000003 FROM n)
INSERT INTO sales
SELECT datetime(unixepoch('{START}') + a % {SECONDS}, 'unixepoch'),
       printf('item %02d', b % {ITEMS}),
       1 + (a / 7) % 5,
       round(1 + ((a / 13) % 400000) / 100.0 + (b % {ITEMS}), 2)
FROM h;
"""

W_MONDAY = "date(ts, '-6 days', 'weekday 1')"  # the Monday on or before ts
HALF_MONTH = "strftime('%Y-%m-', ts) || CASE WHEN strftime('%d', ts) < '16' THEN '01' ELSE '16' END"

# Each job names the kinds of its output columns (same_answers.py compares
# them: key, count, sum, mean, median, slope); every way writes these columns.
JOBS = {
    "weekly means per item": {
        "columns": ("key", "key", "mean"),
        "period_totals": "SELECT item, period_start, amount / sales FROM period_totals('sales', 'week') WHERE sales > 0",
        "group by": "SELECT item, period_floor(ts, 'week') AS w, avg(amount) FROM sales GROUP BY item, w",
        "plain SQL": f"SELECT item, {W_MONDAY} AS w, avg(amount) FROM sales GROUP BY item, w",
        "pandas": """
df["w"] = df.ts.dt.to_period("W-SUN").dt.start_time
out = df.groupby(["item", "w"]).amount.mean().reset_index()""",
    },
    "half-month totals, empty periods filled": {
        "columns": ("key", "key", "count", "sum"),
        "period_totals": "SELECT item, period_start, sales, amount FROM period_totals('sales', 'half-month')",
        "group by": """
WITH t AS (SELECT item, period_floor(ts, 'half-month') AS p, count(*) AS n, exact_sum(amount) AS a
           FROM sales GROUP BY item, p),
span AS (SELECT min(p) AS lo, period_end(max(p), 'half-month') AS hi FROM t)
SELECT i.item, ps.period_start, coalesce(t.n, 0), coalesce(t.a, 0)
FROM (SELECT DISTINCT item FROM t) AS i CROSS JOIN span
JOIN periods(span.lo, span.hi, 'half-month') AS ps
LEFT JOIN t ON t.item = i.item AND t.p = ps.period_start ORDER BY i.item, ps.period_start""",
        "plain SQL": f"""
WITH RECURSIVE t AS (SELECT item, {HALF_MONTH} AS p, count(*) AS n, sum(amount) AS a
                     FROM sales GROUP BY item, p),
hm(d) AS (SELECT min(p) FROM t UNION ALL
          SELECT CASE WHEN substr(d, 9, 2) = '01' THEN substr(d, 1, 8) || '16'
                      ELSE date(d, 'start of month', '+1 month') END
          FROM hm WHERE d < (SELECT max(p) FROM t))
SELECT i.item, hm.d, coalesce(t.n, 0), coalesce(t.a, 0)
FROM (SELECT DISTINCT item FROM t) AS i CROSS JOIN hm
LEFT JOIN t ON t.item = i.item AND t.p = hm.d ORDER BY i.item, hm.d""",
        "pandas": """
month = df.ts.dt.to_period("M").dt.start_time
df["p"] = month + pd.to_timedelta((df.ts.dt.day >= 16) * 15, unit="D")
g = df.groupby(["item", "p"]).amount.agg(["count", "sum"])
months = pd.date_range(month.min(), month.max(), freq="MS")
halves = months.append(months + pd.Timedelta(days=15)).sort_values()
halves = halves[(halves >= g.index.get_level_values(1).min()) & (halves <= g.index.get_level_values(1).max())]
full = pd.MultiIndex.from_product([sorted(df.item.unique()), halves], names=["item", "p"])
out = g.reindex(full, fill_value=0).reset_index()""",
    },
    "weekly trend table per item": {
        "columns": ("key", "slope", "mean"),
        "period_totals": """
SELECT item, regr_slope(amount, serial), avg(amount) FROM period_totals('sales', 'week') GROUP BY item""",
        "group by": """
WITH RECURSIVE t AS (SELECT item, period_serial(ts, 'week') AS s, exact_sum(amount) AS a
                     FROM sales GROUP BY item, s),
w(s) AS (SELECT min(s) FROM t UNION ALL SELECT s + 1 FROM w WHERE s < (SELECT max(s) FROM t))
SELECT i.item, regr_slope(coalesce(t.a, 0), w.s), avg(coalesce(t.a, 0))
FROM (SELECT DISTINCT item FROM t) AS i CROSS JOIN w
LEFT JOIN t ON t.item = i.item AND t.s = w.s GROUP BY i.item""",
        "plain SQL": f"""
WITH RECURSIVE t AS (SELECT item, CAST((julianday({W_MONDAY}) - 2440591.5) / 7 AS INTEGER) AS s,
                            sum(amount) AS a FROM sales GROUP BY item, s),
w(s) AS (SELECT min(s) FROM t UNION ALL SELECT s + 1 FROM w WHERE s < (SELECT max(s) FROM t)),
f AS (SELECT i.item, w.s AS x, coalesce(t.a, 0) AS y
      FROM (SELECT DISTINCT item FROM t) AS i CROSS JOIN w LEFT JOIN t ON t.item = i.item AND t.s = w.s)
SELECT item, (count(*) * sum(x * y) - sum(x) * sum(y)) / (count(*) * sum(x * x) - sum(x) * sum(x)),
       avg(y) FROM f GROUP BY item""",
        "pandas": """
df["w"] = df.ts.dt.to_period("W-SUN")
weekly = df.groupby(["w", "item"]).amount.sum().unstack(fill_value=0)
weekly = weekly.reindex(pd.period_range(weekly.index.min(), weekly.index.max(), freq="W-SUN"), fill_value=0)
x = np.arange(len(weekly), dtype=float)
xc = x - x.mean()
out = pd.DataFrame({"slope": (xc[:, None] * (weekly.values - weekly.values.mean(axis=0))).sum(axis=0) / (xc * xc).sum(),
                    "mean": weekly.values.mean(axis=0)}, index=weekly.columns).reset_index()""",
    },
    "7-day moving mean + 31-day moving median per item over daily totals": {
        "columns": ("key", "key", "mean", "median"),
        "period_totals": """
SELECT item, period_start, moving_mean(amount) OVER w7, median(amount) OVER w31
FROM period_totals('sales', 'day')
WINDOW w7 AS (PARTITION BY item ORDER BY serial ROWS 6 PRECEDING),
       w31 AS (PARTITION BY item ORDER BY serial ROWS 30 PRECEDING)""",
        "group by": """
WITH t AS (SELECT item, period_floor(ts, 'day') AS d, exact_sum(amount) AS a FROM sales GROUP BY item, d),
span AS (SELECT min(d) AS lo, period_end(max(d), 'day') AS hi FROM t),
f AS (SELECT i.item, ps.period_start AS d, coalesce(t.a, 0) AS a
      FROM (SELECT DISTINCT item FROM t) AS i CROSS JOIN span JOIN periods(span.lo, span.hi, 'day') AS ps
      LEFT JOIN t ON t.item = i.item AND t.d = ps.period_start)
SELECT item, d, moving_mean(a) OVER w7, median(a) OVER w31 FROM f
WINDOW w7 AS (PARTITION BY item ORDER BY d ROWS 6 PRECEDING),
       w31 AS (PARTITION BY item ORDER BY d ROWS 30 PRECEDING)""",
        "plain SQL": None,  # SQLite has no median; see the note under the table
        "pandas": """
daily = df.groupby([df.ts.dt.floor("D"), "item"]).amount.sum().unstack(fill_value=0)
daily = daily.reindex(pd.date_range(daily.index.min(), daily.index.max(), freq="D"), fill_value=0)
out = pd.DataFrame({"mean": daily.rolling(7, min_periods=1).mean().unstack(),
                    "median": daily.rolling(31, min_periods=1).median().unstack()}).reset_index()""",
    },
    "daily totals in America/Denver": {
        "columns": ("key", "key", "count", "sum"),
        # Days with sales only, as GROUP BY gives them in the other ways.
        "period_totals": """
SELECT item, period_start, sales, amount FROM period_totals('sales', 'day', 'America/Denver') WHERE sales > 0""",
        "group by": """
SELECT item, period_floor(ts, 'day', 'America/Denver') AS d, count(*), exact_sum(amount)
FROM sales GROUP BY item, d""",
        # SQLite's 'localtime' follows the process's TZ, set for this way only.
        "plain SQL": "SELECT item, date(ts, 'localtime') AS d, count(*), sum(amount) FROM sales GROUP BY item, d",
        "pandas": """
local = df.ts.dt.tz_localize("UTC").dt.tz_convert("America/Denver")
out = df.groupby(["item", local.dt.date]).amount.agg(["count", "sum"]).reset_index()""",
    },
}
WAYS = ["period_totals", "group by", "plain SQL", "pandas"]
# The speed targets, as (times faster than plain SQL, than pandas): every
# job at least 2x and 3x; the jobs period_totals serves at least 5x and 8x.
EVERY_JOB = (2, 3)
PERIOD_TOTALS_JOBS = (5, 8)
for _job, _spec in JOBS.items():
    _spec["targets"] = (EVERY_JOB,) if "Denver" in _job else (PERIOD_TOTALS_JOBS, EVERY_JOB)
MEMORY_SHARE = 20  # every almanac run's peak memory at most 1/20 of pandas'
SMALL = 1_000_000  # the row count memory is compared at when ROWS >= 10,000,000
FLAT = 1.25  # "flat": 10x the rows may cost at most 25 % more peak memory

PANDAS_PRELUDE = """
import sqlite3, sys
import numpy as np
import pandas as pd
con = sqlite3.connect(sys.argv[1])
df = pd.read_sql_query("SELECT ts, item, qty, amount FROM sales", con)
df["ts"] = pd.to_datetime(df.ts, format="%Y-%m-%d %H:%M:%S")
"""
# Every way writes its answer (the SQL ways through the shell's quote mode), so
# each is timed with its own output; same_answers.py compares the files.
PANDAS_EPILOGUE = """
out.to_csv(sys.argv[2], index=False, header=False)
"""


def database(rows):
    CACHE.mkdir(parents=True, exist_ok=True)
    path = CACHE / f"sales-{rows}.db"
    if not path.exists():
        partial = path.with_suffix(".partial")
        partial.unlink(missing_ok=True)
        subprocess.run(["sqlite3", str(partial)], input=GENERATE.replace("{ROWS}", str(rows)),
                       text=True, check=True)
        partial.rename(path)
    return path


def measured(command, env=None, stdin=None):
    """(seconds, peak KiB) of one process, by GNU time."""
    result = subprocess.run(["/usr/bin/time", "-f", "%e %M"] + command, input=stdin, text=True,
                            capture_output=True, env=env)
    if result.returncode != 0:
        raise RuntimeError(f"{command[:2]} failed: {result.stderr[-2000:]}")
    seconds, kib = result.stderr.strip().splitlines()[-1].split()
    return float(seconds), int(kib)


def run_way(path, way, code, output=os.devnull):
    if way == "pandas":
        return measured(["/usr/bin/python3", "-c", PANDAS_PRELUDE + code + PANDAS_EPILOGUE,
                         str(path), output])
    env = dict(os.environ, TZ="America/Denver") if "localtime" in code else None
    script = f".load {MODULE[:-3]}\n.mode quote\n.output '{output}'\n{code.strip()};\n"
    return measured(["sqlite3", "-bail", str(path)], env=env, stdin=script)


def best(path, way, code, output=os.devnull, repeat=None):
    runs = [run_way(path, way, code, output) for _ in range(repeat or REPEAT)]
    return min(r[0] for r in runs), max(r[1] for r in runs)


def week_span(path):
    """(number of Monday weeks the table spans, the last one's number counted
    from 1970-01-05) for the slope tolerance of same_answers.py."""
    with sqlite3.connect(path) as con:
        lo, hi = con.execute("SELECT min(ts), max(ts) FROM sales").fetchone()
    monday = [datetime.date.fromisoformat(t[:10]) for t in (lo, hi)]
    monday = [d - datetime.timedelta(days=d.weekday()) for d in monday]
    return (monday[1] - monday[0]).days // 7 + 1, (monday[1] - datetime.date(1970, 1, 5)).days // 7


def targets(spec, got):
    """The issue's targets for one job, each marked met or NOT met with its number."""
    almanac = got["period_totals"][0]
    parts = []
    for i, way in enumerate(("plain SQL", "pandas")):
        if way not in got:
            parts.append(f"{way}: none to compare (no median)")
            continue
        ratio = got[way][0] / almanac
        goals = sorted({t[i] for t in spec["targets"]}, reverse=True)
        parts.append(f"{way} {ratio:.1f}x: " + ", ".join(
            f">={g}x {'met' if ratio >= g else 'NOT met'}" for g in goals))
    heaviest = max(got[w][1] for w in ("period_totals", "group by"))
    share = got["pandas"][1] / heaviest
    parts.append(f"memory 1/{share:.0f} of pandas: <=1/{MEMORY_SHARE} "
                 f"{'met' if share >= MEMORY_SHARE else 'NOT met'}")
    return "; ".join(parts)


def main():
    path = database(ROWS)
    if THREADS_ONLY:
        return 0 if parallel_passes(path) else 1
    weeks = week_span(path)
    outputs_dir = pathlib.Path(tempfile.mkdtemp(prefix="almanac-bench-"))
    scan = best(path, "plain SQL", "SELECT count(*), sum(amount) FROM sales")
    print(f"{ROWS:,} rows, {ITEMS} items, five years of TEXT UTC timestamps; "
          f"each way in its own process, best of {REPEAT}; seconds include process start "
          f"and writing the answer")
    print(f"bare scan (count(*), sum(amount)): {scan[0]:.2f} s, {scan[1] / 1024:.0f} MiB")
    print()
    header = f"| job | {' | '.join(WAYS)} | almanac vs plain SQL | almanac vs pandas | peak MiB (" + \
        ", ".join(WAYS) + ") | targets (almanac = period_totals) |"
    print(header)
    print("|" + "---|" * (header.count("|") - 1))
    timings, answers, checks = {}, {}, []
    for number, (job, spec) in enumerate(JOBS.items()):
        got, outputs = {}, []
        for way in WAYS:
            if spec.get(way) is None:
                continue
            answer = outputs_dir / f"job{number}-{way.replace(' ', '-')}.csv"
            got[way] = best(path, way, spec[way], str(answer))
            quote = '"' if way == "pandas" else "'"
            outputs.append((way, same_answers.read_rows(answer, quote, spec["columns"])))
        timings[job], answers[job] = got, dict(outputs)
        checks.append((job, *same_answers.compare(spec["columns"], outputs, ROWS, weeks)))
        almanac = got["period_totals"][0]
        cells = [f"{got[w][0]:.2f} s" if w in got else "(no median)" for w in WAYS]
        ratios = [f"{got[w][0] / almanac:.1f}x" if w in got else "n/a" for w in ("plain SQL", "pandas")]
        memory = ", ".join(f"{got[w][1] / 1024:.0f}" if w in got else "-" for w in WAYS)
        print(f"| {job} | {' | '.join(cells)} | {' | '.join(ratios)} | {memory} | "
              f"{targets(spec, got)} |", flush=True)
    print()
    print(f"same answers (tolerances in tests/bench/same_answers.py; {ROWS:,} rows, "
          f"{weeks[0]} weeks, the last number {weeks[1]} from 1970-01-05):")
    for job, lines, ok in checks:
        print(f"- {job}:")
        print("\n".join(lines))
    where_time_goes(path, scan)
    if ROWS >= 10 * SMALL:
        memory_flat(timings)
    checks.append(index_recipe(path, timings, answers, outputs_dir))
    shutil.rmtree(outputs_dir)
    identical = parallel_passes(path)
    sys.stdout.flush()
    return 0 if all(ok for _, _, ok in checks) and identical else 1


# What one period_totals pass does per row, added one part at a time to the
# bare scan, each in its own process: the measured reason behind its ratios.
PARTS = [
    ("bare scan + the week key", "SELECT count(*), sum(amount), count(period_floor(ts, 'week')) FROM sales"),
    ("bare scan + the week key + reading item", "SELECT count(*), sum(amount), count(period_floor(ts, 'week')), "
                        "count(item) FROM sales"),
    ("bare scan with exact_sum in place of sum", "SELECT count(*), exact_sum(amount) FROM sales"),
    ("period_totals('sales', 'week'), rows counted",
     "SELECT count(*) FROM period_totals('sales', 'week')"),
    ("period_totals('sales', 'day'), rows counted (the smoothing job's pass)",
     "SELECT count(*) FROM period_totals('sales', 'day')"),
]


def where_time_goes(path, scan):
    print()
    print(f"where period_totals' time goes (best of {REPEAT}, each its own process; "
          f"the bare scan took {scan[0]:.2f} s):")
    for name, code in PARTS:
        seconds = best(path, "group by", code)[0]
        print(f"- {name}: {seconds:.2f} s, {seconds - scan[0]:+.2f} s over the bare scan", flush=True)


def memory_flat(timings):
    """Peak memory of the almanac ways at 1,000,000 rows beside ROWS rows."""
    small = database(SMALL)
    print()
    print(f"| job | way | peak MiB at {SMALL:,} rows | at {ROWS:,} rows | ratio | "
          f"flat (at most {FLAT}x) |")
    print("|---|---|---|---|---|---|")
    for job, spec in JOBS.items():
        for way in ("period_totals", "group by"):
            low = best(small, way, spec[way], repeat=1)[1]
            high = timings[job][way][1]
            print(f"| {job} | {way} | {low / 1024:.1f} | {high / 1024:.1f} | {high / low:.2f} | "
                  f"{'met' if high <= FLAT * low else 'NOT met'} |", flush=True)


# Reading in parallel: the three passes the issue names, at 1, 2, 3, 4 and 8
# threads (almanac_threads(n)), each timed in its own process.
PASSES = {
    "weekly": JOBS["weekly means per item"]["period_totals"],
    "half-month": JOBS["half-month totals, empty periods filled"]["period_totals"],
    "daily Denver": JOBS["daily totals in America/Denver"]["period_totals"].strip(),
}
THREAD_COUNTS = (1, 2, 3, 4, 8)
TWO_THREAD_TARGET = 0.6  # 2 threads at most 0.6x the time of 1


def exact_rows(path, threads, sql):
    """Every value of the pass's rows, bit for bit (repr of a REAL is exact), read in
    this process with the module loaded; and how many threads the read used."""
    con = sqlite3.connect(path)
    con.enable_load_extension(True)
    con.load_extension(MODULE)
    con.execute("SELECT almanac_threads(?)", (threads,))
    rows = [tuple((type(v).__name__, repr(v)) for v in row) for row in con.execute(sql)]
    used = con.execute("SELECT almanac_last_read_threads()").fetchone()[0]
    con.close()
    return rows, used


def parallel_passes(path):
    """Prints the thread table (seconds, ratio to 1 thread, peak MiB, the targets) and
    returns whether every thread count gave bit-identical rows."""
    print()
    print(f"reading in parallel ({os.cpu_count()} cores; best of {REPEAT}, each its own process):")
    print("| pass | " + " | ".join(f"{n} thread{'s' if n > 1 else ''}" for n in THREAD_COUNTS) +
          " | 2 threads / 1 | peak MiB (" + ", ".join(map(str, THREAD_COUNTS)) + ") | targets |")
    print("|---|" + "---|" * (len(THREAD_COUNTS) + 3))
    identical = True
    for name, sql in PASSES.items():
        got = {n: best(path, "period_totals", f"SELECT almanac_threads({n});\n{sql}") for n in THREAD_COUNTS}
        ratio = got[2][0] / got[1][0]
        # One thread's cells: its peak beyond the bare process (a read of one row).
        base = best(path, "period_totals", "SELECT ts FROM sales LIMIT 1", repeat=1)[1]
        cells = max(got[1][1] - base, 1)
        memory_ok = all(got[n][1] <= got[1][1] + n * cells for n in THREAD_COUNTS)
        reference, _ = exact_rows(path, 1, sql)
        same, used = True, {}
        for n in THREAD_COUNTS[1:]:
            rows, used[n] = exact_rows(path, n, sql)
            same = same and rows == reference
        identical = identical and same
        print(f"| {name} | " + " | ".join(f"{got[n][0]:.2f} s" for n in THREAD_COUNTS) +
              f" | {ratio:.2f}x | " + ", ".join(f"{got[n][1] / 1024:.0f}" for n in THREAD_COUNTS) +
              f" | <= {TWO_THREAD_TARGET}x {'met' if ratio <= TWO_THREAD_TARGET else 'NOT met'}; "
              f"bit-identical for {', '.join(map(str, THREAD_COUNTS))}: {'met' if same else 'NOT met'} "
              f"(threads used {', '.join(str(used[n]) for n in THREAD_COUNTS[1:])}); "
              f"peak <= 1 thread's + n x its cells ({cells / 1024:.0f} MiB): "
              f"{'met' if memory_ok else 'NOT met'} |", flush=True)
    return identical


INDEX = "CREATE INDEX sales_item_week ON sales(item, period_floor(ts, 'week'), amount)"


def index_recipe(path, timings, answers, outputs_dir):
    """The weekly GROUP BY job again with an index on the expression (README
    "Performance"), beside its time in the table; its answer must not change."""
    job = "weekly means per item"
    weekly = JOBS[job]["group by"]
    without = timings[job]["group by"]
    answer = outputs_dir / "indexed.csv"
    build = run_way(path, "group by", INDEX)
    try:
        plan = subprocess.run(["sqlite3", str(path)],
                              input=f".load {MODULE[:-3]}\nEXPLAIN QUERY PLAN {weekly};\n",
                              text=True, capture_output=True).stdout.strip().splitlines()[-1]
        with_index = best(path, "group by", weekly, str(answer))
    finally:
        run_way(path, "group by", "DROP INDEX sales_item_week")
    print()
    print(f"index on the expression: {INDEX}: built in {build[0]:.2f} s; plan: {plan.strip()}")
    print(f"weekly means per item with GROUP BY: {without[0]:.2f} s without the index, "
          f"{with_index[0]:.2f} s with it ({without[0] / with_index[0]:.1f}x)")
    indexed = same_answers.read_rows(answer, "'", JOBS[job]["columns"])
    lines, ok = same_answers.compare(JOBS[job]["columns"], [("group by", answers[job]["group by"]),
                                                            ("group by with the index", indexed)], ROWS)
    print("\n".join(lines))
    return job + " with the index", lines, ok


if __name__ == "__main__":
    sys.exit(main())
