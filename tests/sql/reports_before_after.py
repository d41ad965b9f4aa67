#!/usr/bin/python3
# SPDX-License-Identifier: MIT
"""The report library before and after a change: same parameters, two builds, output compared byte for byte.

    reports_before_after.py capture DIR --module M --sql SQLDIR [--only demo|million]
    reports_before_after.py compare BEFORE_DIR AFTER_DIR
    reports_before_after.py time --module M --sql SQLDIR          (each report, 1,000,000 rows, @by_segment 1)
    reports_before_after.py build COMMIT OUTDIR                   (the module and sql/ of an older commit)

Runs every report of sql/ with the parameter sets of CASES below in the real
sqlite3 shell (`.mode quote`, -bail) on two databases, both made here and
cached in build/before_after/: the demo database (demo/generate.py, default
seed, 405,365 rows) and a seeded table of 1,000,000 rows of 60 items over five
years in four shops (a few rows with a NULL segment), written by SQLite itself.
`capture` writes one file per case (stdout, then stderr and the exit status);
`compare` lists the cases whose bytes differ, and fails on every difference
that INTENDED does not name, with the reason it gives. The lines a report adds
to say which range it used (data_range's notes: 'range ...', 'left out: ...')
are compared apart:
before the change there were none.

Not a ctest: building the module of an older commit takes minutes and the
1,000,000-row runs about ten more, past what tests/run.sh can spend on it.
Run it by hand around a change of sql/ (sql/README.md, "Before and after").
"""
import argparse
import pathlib
import resource
import shutil
import subprocess
import sys
import tempfile
import time

ROOT = pathlib.Path(__file__).resolve().parents[2]
CACHE = ROOT / "build" / "before_after"

MILLION = """
CREATE TABLE sales(ts TEXT, item TEXT, qty INTEGER, amount REAL, segment TEXT);
WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 1000000),
h(i, a, b) AS (SELECT i, (i * 2654435761 + 97) % 4294967291, (i * 40503 + 12345) % 1000003 FROM n)
INSERT INTO sales
SELECT datetime(unixepoch('2021-01-01') + a % (5 * 365 * 86400), 'unixepoch'),
       printf('item %02d', b % 60),
       1 + (a / 7) % 5,
       round(1 + ((a / 13) % 400000) / 100.0 + (b % 60), 2),
       CASE WHEN b % 997 = 0 THEN NULL ELSE 'shop ' || char(65 + (a / 11) % 4) END
FROM h;
"""

DEMO_ITEM = "Pumpkin loaf"
MILLION_ITEM = "item 07"


def cases(item, zone, mid_start, mid_stop):
    """(report, parameters) pairs; zone is the database's calendar."""
    z = {"zone": zone}
    return [
        ("totals", z),
        ("totals", {**z, "unit": "month"}),
        ("totals", {**z, "unit": "half-month", "by_segment": 1}),
        ("totals", {**z, "unit": "quarter starting october", "item": "*"}),
        ("totals", {**z, "by_segment": 1, "last": 4}),
        ("totals", {**z, "item": item, "unit": "month"}),
        ("totals", {**z, "unit": "day", "last": 10, "item": "*"}),
        ("totals", {**z, "unit": "month", "start": mid_start, "stop": mid_stop}),
        ("totals", {**z, "unit": "6 hours", "start": mid_start, "stop": mid_start[:8] + "08"}),
        ("compare", z),
        ("compare", {**z, "by_segment": 1}),
        ("compare", {**z, "unit": "month", "item": "*"}),
        ("compare", {**z, "against": "year", "item": item}),
        ("compare", {**z, "stop": mid_stop, "unit": "half-month"}),
        ("trend", z),
        ("trend", {**z, "by_segment": 1}),
        ("trend", {**z, "start": mid_start, "stop": mid_stop, "spark_weeks": 2}),
        ("noise_ranking", z),
        ("noise_ranking", {**z, "by_segment": 1}),
        ("noise_ranking", {**z, "start": mid_start, "stop": mid_stop}),
        ("weekday_profile", z),
        ("weekday_profile", {**z, "item": "*", "by_segment": 1}),
        ("weekday_profile", {**z, "item": item, "start": mid_start, "stop": mid_stop}),
        ("seasonal_profile", z),
        ("seasonal_profile", {**z, "by_segment": 1}),
        ("seasonal_profile", {**z, "item": item}),
        ("anomalies", z),
        ("anomalies", {**z, "item": item, "threshold": 5}),
        ("anomalies", {**z, "by_segment": 1, "start": mid_start}),
        ("period_bars", z),
        ("period_bars", {**z, "by_segment": 1}),
        ("period_bars", {**z, "unit": "month", "last": 6, "item": item}),
        ("daily_chart", z),
        ("daily_chart", {**z, "item": item, "marks": mid_start}),
        ("daily_chart", {**z, "by_segment": 1, "weeks": 0}),
        ("daily_chart", {**z, "top": 5, "stop": mid_stop}),
    ]


DATABASES = {
    "demo": cases(DEMO_ITEM, "America/Denver", "2024-03-04", "2025-03-03"),
    "million": cases(MILLION_ITEM, "UTC", "2023-01-02", "2024-01-01"),
}

# Case name -> why its output differs after the change of issue 17 (sql/README.md,
# "Before and after", lists each with its before and after).
MEAN = ("mean_per_week is the mean over the weeks counted in `weeks` (every whole week, 0 without sales), "
        "as in noise_ranking; before, the mean of the weeks of the year in which the item ever sold")
WHOLE = ("noise_ranking fits whole weeks only; before, a week cut by the start or end of the data "
         "(or of a segment: Lantern Square opens on a Tuesday) was fitted as a short week")
PARTIAL = ("period_bars draws a period only partly inside the data (the running last week or month) as its "
           "own series '<segment> (partial period)', so the legend has one entry more")
INTENDED = {
    "trend": MEAN,
    "trend__by_segment=1": MEAN,
    "noise_ranking": WHOLE,
    "noise_ranking__by_segment=1": WHOLE,
    "period_bars": PARTIAL,
    "period_bars__by_segment=1": PARTIAL,
    "period_bars__item=Pumpkin_loaf__last=6__unit=month": PARTIAL,
    "period_bars__item=item_07__last=6__unit=month": PARTIAL,
}


def case_name(report, params):
    parts = [report] + [f"{k}={v}" for k, v in sorted(params.items()) if k != "zone"]
    return "__".join(parts).replace("/", "_").replace(" ", "_").replace("'", "")


def database(name):
    CACHE.mkdir(parents=True, exist_ok=True)
    path = CACHE / f"{name}.db"
    if not path.exists():
        partial = path.with_suffix(".partial")
        partial.unlink(missing_ok=True)
        if name == "demo":
            subprocess.run(["/usr/bin/python3", str(ROOT / "demo" / "generate.py"), "--out", str(partial)],
                           check=True, capture_output=True)
        else:
            subprocess.run(["sqlite3", str(partial)], input=MILLION, text=True, check=True)
        partial.rename(path)
    return path


def parameter_lines(params):
    lines = []
    for name, value in params.items():
        if isinstance(value, str):
            value = '"' + "'" + value.replace("'", "''") + "'" + '"'   # TEXT, never arithmetic
        lines.append(f".parameter set @{name} {value}\n")
    return "".join(lines)


def run(module, sql_dir, db, report, params, mode="quote"):
    module = str(module)[:-3] if str(module).endswith(".so") else str(module)
    script = f".load {module}\n.mode {mode}\n" + parameter_lines(params) + (sql_dir / f"{report}.sql").read_text()
    return subprocess.run(["sqlite3", "-bail", str(db)], input=script.encode(), capture_output=True, timeout=900)


def capture(args):
    out = pathlib.Path(args.dir)
    for db_name, db_cases in DATABASES.items():
        if args.only and db_name != args.only:
            continue
        db = database(db_name)
        (out / db_name).mkdir(parents=True, exist_ok=True)
        for report, params in db_cases:
            name = case_name(report, params)
            started = time.monotonic()
            result = run(args.module, pathlib.Path(args.sql), db, report, params)
            (out / db_name / f"{name}.out").write_bytes(
                result.stdout + b"\n--stderr--\n" + result.stderr + f"\n--exit {result.returncode}--\n".encode())
            print(f"{db_name:8} {name:70} {time.monotonic() - started:6.2f} s  exit {result.returncode}", flush=True)


def is_range_line(line):
    """A line of the range note every report ends with (data_range's notes), in .mode quote."""
    return line.startswith((b"'range ", b"'left out: ")) or line.endswith(b"(sql/data_check.sql lists it)'") \
        or line.endswith(b"(sql/data_check.sql lists them)'")


def split_range_lines(data):
    kept, said = [], []
    for line in data.split(b"\n"):
        (said if is_range_line(line) else kept).append(line)
    return b"\n".join(kept), said


def compare(args):
    before, after = pathlib.Path(args.before), pathlib.Path(args.after)
    unexpected = 0
    same = 0
    for db_name, db_cases in DATABASES.items():
        for report, params in db_cases:
            name = case_name(report, params)
            a_path, b_path = before / db_name / f"{name}.out", after / db_name / f"{name}.out"
            if not a_path.exists() or not b_path.exists():
                continue
            old, _ = split_range_lines(a_path.read_bytes())
            new, said = split_range_lines(b_path.read_bytes())
            if old == new:
                same += 1
                continue
            reason = INTENDED.get(name)
            tag = "intended" if reason else "UNEXPECTED"
            unexpected += reason is None
            print(f"{tag:10} {db_name}/{name}" + (f": {reason}" if reason else ""))
            if reason is None:
                old_lines, new_lines = old.split(b"\n"), new.split(b"\n")
                for k, (x, y) in enumerate(zip(old_lines, new_lines)):
                    if x != y:
                        print(f"   line {k + 1}\n   before {x[:300]!r}\n   after  {y[:300]!r}")
                        break
                else:
                    print(f"   {len(old_lines)} lines before, {len(new_lines)} after")
    print(f"{same} cases byte for byte the same; {unexpected} unexpected differences")
    return 1 if unexpected else 0


def timings(args):
    """Wall seconds and CPU seconds (user + system of the shell process) of each report, best of
    --repeat: on a machine shared with other work the CPU time is the steadier of the two."""
    db = database("million")
    for report in ["totals", "compare", "trend", "noise_ranking", "weekday_profile", "seasonal_profile",
                   "anomalies", "period_bars", "daily_chart"]:
        best_wall = best_cpu = None
        for _ in range(args.repeat):
            before = resource.getrusage(resource.RUSAGE_CHILDREN)
            started = time.monotonic()
            result = run(args.module, pathlib.Path(args.sql), db, report, {"zone": "UTC", "by_segment": 1})
            wall = time.monotonic() - started
            after = resource.getrusage(resource.RUSAGE_CHILDREN)
            cpu = (after.ru_utime - before.ru_utime) + (after.ru_stime - before.ru_stime)
            if result.returncode != 0:
                sys.exit(f"{report}: {result.stderr.decode()}")
            best_wall = wall if best_wall is None else min(best_wall, wall)
            best_cpu = cpu if best_cpu is None else min(best_cpu, cpu)
        print(f"{report:18} wall {best_wall:6.2f} s   cpu {best_cpu:6.2f} s", flush=True)


def build(args):
    out = pathlib.Path(args.outdir).resolve()
    with tempfile.TemporaryDirectory() as work:
        tree = pathlib.Path(work) / "tree"
        subprocess.run(["git", "-C", str(ROOT), "worktree", "add", "--detach", str(tree), args.commit], check=True)
        try:
            subprocess.run(["cmake", "-S", str(tree), "-B", str(tree / "build"), "-DCMAKE_BUILD_TYPE=Release",
                            "-DCMAKE_CXX_COMPILER_LAUNCHER=ccache"], check=True, capture_output=True)
            subprocess.run(["cmake", "--build", str(tree / "build"), "-j2", "--target", "almanac"], check=True)
            out.mkdir(parents=True, exist_ok=True)
            shutil.copy(tree / "build" / "almanac.so", out / "almanac.so")
            shutil.copytree(tree / "sql", out / "sql", dirs_exist_ok=True)
        finally:
            subprocess.run(["git", "-C", str(ROOT), "worktree", "remove", "--force", str(tree)], check=True)


def main():
    parser = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    sub = parser.add_subparsers(dest="command", required=True)
    p = sub.add_parser("capture")
    p.add_argument("dir")
    p.add_argument("--module", required=True)
    p.add_argument("--sql", default=str(ROOT / "sql"))
    p.add_argument("--only", choices=list(DATABASES))
    p = sub.add_parser("compare")
    p.add_argument("before")
    p.add_argument("after")
    p = sub.add_parser("time")
    p.add_argument("--module", required=True)
    p.add_argument("--sql", default=str(ROOT / "sql"))
    p.add_argument("--repeat", type=int, default=1)
    p = sub.add_parser("build")
    p.add_argument("commit")
    p.add_argument("outdir")
    args = parser.parse_args()
    sys.exit({"capture": capture, "compare": compare, "time": timings, "build": build}[args.command](args) or 0)


if __name__ == "__main__":
    main()
