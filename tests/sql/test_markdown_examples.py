# SPDX-License-Identifier: MIT
"""Every example in every Markdown page of the repository runs and prints
exactly the text shown under it. The pages are the user's contract, so a
change in behaviour must show up as a change in a page.

The pages are every *.md file git knows of (tracked, or new and not ignored),
so a new page cannot escape. An example is a fenced block followed directly by
a ```text block with its output:

- ```sql: SQL run in the real sqlite3 shell on an in-memory database, with
  almanac loaded, in the shell's default list mode.
- ```sqlite3: what a user types into `sqlite3 my_shop.db` started in the
  repository's folder: dot-commands and SQL. The blocks of one page are run in
  order against one database (a fresh file per page), so a table one block
  imports is there for the next; each block is its own shell session, so a
  block that needs the module loads it. What the shell writes to stderr
  (warnings, an error) is part of the output, before what it writes to stdout.
- ```sh: a shell command run by bash from the repository's folder. The demo
  database (demo/generate.py, seeded) is generated once for the run, and
  `demo/out/` in a command means the folder that holds it, so the demo results
  a page quotes are produced here, from the demo's own data, not typed in.

For ```sqlite3 and ```sh blocks, spaces at the end of a line are not compared:
the shell's column mode pads its last column, and editors strip such spaces.

A ```sql or ```sqlite3 block without its ```text block is an error, and so is
a ```sh block that holds a query (SELECT) but no output to check.
"""
import os
import pathlib
import re
import subprocess
import tempfile

import pytest

from conftest import MODULE, SOURCE, run_shell

FENCE = re.compile(r"^```([\w-]*)[^\n]*\n(.*?)^```[ \t]*$", re.S | re.M)
RUNNABLE = ("sql", "sqlite3", "sh")


def markdown_pages():
    listed = subprocess.run(["git", "-C", str(SOURCE), "ls-files", "--cached", "--others", "--exclude-standard",
                             "--", "*.md"], capture_output=True, text=True)
    if listed.returncode == 0:
        names = sorted(set(listed.stdout.split()))
    else:  # a copy without git: every page outside the build folders
        names = sorted(str(p.relative_to(SOURCE)) for p in SOURCE.rglob("*.md")
                       if not any(part.startswith(("build", ".")) for part in p.relative_to(SOURCE).parts))
    return [name for name in names if (SOURCE / name).is_file()]


def blocks(text):
    """(language, body, line, output or None) for each fenced block, in page order."""
    found = [(m.group(1), m.group(2), text.count("\n", 0, m.start()) + 1, m.start(), m.end())
             for m in FENCE.finditer(text)]
    result, skip = [], False
    for i, (language, body, line, start, end) in enumerate(found):
        if skip:
            skip = False
            continue
        output = None
        if language in RUNNABLE and i + 1 < len(found):
            next_language, next_body, _, next_start, _ = found[i + 1]
            if next_language == "text" and text[end:next_start].strip() == "":
                output, skip = next_body, True
        result.append((language, body, line, output))
    return result


PAGES = {name: blocks((SOURCE / name).read_text()) for name in markdown_pages()}


def examples(language):
    return [(name, line, body, output) for name, found in PAGES.items()
            for (lang, body, line, output) in found if lang == language and output is not None]


def without_trailing_spaces(text):
    return "\n".join(line.rstrip() for line in text.split("\n"))


def ids(cases):
    return [f"{name}:{line}" for name, line, _, _ in cases]


def test_the_pages_are_collected():
    assert "README.md" in PAGES and "ext/README.md" in PAGES and "sql/README.md" in PAGES
    # every page is read, also one that holds no example
    assert len(PAGES) == len(markdown_pages())


def test_every_example_has_its_output():
    missing = [f"{name}:{line} ```{lang}" for name, found in PAGES.items()
               for (lang, body, line, output) in found
               if output is None and (lang in ("sql", "sqlite3") or
                                      (lang == "sh" and re.search(r"\bSELECT\b", body, re.I)))]
    assert missing == [], "each of these blocks must be followed by a ```text block with its output"
    assert len(examples("sql")) >= 40


SQL_EXAMPLES = examples("sql")


@pytest.mark.parametrize("name,line,sql,expected", SQL_EXAMPLES, ids=ids(SQL_EXAMPLES))
def test_sql_example(name, line, sql, expected):
    # oracle: the page's text itself, as a user reads it.
    assert run_shell(sql) == expected


SESSION_PAGES = sorted({name for name, _, _, _ in examples("sqlite3")})


@pytest.mark.parametrize("name", SESSION_PAGES)
def test_shell_session_examples(name, tmp_path):
    database = tmp_path / "my_shop.db"
    for language, body, line, expected in PAGES[name]:
        if language != "sqlite3" or expected is None:
            continue
        result = subprocess.run(["sqlite3", str(database)], input=body, stdout=subprocess.PIPE,
                                stderr=subprocess.PIPE, text=True, cwd=SOURCE, timeout=600)
        # oracle: the page's text itself, as a user reads it.
        assert without_trailing_spaces(result.stderr + result.stdout) == without_trailing_spaces(expected), \
            f"{name}:{line}"


@pytest.fixture(scope="module")
def demo_folder():
    folder = pathlib.Path(tempfile.mkdtemp(prefix="almanac-demo-out-"))
    subprocess.run(["/usr/bin/python3", str(SOURCE / "demo" / "generate.py"), "--out", str(folder / "shop.db")],
                   check=True, capture_output=True, timeout=600)
    return folder


SH_EXAMPLES = examples("sh")


@pytest.mark.parametrize("name,line,script,expected", SH_EXAMPLES, ids=ids(SH_EXAMPLES))
def test_shell_command_example(name, line, script, expected, demo_folder):
    script = script.replace("demo/out/", f"{demo_folder}/")
    result = subprocess.run(["bash", "-e", "-o", "pipefail", "-c", script], capture_output=True, text=True,
                            cwd=SOURCE, timeout=900, env=dict(os.environ, LC_ALL="C.UTF-8"))
    assert result.returncode == 0, result.stderr
    # oracle: the page's text itself, as a user reads it.
    assert without_trailing_spaces(result.stdout) == without_trailing_spaces(expected)
