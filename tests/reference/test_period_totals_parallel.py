# SPDX-License-Identifier: MIT
"""period_totals read on several threads: the same rows, bit for bit, as one thread,
and one thread wherever that equality cannot be proven.

ext/README.md "Period totals" (reading in parallel). Each table here is a file database whose rowids are
spread far apart (gaps everywhere, and not in time order), so a few thousand rows span
enough rowids to be split over eight threads: the split is by rowid, not by row count.
Expected rows: tests/reference/period_totals_oracle.py (plain dicts, math.fsum,
zoneinfo local days); "identical" compares the repr of every value (repr tells -0.0
from 0.0 and gives every bit of a REAL) and its type.
"""
import os
import random
import sqlite3
import subprocess
import sys
import threading
import time

import pytest

from conftest import connect
import period_oracle as oracle
from period_oracle import Spec
from period_totals_oracle import expected_rows, first_difference, same_rows, seeded_rows

dt = oracle.dt
LOW, HIGH = dt.datetime(2025, 3, 1), dt.datetime(2025, 12, 20)
# 8 threads x 50,000 rowids (README: the smallest share worth a thread) = 400,000.
ROWID_SPAN = 1_000_000


def exact(rows):
    return [tuple((type(v).__name__, repr(v)) for v in row) for row in rows]


def spread_table(db, rows, name="sales", schema="main", seed=1, without_rowid=False, columns=None):
    """The rows under random, far-apart rowids (inserted in a shuffled order)."""
    columns = columns or ("ts", "item", "qty", "amount", "segment")
    rng = random.Random(seed)
    rowids = rng.sample(range(-ROWID_SPAN // 2, ROWID_SPAN // 2), len(rows))
    index = {"ts": 0, "item": 1, "qty": 2, "amount": 3, "segment": 4}
    if without_rowid:
        db.execute(f"CREATE TABLE {schema}.{name}(id INTEGER PRIMARY KEY, {', '.join(columns)}) WITHOUT ROWID")
    else:
        db.execute(f"CREATE TABLE {schema}.{name}({', '.join(columns)})")
    db.executemany(f"INSERT INTO {schema}.{name}(rowid, {', '.join(columns)}) VALUES (?{', ?' * len(columns)})"
                   if not without_rowid else
                   f"INSERT INTO {schema}.{name}(id, {', '.join(columns)}) VALUES (?{', ?' * len(columns)})",
                   [(r,) + tuple(row[index[c]] for c in columns) for r, row in zip(rowids, rows)])


def file_db(path, rows, journal="delete", **table):
    db = connect(str(path))
    db.execute(f"PRAGMA journal_mode={journal}")
    spread_table(db, rows, **table)
    db.commit()
    return db


def read(db, threads, sql, parameters=()):
    db.execute("SELECT almanac_threads(?)", (threads,))
    rows = db.execute(sql, parameters).fetchall()
    used = db.execute("SELECT almanac_last_read_threads()").fetchone()[0]
    return rows, used


CASES = [
    ("week", Spec("week"), None),
    ("day", Spec("day"), "America/Denver"),
    ("half-month", Spec("half-month"), "Europe/Berlin"),
    ("hour", Spec("hour"), "America/Denver"),
]


@pytest.mark.parametrize("spec_text,spec,zone", CASES, ids=[f"{c[0]}|{c[2]}" for c in CASES])
def test_one_to_eight_threads_give_identical_rows(tmp_path, spec_text, spec, zone):
    low, high = (dt.datetime(2025, 10, 28), dt.datetime(2025, 11, 5)) if spec.sub_day else (LOW, HIGH)
    rows = seeded_rows(len(spec_text) * 7 + len(zone or ""), 4000, low, high)
    db = file_db(tmp_path / "shop.db", rows)
    sql = "SELECT * FROM period_totals('sales', ?, ?)" if zone else "SELECT * FROM period_totals('sales', ?)"
    parameters = (spec_text, zone) if zone else (spec_text,)
    one, used = read(db, 1, sql, parameters)
    assert used == 1
    clock = oracle.ZoneClock(zone) if zone else oracle.UtcClock()
    want = expected_rows(rows, spec, clock)  # oracle: period_totals_oracle (dicts, math.fsum, zoneinfo)
    assert same_rows(one, want), first_difference(one, want)
    for threads in range(2, 9):
        got, used = read(db, threads, sql, parameters)
        assert used == threads  # the read was split, not silently one thread
        assert exact(got) == exact(one), threads


def test_deleted_rows_and_an_attached_database_give_identical_rows(tmp_path):
    rows = seeded_rows(21, 5000, LOW, HIGH)
    shop = file_db(tmp_path / "shop 2.db", rows)
    # Gaps of every size: every third row, and a whole block of rowids.
    shop.execute("DELETE FROM sales WHERE rowid % 3 = 0 OR rowid BETWEEN -100000 AND 150000")
    shop.commit()
    kept = [tuple(r) for r in shop.execute("SELECT ts, item, qty, amount, segment FROM sales")]
    shop.close()
    db = connect(str(tmp_path / "main.db"))
    db.execute("ATTACH ? AS shop2", (str(tmp_path / "shop 2.db"),))
    sql = "SELECT * FROM period_totals('shop2.sales', 'week', 'America/Denver', '2025-04-01', '2025-11-15')"
    one, _ = read(db, 1, sql)
    clock = oracle.ZoneClock("America/Denver")
    want = expected_rows(kept, Spec("week"), clock, clock.first_instant(dt.datetime(2025, 4, 1)),
                         clock.first_instant(dt.datetime(2025, 11, 15)))  # oracle: period_totals_oracle
    assert same_rows(one, want), first_difference(one, want)
    for threads in (2, 3, 5, 8):
        got, used = read(db, threads, sql)
        assert used == threads and exact(got) == exact(one)


def test_rows_far_apart_in_magnitude_merge_to_the_same_bits(tmp_path):
    # Each thread's totals spill to the wide form at a different row; the merge is exact.
    rng = random.Random(4)
    values = [1e300, -1e300, 1e-300, 5e-324, 2.0**53 + 1, 0.1, -0.0, 3, 2**62]
    rows = [(f"2025-06-{1 + i % 28:02d} 12:00:00", f"item {i % 5}", 1, rng.choice(values), None)
            for i in range(3000)]
    db = file_db(tmp_path / "spread.db", rows, columns=("ts", "item", "qty", "amount"))
    one, _ = read(db, 1, "SELECT * FROM period_totals('sales', 'week')")
    want = expected_rows(rows, Spec("week"), has_segment=False)  # oracle: math.fsum per cell
    assert same_rows(one, want), first_difference(one, want)
    for threads in (2, 4, 7):
        got, used = read(db, threads, "SELECT * FROM period_totals('sales', 'week')")
        assert used == threads and exact(got) == exact(one)


def oracle_rows(rows):
    return expected_rows(rows, Spec("week"), has_segment=False)  # oracle: period_totals_oracle


FALLBACKS = ["view", "temp", "memory", "without rowid", "virtual", "small", "wal on main",
             "exclusive locking", "rowid names taken"]


@pytest.mark.parametrize("case", FALLBACKS)
def test_every_fallback_reads_on_one_thread_and_gives_the_right_answer(tmp_path, case):
    rows = seeded_rows(hash(case) % 1000, 1500, LOW, HIGH)
    rows = [(ts, item, qty, amount if amount is not None else 0, None) for ts, item, qty, amount, _ in rows]
    plain = ("ts", "item", "qty", "amount")
    source = "sales"
    if case == "memory":
        db = connect(":memory:")
        spread_table(db, rows, columns=plain)
    elif case == "temp":
        db = connect(str(tmp_path / "t.db"))
        spread_table(db, rows, schema="temp", columns=plain)
    else:
        db = file_db(tmp_path / "f.db", rows, journal="wal" if case == "wal on main" else "delete",
                     columns=plain, without_rowid=case == "without rowid",
                     name="raw" if case in ("view", "virtual") else "sales")
    if case == "view":
        db.execute("CREATE VIEW sales AS SELECT * FROM raw")
    elif case == "virtual":
        db.execute("CREATE VIRTUAL TABLE sales USING fts5(ts, item, qty, amount)")
        db.execute("INSERT INTO sales(rowid, ts, item, qty, amount) SELECT rowid, ts, item, qty, amount FROM raw")
        db.commit()
    elif case == "small":
        # 1,000 rows with rowids 1 to 1,000: far below 2 x 50,000 rowids
        db.execute("CREATE TABLE small AS SELECT * FROM sales ORDER BY rowid LIMIT 1000")
        db.commit()
        rows = [tuple(r) + (None,) for r in db.execute("SELECT ts, item, qty, amount FROM small")]
        source = "small"
    elif case == "exclusive locking":
        db.execute("PRAGMA locking_mode = exclusive")
    elif case == "rowid names taken":
        db.execute("CREATE TABLE named(rowid, _rowid_, oid, ts, item, qty, amount)")
        db.execute("INSERT INTO named SELECT 1, 2, 3, * FROM sales")
        db.commit()
        source = "named"
    got, used = read(db, 8, f"SELECT * FROM period_totals('{source}', 'week')")
    assert used == 1, case
    assert same_rows(got, oracle_rows(rows)), first_difference(got, oracle_rows(rows))


def test_uncommitted_rows_of_the_calling_connection_are_counted(tmp_path):
    rows = seeded_rows(31, 2000, LOW, HIGH)
    rows = [(ts, item, qty, amount, None) for ts, item, qty, amount, _ in rows]
    db = file_db(tmp_path / "u.db", rows, columns=("ts", "item", "qty", "amount"))
    db.isolation_level = None
    db.execute("BEGIN")
    extra = [("2025-07-04 10:00:00", "tea", 2, 9.75, None), ("2025-12-01 08:00:00", "new item", 1, 3.0, None)]
    db.executemany("INSERT INTO sales VALUES (?, ?, ?, ?)", [r[:4] for r in extra])
    got, used = read(db, 8, "SELECT * FROM period_totals('sales', 'week')")
    assert used == 1  # helpers could not see these rows
    assert same_rows(got, oracle_rows(rows + extra)), first_difference(got, oracle_rows(rows + extra))
    db.execute("ROLLBACK")
    got, used = read(db, 8, "SELECT * FROM period_totals('sales', 'week')")
    assert used == 8 and same_rows(got, oracle_rows(rows))


def test_a_wal_database_attached_and_not_yet_read_is_split(tmp_path):
    rows = seeded_rows(32, 2000, LOW, HIGH)
    file_db(tmp_path / "w.db", rows, journal="wal").close()
    db = connect(str(tmp_path / "main.db"))
    db.execute("ATTACH ? AS shop", (str(tmp_path / "w.db"),))
    got, used = read(db, 4, "SELECT * FROM period_totals('shop.sales', 'month')")
    assert used == 4  # README: the witness proved one snapshot
    want = expected_rows(rows, Spec("month"))  # oracle: period_totals_oracle
    assert same_rows(got, want), first_difference(got, want)


WRITER = r"""
import sqlite3, sys, time
db = sqlite3.connect(sys.argv[1], timeout=30, isolation_level=None)
first = db.execute("SELECT min(rowid) FROM sales").fetchone()[0]
last = db.execute("SELECT max(rowid) FROM sales").fetchone()[0]
n = 0
while True:
    n += 1
    db.execute("BEGIN IMMEDIATE")
    db.execute("UPDATE sales SET amount = amount + 1 WHERE rowid = ?", (first,))
    db.execute("INSERT INTO sales(rowid, ts, item, qty, amount) VALUES (?, '2025-06-01 10:00:00', 'w', 1, 1)",
               (last + n,))
    db.execute("COMMIT")
    time.sleep(0.001)
"""


@pytest.mark.parametrize("journal,attached", [("delete", False), ("wal", False), ("wal", True),
                                              ("truncate", True)])
def test_a_writer_committing_in_a_loop_never_splits_a_read_across_snapshots(tmp_path, journal, attached):
    """Each commit adds 1 to the first row's amount and appends a row of amount 1: in one
    snapshot, (amount - base amount) = 2 x (rows - base rows), always (arithmetic)."""
    rows = [(ts, item, qty, int(amount * 100) if amount is not None else 0, None)
            for ts, item, qty, amount, _ in seeded_rows(33, 3000, LOW, HIGH)]
    path = tmp_path / "busy.db"
    file_db(path, rows, journal=journal, columns=("ts", "item", "qty", "amount")).close()
    base_rows, base_amount = len(rows), sum(r[3] for r in rows)
    writer = subprocess.Popen([sys.executable, "-c", WRITER, str(path)])
    try:
        if attached:
            db = connect(str(tmp_path / "reader.db"))
            db.execute("ATTACH ? AS shop", (str(path),))
            source = "shop.sales"
        else:
            db = connect(str(path))
            source = "sales"
        db.execute("PRAGMA busy_timeout = 30000")
        db.execute("SELECT almanac_threads(4)")
        seen, split = set(), 0
        deadline = time.monotonic() + 4
        while time.monotonic() < deadline:
            sales, amount = db.execute(f"SELECT sum(sales), sum(amount) FROM period_totals('{source}', 'month')"
                                       " WHERE all_segments").fetchone()
            split += db.execute("SELECT almanac_last_read_threads()").fetchone()[0] > 1
            assert amount - base_amount == 2 * (sales - base_rows), (sales, amount)
            seen.add(sales)
        assert len(seen) > 1  # the writer did commit during the reads
        print(f"\n{journal} attached={attached}: {len(seen)} snapshots, {split} reads split")
    finally:
        writer.kill()
        writer.wait()


def os_threads():
    return len(os.listdir("/proc/self/task"))


@pytest.mark.parametrize("function, scan", [
    ("period_totals", "SELECT count(*) FROM period_totals('sales', 'hour', 'America/Denver')"),
    ("period_decomposition", "SELECT count(*) FROM period_decomposition('sales', 'day', 'week', 'America/Denver')"),
])
def test_sqlite3_interrupt_stops_a_parallel_read_and_leaves_no_thread(tmp_path, function, scan):
    db = connect(str(tmp_path / "big.db"))
    db.execute("CREATE TABLE sales(ts, item, qty, amount)")
    db.execute("""WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 600000)
                  INSERT INTO sales SELECT datetime(1735689600 + i * 37 % 31536000, 'unixepoch'),
                                           'item ' || (i % 40), 1, (i % 1000) / 100.0 FROM n""")
    db.commit()
    db.execute("SELECT almanac_threads(4)")
    before = os_threads()
    interrupted_in_read = 0
    for delay in (0.02, 0.05, 0.1, 0.2):
        timer = threading.Timer(delay, db.interrupt)
        timer.start()
        try:
            db.execute(scan).fetchall()
        except sqlite3.OperationalError as error:
            # SQLite's own code for it (sqlite3.h), whichever of the table function's read
            # or SQLite's own loop noticed the interrupt first.
            assert error.sqlite_errorname == "SQLITE_INTERRUPT", (str(error), error.sqlite_errorname)
            assert str(error) in (f"{function}(): interrupted", "interrupted")
            interrupted_in_read += str(error) == f"{function}(): interrupted"
        timer.join()
        assert os_threads() == before  # every helper joined
    assert interrupted_in_read > 0
    # The connection reads on afterwards, and in parallel.
    got, used = read(db, 4, "SELECT sum(sales) FROM period_totals('sales', 'month')")
    assert got == [(600000,)] and used == 4


def test_almanac_threads_sets_and_reports_the_number():
    db = connect()
    cores = min(os.cpu_count(), 16)  # ext/README.md: 0 is one per core, at most 16
    assert db.execute("SELECT almanac_threads()").fetchone() == (cores,)
    assert db.execute("SELECT almanac_threads(3), almanac_threads()").fetchone() == (3, 3)
    assert db.execute("SELECT almanac_threads(0)").fetchone() == (cores,)
    assert db.execute("SELECT almanac_threads(NULL), almanac_threads()").fetchone() == (None, cores)
    assert db.execute("SELECT almanac_last_read_threads()").fetchone() == (None,)
    other = connect()  # a setting of one connection only
    db.execute("SELECT almanac_threads(1)")
    assert other.execute("SELECT almanac_threads()").fetchone() == (cores,)
    for bad, shown in (("65", "65"), ("-1", "-1"), ("'four'", "'four'"), ("1.5", "1.5")):
        with pytest.raises(sqlite3.OperationalError) as raised:
            db.execute(f"SELECT almanac_threads({bad})")
        assert str(raised.value).startswith(f"almanac_threads(): argument 1 (n) = {shown}: ")


def test_period_decomposition_reads_the_same_way_on_every_thread_count(tmp_path):
    # ext/README.md: period_decomposition reads its source as period_totals does, in parallel too.
    rows = seeded_rows(41, 4000, dt.datetime(2023, 1, 2), dt.datetime(2025, 12, 29))
    db = file_db(tmp_path / "d.db", rows)
    sql = "SELECT * FROM period_decomposition('sales', 'week', 'year', 'America/Denver')"
    one, used = read(db, 1, sql)
    assert used == 1 and any(row[8] is not None for row in one)  # some items decomposed
    for threads in (2, 3, 6):
        got, used = read(db, threads, sql)
        assert used == threads and exact(got) == exact(one)
