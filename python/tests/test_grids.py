"""starpoise.sequence and starpoise.compare against the command line's tables, the failed
rows of a grid, Ctrl-C, and the GIL released while models are solved."""

from __future__ import annotations

import _thread
import csv
import threading
import time

import numpy as np
import pytest
import starpoise
from conftest import cli_json, run_cli, same

VARIANTS = {"base": "", "hot": "opacity-factor:2"}


def _read_csv(path):
    with open(path, newline="") as f:
        rows = list(csv.DictReader(line for line in f if not line.startswith("#")))
    return rows


def _cell(text, column):
    """A CSV cell as the value the table holds."""
    if column.dtype.kind == "b":
        return text == "true"
    if column.dtype.kind in "iu":
        return int(text)
    if column.dtype.kind == "f":
        return float(text) if text else float("nan")
    return text


@pytest.fixture(scope="module")
def grid():
    return starpoise.sequence([0.5, 1, 2], z=[0.02], variants=VARIANTS, threads=2)


def test_sequence_equals_the_command_lines_csv(tmp_path, grid):
    out = tmp_path / "grid.csv"
    done = run_cli("sequence", "--masses", "0.5,1,2", "--z", "0.02", "--variant", "base=",
                   "--variant", "hot=opacity-factor:2", "--threads", "2", "--quiet",
                   "--out", str(out))
    assert done.returncode == 0, done.stderr
    rows = _read_csv(out)
    assert grid.columns == list(starpoise.SEQUENCE_COLUMNS) == list(rows[0])
    assert len(grid) == len(rows) == 6
    for name in grid.columns:
        column = grid[name]
        for i, row in enumerate(rows):
            same(column[i].item(), _cell(row[name], column), f"{name}[{i}]")


def test_sequence_column_types(grid):
    assert grid.converged.dtype == np.bool_ and grid.converged.all()
    assert grid.grid_index.dtype == np.int64
    assert grid.iterations.dtype == np.int64
    for key, _, _ in starpoise.SUMMARY_FIELDS:
        assert grid[key].dtype == np.float64, key
    assert grid.status.dtype.kind == "U" and set(grid.status) == {"converged"}
    assert list(grid.variant) == ["base"] * 3 + ["hot"] * 3
    assert grid.units["luminosity_lsun"] == "solLum" and grid.units["variant"] == ""


def test_sequence_fits_equal_the_command_lines_json(tmp_path, grid):
    out = tmp_path / "grid.json"
    done = run_cli("sequence", "--masses", "0.5,1,2", "--z", "0.02", "--variant", "base=",
                   "--variant", "hot=opacity-factor:2", "--quiet", "--out", str(out))
    assert done.returncode == 0, done.stderr
    import json

    expected = json.loads(out.read_text())
    same(grid.fits, expected["fits"], "fits")
    assert grid.meta["grid_fingerprint"] == expected["grid_fingerprint"]
    same(grid.meta["fit_ranges"], expected["fit_ranges"], "fit_ranges")
    assert grid.meta["variants"] == VARIANTS


def test_values_as_text_lists_or_numbers_give_the_same_grid(grid):
    again = starpoise.sequence("0.5,1,2", z=0.02, variants=["base=", "hot=opacity-factor:2"])
    for name in grid.columns:
        np.testing.assert_array_equal(again[name], grid[name], err_msg=name)
    ranged = starpoise.sequence("0.5:2:3:log", variants=VARIANTS, threads=1)
    np.testing.assert_allclose(ranged.mass_msun, [0.5, 1.0, 2.0, 0.5, 1.0, 2.0], rtol=1e-15)


def test_a_failed_model_keeps_its_row_with_nan_and_its_status(tmp_path):
    # A 0.05 M_sun star with X = 0.9, Z = 0.08: its photosphere from the built-in guess is
    # cooler than the refined laws' 1e3 K limit, so it cannot be started (the command line
    # reports the same row).
    table = starpoise.sequence([0.05], x=0.9, z=0.08)
    out = tmp_path / "failed.csv"
    done = run_cli("sequence", "--masses", "0.05", "--x", "0.9", "--z", "0.08", "--quiet",
                   "--out", str(out))
    assert done.returncode == 3, done.stderr
    row = _read_csv(out)[0]
    assert not table.converged[0]
    assert table.status[0] == row["status"] != "converged"
    assert table.reason[0] == row["reason"] != ""
    for key, _, _ in starpoise.SUMMARY_FIELDS:
        assert np.isnan(table[key][0]), key


def test_compare_equals_the_command_lines_json():
    table = starpoise.compare([1, 10], VARIANTS)
    expected = cli_json("compare", "--mass", "1,10", "--variant", "base=", "--variant",
                        "hot=opacity-factor:2", "--format", "json")
    records = expected["records"]
    assert table.columns == list(records[0])
    assert len(table) == len(records) == 4
    for i, record in enumerate(records):
        got = table.row(i)
        # Text columns hold "" where the JSON has null (no factor varied).
        got = {k: (None if v == "" and record[k] is None else v) for k, v in got.items()}
        same(got, record, f"record {i}")
    assert table.meta["reference"] == expected["reference"] == "base"
    assert table.meta["x"] == expected["x"] and table.meta["z"] == expected["z"]


def test_ctrl_c_stops_a_long_grid():
    # 900 refined models take several seconds on two cores; an interrupt after 0.2 s must
    # raise KeyboardInterrupt as soon as the models under way finish.
    timer = threading.Timer(0.2, _thread.interrupt_main)
    start = time.perf_counter()
    timer.start()
    try:
        with pytest.raises(KeyboardInterrupt):
            starpoise.sequence("0.1:100:300:log", z=[0.01, 0.02, 0.03], threads=2)
    finally:
        timer.cancel()
    elapsed = time.perf_counter() - start
    # The slowest single model of this range takes well under 2 s.
    assert elapsed < 2.5, elapsed


# Python hands the GIL to a waiting thread after its switch interval (5 ms by default); a
# thread that starts a call holding the GIL can let this one run that long at most.
SWITCH_MARGIN_S = 0.02


@pytest.mark.parametrize(
    "work",
    [
        pytest.param(lambda: starpoise.sequence("0.3:10:12", threads=1), id="sequence"),
        pytest.param(lambda: starpoise.zams(1.0).profile(points=50_000), id="zams-profile"),
    ],
)
def test_models_run_with_the_gil_released(work):
    # While the computation runs in another thread, this thread keeps running Python code.
    # Were the GIL held during the computation, this thread could not run from the moment
    # the other one entered it (within SWITCH_MARGIN_S of its start) until it returned.
    times = {}

    def run():
        times["start"] = time.perf_counter()
        work()
        times["end"] = time.perf_counter()

    worker = threading.Thread(target=run)
    stamps = []
    worker.start()
    while worker.is_alive():
        stamps.append(time.perf_counter())
    worker.join()
    start, end = times["start"] + SWITCH_MARGIN_S, times["end"]
    assert end - start > 0.05, "the computation is too short to tell"
    inside = sum(1 for t in stamps if start < t < end)
    assert inside > 1000, inside
