# SPDX-License-Identifier: MIT
"""No test, comment or page cites a file that is not in the repository: a
maintainer must be able to follow every source a check names. Sources are
written beside the assertion (tests/README.md, "Where an expected value comes
from"); a note of the team kept outside the repository is not one."""
import re

from test_spdx_headers import SOURCE, tracked_files

# Names of notes outside the repository that checks were once written from;
# spelt in two parts so that this file does not cite them itself.
OUTSIDE = re.compile(r"\b" + "CHECKS" + r"\.md\b|" + r"\.\./" + "shared/|/work/" + "shared/")


def test_no_file_cites_a_note_outside_the_repository():
    citing = []
    for path in tracked_files():
        try:
            text = path.read_text(encoding="utf-8")
        except (UnicodeDecodeError, OSError):
            continue  # binary files (fuzz inputs, images) cite nothing
        for number, line in enumerate(text.splitlines(), start=1):
            if OUTSIDE.search(line):
                citing.append(f"{path.relative_to(SOURCE)}:{number}: {line.strip()}")
    assert citing == [], "write the source itself beside the check instead:\n" + "\n".join(citing)
