# SPDX-License-Identifier: MIT
"""Every SQL example in README.md runs in the real sqlite3 shell and prints
exactly the text shown under it. The README is the user's contract, so a
change in behaviour must show up as a change in the README."""
import pathlib
import re

import pytest

from conftest import SOURCE, run_shell

README = (SOURCE / "README.md").read_text()
EXAMPLE = re.compile(r"```sql\n(.*?)```\n```text\n(.*?)```", re.S)
EXAMPLES = EXAMPLE.findall(README)


def test_every_sql_block_has_its_output():
    sql_blocks = README.count("```sql\n")
    assert sql_blocks == len(EXAMPLES), "each ```sql block must be followed by a ```text block"
    assert len(EXAMPLES) >= 14


@pytest.mark.parametrize("sql,expected", EXAMPLES, ids=[f"example{i+1}" for i in range(len(EXAMPLES))])
def test_readme_example(sql, expected):
    # oracle: the README text itself, as a user reads it.
    assert run_shell(sql) == expected
