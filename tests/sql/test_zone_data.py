# SPDX-License-Identifier: MIT
"""Where zone data comes from: the OS's zoneinfo, or the data built into the
module (forced with ALMANAC_ZONE_DATA=built-in, as the README documents for
testing), and almanac_tz_version() naming the release and the source.

The built-in data must give the same answers as the OS data for every zone
tzdata lists, on a sample of instants 1900-2100; the OS answers are checked
against Python's zoneinfo on the same sample.
"""
import datetime as dt
import json
import os
import pathlib
import random
import subprocess
import sys
from zoneinfo import ZoneInfo

from conftest import MODULE

ZONEINFO = pathlib.Path("/usr/share/zoneinfo")
UTC = dt.timezone.utc


def tzdata_list():
    """Release and every zone and link name, from Debian tzdata's tzdata.zi
    (the tz project's own list: "# version", "Z name", "L target name")."""
    release, names = None, []
    for line in (ZONEINFO / "tzdata.zi").read_text().splitlines():
        if line.startswith("# version "):
            release = line.split()[2]
        elif line.startswith("Z "):
            names.append(line.split()[1])
        elif line.startswith("L "):
            names.append(line.split()[2])
    return release, sorted(names)


RELEASE, NAMES = tzdata_list()


def sample_instants():
    """Unix seconds: noon UTC on January 1 and July 1 of every year 1900-2100,
    and 200 seeded random instants in that range."""
    rng = random.Random(13)
    low = int(dt.datetime(1900, 1, 1, tzinfo=UTC).timestamp())
    high = int(dt.datetime(2100, 12, 31, tzinfo=UTC).timestamp())
    fixed = [int(dt.datetime(y, m, 1, 12, tzinfo=UTC).timestamp()) for y in range(1900, 2101) for m in (1, 7)]
    return fixed + [rng.randrange(low, high) for _ in range(200)]


INSTANTS = sample_instants()

# Runs in a fresh process, so the zone data is chosen under the given environment.
PROBE = r"""
import json, sqlite3, sys
module, names, instants = json.loads(sys.stdin.read())
db = sqlite3.connect(":memory:")
db.enable_load_extension(True)
db.load_extension(module)
db.execute("CREATE TEMP TABLE t(id INTEGER PRIMARY KEY, v TEXT)")
db.executemany("INSERT INTO t(v) VALUES (datetime(?, 'unixepoch'))", [(v,) for v in instants])
out = {"version": db.execute("SELECT almanac_tz_version()").fetchone()[0], "zones": {}}
for name in names:
    out["zones"][name] = [r[0] for r in db.execute(
        "SELECT period_floor(v, 'second', ?1) FROM t ORDER BY id", (name,))]
print(json.dumps(out))
"""


def probe(built_in, names=NAMES, instants=INSTANTS):
    env = dict(os.environ)
    env.pop("ALMANAC_ZONE_DATA", None)
    if built_in:
        env["ALMANAC_ZONE_DATA"] = "built-in"
    result = subprocess.run([sys.executable, "-c", PROBE], input=json.dumps([MODULE, names, instants]),
                            capture_output=True, text=True, env=env, timeout=900)
    assert result.returncode == 0, result.stderr[-2000:]
    return json.loads(result.stdout)


def parse_local(text):
    """'YYYY-MM-DD HH:MM:SS±HH:MM[:SS]' -> (wall datetime, offset seconds)."""
    wall = dt.datetime.fromisoformat(text[:19])
    sign = -1 if text[19] == "-" else 1
    parts = [int(p) for p in text[20:].split(":")]
    return wall, sign * (parts[0] * 3600 + parts[1] * 60 + (parts[2] if len(parts) > 2 else 0))


def test_tz_version_names_the_release_and_the_source():
    # source: the release line of Debian tzdata's tzdata.zi, which the module reads
    # (the OS data) and was built from (the built-in data, same machine)
    assert probe(False, [], [])["version"] == f"{RELEASE} (/usr/share/zoneinfo)"
    assert probe(True, [], [])["version"] == f"{RELEASE} (built in)"


def test_built_in_data_equals_the_os_data_for_every_zone_and_both_match_zoneinfo():
    system, built_in = probe(False), probe(True)
    compared = differ = 0
    mismatches = []
    for name in NAMES:
        zone = ZoneInfo(name)
        for t, here, there in zip(INSTANTS, system["zones"][name], built_in["zones"][name]):
            compared += 1
            if here != there:
                differ += 1
                mismatches.append(f"{name} {t}: OS {here}, built-in {there}")
            # oracle: zoneinfo's local reading and UTC offset of the same instant
            aware = dt.datetime.fromtimestamp(t, UTC).astimezone(zone)
            want = (aware.replace(tzinfo=None), int(aware.utcoffset().total_seconds()))
            if parse_local(here) != want:
                mismatches.append(f"{name} {t}: almanac {here}, zoneinfo {want}")
    print(f"\ncompared {compared} instants in {len(NAMES)} zones, tz {RELEASE}")
    assert len(NAMES) > 500  # tzdata lists about 600 names (common practice)
    assert not mismatches, f"{len(mismatches)} mismatches ({differ} OS/built-in):\n" + "\n".join(mismatches[:10])
