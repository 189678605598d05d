"""Shared helpers: the command-line program (the reference every value is checked against)
and value comparison.

The program is target/release/starpoise of this repository (in CARGO_TARGET_DIR if that is
set; scripts/test builds it before running pytest), or the path in the environment variable
STARPOISE_BIN.
"""

from __future__ import annotations

import json
import math
import os
import re
import subprocess
from pathlib import Path
from typing import Any

import pytest

REPO = Path(__file__).resolve().parents[2]

# A number as the README prints it (the README tests compare numbers apart from the text).
README_NUMBER = re.compile(r"[-+]?(?:\d+\.\d*|\.\d+|\d+)(?:[eE][-+]?\d+)?")

# The module and the program call the same library function on the same machine, so their
# numbers should agree to the last bit; 1e-12 (relative) is the agreement the module promises,
# leaving room only for a different order of floating-point operations.
SAME_NUMBER_REL = 1e-12


def program() -> Path:
    # Cargo's target folder: CARGO_TARGET_DIR if set (relative to the repository), else target/.
    target = REPO / os.environ.get("CARGO_TARGET_DIR", "target")
    path = Path(os.environ.get("STARPOISE_BIN", target / "release" / "starpoise"))
    if not path.exists():
        subprocess.run(
            ["cargo", "build", "--release", "--locked", "--bin", "starpoise"],
            cwd=REPO,
            check=True,
        )
    return path


def run_cli(*args: str, cwd: Path | None = None) -> subprocess.CompletedProcess[str]:
    """Run the program with `args`; returns the completed process (not checked)."""
    return subprocess.run(
        [str(program()), *args],
        cwd=cwd or REPO,
        capture_output=True,
        text=True,
        timeout=600,
    )


def cli_json(*args: str) -> Any:
    """The JSON the program prints for `args` (which must include --format json), without its
    `meta` (the provenance, which records the command line)."""
    done = run_cli(*args)
    assert done.stdout, f"no output from {args}: {done.stderr}"
    value = json.loads(done.stdout)
    if isinstance(value, dict):
        value.pop("meta", None)
    return value


def cli_error(*args: str) -> str:
    """The message of a refused command line (exit code 2), without the 'starpoise: error: '
    prefix."""
    done = run_cli(*args)
    assert done.returncode == 2, (args, done.returncode, done.stderr)
    line = done.stderr.strip().splitlines()[-1]
    return line.removeprefix("starpoise: error: ")


def same(a: Any, b: Any, where: str = "") -> None:
    """Assert that two JSON-like values agree: numbers to SAME_NUMBER_REL, the rest exactly.
    None and NaN count as the same 'no value'."""
    if isinstance(a, dict) and isinstance(b, dict):
        assert set(a) == set(b), f"{where}: keys differ: {set(a) ^ set(b)}"
        for k in a:
            same(a[k], b[k], f"{where}.{k}")
    elif isinstance(a, (list, tuple)) and isinstance(b, (list, tuple)):
        assert len(a) == len(b), f"{where}: lengths {len(a)} and {len(b)}"
        for i, (x, y) in enumerate(zip(a, b)):
            same(x, y, f"{where}[{i}]")
    elif isinstance(a, bool) or isinstance(b, bool):
        assert a == b, f"{where}: {a!r} != {b!r}"
    elif _no_value(a) or _no_value(b):
        assert _no_value(a) and _no_value(b), f"{where}: {a!r} != {b!r}"
    elif isinstance(a, (int, float)) and isinstance(b, (int, float)):
        assert math.isclose(a, b, rel_tol=SAME_NUMBER_REL, abs_tol=0.0), f"{where}: {a!r} != {b!r}"
    else:
        assert a == b, f"{where}: {a!r} != {b!r}"


def _no_value(v: Any) -> bool:
    return v is None or (isinstance(v, float) and math.isnan(v))


@pytest.fixture(scope="session")
def sun_like():
    """The 1 M_sun refined model from Python (solved once for the session)."""
    import starpoise

    return starpoise.zams(1.0)
