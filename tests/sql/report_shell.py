# SPDX-License-Identifier: MIT
"""One report of sql/ run in the real sqlite3 shell with its parameters, for the report tests."""
import subprocess

from conftest import MODULE, SOURCE


def parameter_lines(params):
    lines = []
    for name, value in params.items():
        # TEXT in two kinds of quotes, so the shell never reads 2025-01-06 as arithmetic
        value = '"' + "'" + value.replace("'", "''") + "'" + '"' if isinstance(value, str) else value
        lines.append(f".parameter set @{name} {value}")
    return lines


def run_report(database, report, zone, **params):
    """The finished shell process of sql/<report>.sql on `database` in .mode quote, with -bail."""
    module = MODULE[:-3] if MODULE.endswith(".so") else MODULE
    lines = [f".load {module}", ".mode quote", f".parameter set @zone {zone}"] + parameter_lines(params)
    script = "\n".join(lines) + "\n" + (SOURCE / "sql" / f"{report}.sql").read_text()
    return subprocess.run(["sqlite3", "-bail", str(database)], input=script, capture_output=True, text=True,
                          timeout=300)


def generate_export(path, start, end, scale):
    """A small export of the demo business written by demo/generate.py (seeded: the same rows every time)."""
    subprocess.run(["/usr/bin/python3", str(SOURCE / "demo" / "generate.py"), "--out", str(path), "--start", start,
                    "--end", end, "--scale", str(scale)], check=True, capture_output=True, timeout=300)
