# SPDX-License-Identifier: MIT
"""Every source file carries the licence's SPDX line, so a packager's
copyright check (and a reader) sees the licence of each file: first line, or
the second after a shebang, commented in the file's own syntax."""
import os
import subprocess
from pathlib import Path

SOURCE = Path(os.environ.get("ALMANAC_SOURCE", Path(__file__).resolve().parents[2]))
LINE = "SPDX-License-Identifier: MIT"

# The comment syntax of each kind of source file (SPDX spec, "Using SPDX
# short identifiers in source files": the identifier in a comment of the file's
# language).
BY_SUFFIX = {
    ".cpp": "// ", ".h": "// ", ".c": "// ", ".h.in": "// ",
    ".py": "# ", ".sh": "# ", ".cmake": "# ", ".cmake.in": "# ", ".pc.in": "# ",
    ".sql": "-- ",
}
BY_NAME = {"CMakeLists.txt": "# "}


def tracked_files():
    # A checkout: the files git tracks or would add (not ignored); a source
    # tarball: every file outside the build folders.
    if (SOURCE / ".git").exists():
        listed = subprocess.run(
            ["git", "-C", str(SOURCE), "ls-files", "--cached", "--others", "--exclude-standard"],
            check=True, capture_output=True, text=True).stdout.split("\n")
        return [SOURCE / name for name in listed if name and (SOURCE / name).is_file()]
    found = []
    for folder, subfolders, files in os.walk(SOURCE):
        subfolders[:] = [s for s in subfolders if not s.startswith(("build", "."))]
        found += [Path(folder) / f for f in files]
    return found


def comment_for(path):
    name = path.name
    if name in BY_NAME:
        return BY_NAME[name]
    for suffix in sorted(BY_SUFFIX, key=len, reverse=True):
        if name.endswith(suffix):
            return BY_SUFFIX[suffix]
    with open(path, "rb") as f:
        if f.read(2) == b"#!":
            return "# "  # a script without a suffix (.ci/run)
    return None


def without_line(paths, base):
    """(number of source files checked, the ones whose SPDX line is missing)."""
    checked, missing = 0, []
    for path in paths:
        comment = comment_for(path)
        if comment is None:
            continue  # prose, images, data: no comment syntax to carry it
        lines = path.read_text(encoding="utf-8", errors="replace").split("\n")
        first = 1 if lines and lines[0].startswith("#!") else 0
        checked += 1
        if len(lines) <= first or lines[first] != comment + LINE:
            missing.append(str(path.relative_to(base)))
    return checked, missing


def test_every_source_file_starts_with_its_spdx_line():
    checked, missing = without_line(tracked_files(), SOURCE)
    print(f"checked {checked} source files for '{LINE}'")
    assert checked > 100  # the tree has well over a hundred source files (common practice: ls)
    assert missing == [], "files without their SPDX line: " + ", ".join(missing)


def test_a_file_without_its_line_is_named(tmp_path):
    # The check can fail: of these, only the Python file lacks its line
    # (the SQL file uses the C++ comment, which is not SQL's).
    files = {
        "good.cpp": "// " + LINE + "\n#include <cstdio>\n",
        "script": "#!/bin/sh\n# " + LINE + "\necho\n",
        "bad.py": "import os\n",
        "wrong.sql": "// " + LINE + "\nSELECT 1;\n",
        "notes.md": "no comment syntax\n",
    }
    for name, text in files.items():
        (tmp_path / name).write_text(text)
    checked, missing = without_line(sorted(tmp_path.iterdir()), tmp_path)
    assert checked == 4
    assert missing == ["bad.py", "wrong.sql"]
