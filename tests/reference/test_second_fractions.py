# SPDX-License-Identifier: MIT
"""Fractions of a second, read by the time-value reader and by to_time's %f,
against SQLite's own strftime('%f', t) in the real sqlite3 shell.

Every fraction of 4, 5 and 6 digits next to a half millisecond (xxx5, xxx49,
xxx50, xxx51, xxx499, xxx500, xxx501 for every xxx) at several seconds of the
minute: the millisecond almanac keeps must be the one SQLite shows. Then the
two readers against each other on seeded fractions of 1 to 9 digits.
"""
import random

from conftest import run_shell

SECONDS = ["00", "07", "30", "58"]  # below 59: SQLite's %f stops at 59.999 rather than carry
TAILS = ["5", "49", "50", "51", "499", "500", "501"]
FORMAT = "%Y-%m-%d %H:%M:%S.%f"


def near_half_millisecond():
    for second in SECONDS:
        for ms in range(1000):
            for tail in TAILS:
                yield f"2026-01-01 00:00:{second}.{ms:03d}{tail}"


def almanac_and_sqlite(texts):
    """One row per text: SQLite's %f, then almanac's time-value reader and to_time's %f."""
    script = "".join(
        f"SELECT strftime('%f', '{t}'), period_shift('{t}', 0, 'second'), to_time('{t}', '{FORMAT}');\n"
        for t in texts)
    return [line.split("|") for line in run_shell(script).splitlines()]


def seconds_field(text):
    """SS.fff of YYYY-MM-DD HH:MM:SS[.fff], the form strftime('%f') writes (to_time leaves
    out a fraction of .000)."""
    return text[17:] if "." in text else text[17:] + ".000"


def test_both_readers_round_fractions_as_sqlite_strftime_does():
    texts = list(near_half_millisecond())
    rows = almanac_and_sqlite(texts)
    assert len(rows) == len(texts)
    for text, (sqlite_f, value_reader, format_reader) in zip(texts, rows):
        # oracle: SQLite 3's strftime('%f', t), run in the real sqlite3 shell
        assert seconds_field(value_reader) == sqlite_f, text
        assert seconds_field(format_reader) == sqlite_f, text
        assert value_reader[:17] == format_reader[:17] == text[:17], text
    print(f"{len(texts)} fractions compared with SQLite's strftime('%f')")


def test_the_two_readers_agree_on_fractions_of_one_to_nine_digits():
    rng = random.Random(18)
    texts = []
    for _ in range(20000):
        digits = "".join(rng.choice("0123456789") for _ in range(rng.randint(1, 9)))
        texts.append(f"2026-{rng.randint(1, 12):02d}-{rng.randint(1, 28):02d} "
                     f"{rng.randint(0, 23):02d}:{rng.randint(0, 59):02d}:{rng.randint(0, 59):02d}.{digits}")
    rows = almanac_and_sqlite(texts)
    # The time-value reader against to_time's %f: the same instant for every text.
    disagreements = [(t, a, b) for t, (_, a, b) in zip(texts, rows)
                     if a[:17] + seconds_field(a) != b[:17] + seconds_field(b)]
    assert not disagreements, disagreements[:5]
    # And both against SQLite, where SQLite does not stop at 59.999.
    for text, (sqlite_f, value_reader, _) in zip(texts, rows):
        if value_reader[14:16] == text[14:16]:  # no carry into the next minute
            assert seconds_field(value_reader) == sqlite_f, text  # oracle: SQLite strftime('%f')
    print(f"{len(texts)} fractions compared between the two readers")
