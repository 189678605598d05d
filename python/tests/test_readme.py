"""The README's Python session ("From Python") runs and prints what the README shows.

Numbers are compared to 1e-6 relative: the README shows real output, which needs rewriting
when a result changes in its sixth significant digit, not when the last bits move (run the
statements and paste their output). Everything else must match exactly.
"""

from __future__ import annotations

import doctest
import math
import re

from conftest import README_NUMBER as NUMBER
from conftest import REPO
# Agreement the README's numbers are held to (see the module documentation).
README_REL = 1e-6


def _session() -> str:
    text = (REPO / "README.md").read_text()
    section = text[text.index("## From Python"):]
    match = re.search(r"```python\n(.*?)```", section, re.S)
    assert match, "no python block under 'From Python'"
    return match.group(1)


class _Numbers(doctest.OutputChecker):
    def check_output(self, want: str, got: str, optionflags: int) -> bool:
        if super().check_output(want, got, optionflags):
            return True
        # numpy pads the numbers of an array to one width, so the spaces around them change
        # with their digits: the text between numbers is compared without its spaces.
        if "".join(NUMBER.sub("#", want).split()) != "".join(NUMBER.sub("#", got).split()):
            return False
        pairs = zip(NUMBER.findall(want), NUMBER.findall(got))
        return all(math.isclose(float(a), float(b), rel_tol=README_REL, abs_tol=1e-300)
                   for a, b in pairs)


def test_the_readme_session_prints_what_the_readme_shows():
    test = doctest.DocTestParser().get_doctest(_session(), {}, "README", "README.md", 0)
    assert len(test.examples) >= 15
    runner = doctest.DocTestRunner(checker=_Numbers(), optionflags=doctest.ELLIPSIS)
    result = runner.run(test)
    assert result.failed == 0, f"{result.failed} README statements print something else"
