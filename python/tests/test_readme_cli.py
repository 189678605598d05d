"""The README's command-line examples print what the README shows.

Every fenced block of README.md whose first line is `$ starpoise ...` is run (through bash, with
this repository's program first on PATH, in an empty folder) and its standard output compared
with the lines under the command. A line `...` in the README stands for any number of output
lines. Numbers are compared to 1e-6 relative, or 1e-12 absolute for numbers at rounding level
(the README shows real output, which needs rewriting when a result changes in its sixth
significant digit, not when the last bits move); the text between numbers must match exactly,
apart from runs of spaces (a column widens with its digits).
"""

from __future__ import annotations

import math
import os
import subprocess

import pytest

from conftest import README_NUMBER as NUMBER
from conftest import REPO, program

README_REL = 1e-6
README_ABS = 1e-12


def _blocks() -> list[tuple[int, str, list[str]]]:
    """(line number, command, expected output lines) of every `$ starpoise` block."""
    lines = (REPO / "README.md").read_text().splitlines()
    out = []
    i = 0
    while i < len(lines):
        if lines[i].startswith("```") and i + 1 < len(lines) and lines[i + 1].startswith("$ starpoise"):
            command = lines[i + 1][2:]
            j = i + 2
            body = []
            while not lines[j].startswith("```"):
                body.append(lines[j])
                j += 1
            out.append((i + 2, command, body))
            i = j
        i += 1
    return out


def _same_line(want: str, got: str) -> bool:
    if "".join(NUMBER.sub("#", want).split()) != "".join(NUMBER.sub("#", got).split()):
        return False
    return all(
        math.isclose(float(a), float(b), rel_tol=README_REL, abs_tol=README_ABS)
        for a, b in zip(NUMBER.findall(want), NUMBER.findall(got))
    )


def _matches(want: list[str], got: list[str]) -> str | None:
    """None if `got` is `want` with each `...` standing for any lines; else the first miss."""
    want = list(want)
    while want and not want[-1].strip():
        want.pop()
    while got and not got[-1].strip():
        got.pop()

    def match(wi: int, gi: int) -> str | None:
        while wi < len(want):
            if want[wi].strip() == "...":
                if wi + 1 == len(want):
                    return None
                for k in range(gi, len(got) + 1):
                    if match(wi + 1, k) is None:
                        return None
                return f"nothing after line {gi} matches README line {want[wi + 1]!r}"
            if gi >= len(got):
                return f"output ends before README line {want[wi]!r}"
            if not _same_line(want[wi], got[gi]):
                return f"README {want[wi]!r}\n   got {got[gi]!r}"
            wi += 1
            gi += 1
        return None if gi == len(got) else f"output has more lines from {got[gi]!r}"

    return match(0, 0)


BLOCKS = _blocks()


def test_the_readme_has_command_blocks():
    assert len(BLOCKS) >= 8, [c for _, c, _ in BLOCKS]


@pytest.mark.parametrize("line,command,expected", BLOCKS, ids=[c[10:50] for _, c, _ in BLOCKS])
def test_readme_command_prints_what_the_readme_shows(tmp_path, line, command, expected):
    env = dict(os.environ)
    env["PATH"] = f"{program().parent}{os.pathsep}{env.get('PATH', '')}"
    result = subprocess.run(
        ["bash", "-c", command], cwd=tmp_path, env=env, capture_output=True, text=True
    )
    got = result.stdout.splitlines()
    miss = _matches(expected, got)
    assert miss is None, f"README.md line {line}: `{command}`\n{miss}"
