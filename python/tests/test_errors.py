"""Every error type: InputError with the command line's message (the flag replaced by the
argument), ConvergenceError with the iteration history, ComputationError; no panic crosses
into Python."""

from __future__ import annotations

import re

import pytest
import starpoise
from conftest import REPO, cli_error, cli_json, run_cli, same

# (Python call, the command line, the flag in its message, the argument in Python's)
INPUT_ERRORS = [
    (lambda: starpoise.zams(0.01), ["zams", "--mass", "0.01"], "--mass", "mass"),
    (lambda: starpoise.zams(1, x=1.2), ["zams", "--mass", "1", "--x", "1.2"], "--x", "x"),
    (lambda: starpoise.zams(1, z=-0.1), ["zams", "--mass", "1", "--z", "-0.1"], "--z", "z"),
    (lambda: starpoise.zams(1, x=0.9, z=0.2), ["zams", "--mass", "1", "--x", "0.9", "--z", "0.2"],
     "--x + --z", "x + z"),
    (lambda: starpoise.zams(1, fit_mass=2), ["zams", "--mass", "1", "--fit-mass", "2"],
     "--fit-mass", "fit_mass"),
    (lambda: starpoise.zams(1, tolerance=1), ["zams", "--mass", "1", "--tolerance", "1"],
     "--tolerance", "tolerance"),
    (lambda: starpoise.zams(1, max_iterations=0), ["zams", "--mass", "1", "--max-iterations", "0"],
     "--max-iterations", "max_iterations"),
    (lambda: starpoise.zams(0.5, physics="analytic"),
     ["zams", "--mass", "0.5", "--physics", "analytic"], "--mass", "mass"),
    (lambda: starpoise.zams(1, physics="analytic", alpha=2),
     ["zams", "--mass", "1", "--physics", "analytic", "--alpha", "2"], "--alpha", "alpha"),
    (lambda: starpoise.zams(1, alpha=50), ["zams", "--mass", "1", "--alpha", "50"], "--alpha", "alpha"),
    (lambda: starpoise.zams(1, opacity_factor=0), ["zams", "--mass", "1", "--opacity-factor", "0"],
     "--opacity-factor", "opacity_factor"),
    (lambda: starpoise.zams(1, rates_factor=1e7), ["zams", "--mass", "1", "--rates-factor", "1e7"],
     "--rates-factor", "rates_factor"),
    (lambda: starpoise.zams(1, guess=(-1, 1e7, 1, 1)),
     ["zams", "--mass", "1", "--guess", "-1", "1e7", "1", "1"],
     "--guess PC", "guess central pressure (dyn/cm^2)"),
    (lambda: starpoise.zams(1).profile(points=5), ["zams", "--mass", "1", "--points", "5"],
     "--points", "points"),
    (lambda: starpoise.polytrope(7), ["polytrope", "--index", "7"], "--index", "n"),
    (lambda: starpoise.polytrope(3, mass=-1, radius=1),
     ["polytrope", "--index", "3", "--mass", "-1", "--radius", "1"], "--mass", "mass"),
    (lambda: starpoise.polytrope(3, points=1), ["polytrope", "--index", "3", "--points", "1"],
     "--points", "points"),
    (lambda: starpoise.sequence("1,1"), ["sequence", "--masses", "1,1"], "--masses", "masses"),
    (lambda: starpoise.sequence([1, 1]), ["sequence", "--masses", "1,1"], "--masses", "masses"),
    (lambda: starpoise.sequence(1, fit_ranges="2-1"),
     ["sequence", "--masses", "1", "--fit-ranges", "2-1"], "--fit-ranges", "fit_ranges"),
    (lambda: starpoise.sequence(1, variants={"x": "colour:red"}),
     ["sequence", "--masses", "1", "--variant", "x=colour:red"], "--variant", "variants"),
    # The next two end with an example in each interface's own grammar (flags or a dict).
    (lambda: starpoise.sequence(1, variants=["a=", "a=alpha:2"]),
     ["sequence", "--masses", "1", "--variant", "a=", "--variant", "a=alpha:2"],
     "--variant", "variants"),
    (lambda: starpoise.compare([1], {"a": ""}), ["compare", "--mass", "1", "--variant", "a="],
     "--variant", "variants"),
]
EXAMPLES_DIFFER = {"variants"}


@pytest.mark.parametrize("call,flags,flag,argument", INPUT_ERRORS,
                         ids=[" ".join(c[1]) for c in INPUT_ERRORS])
def test_input_error_has_the_command_lines_message(call, flags, flag, argument):
    expected = cli_error(*flags)
    with pytest.raises(starpoise.InputError) as caught:
        call()
    e = caught.value
    assert isinstance(e, ValueError) and isinstance(e, starpoise.StarpoiseError)
    expected = expected.replace(f"invalid {flag} =", f"invalid {argument} =", 1)
    if argument in EXAMPLES_DIFFER:
        assert str(e).split("e.g.")[0] == expected.split("e.g.")[0]
    else:
        assert str(e) == expected
    assert e.argument == argument
    assert str(e) == f"invalid {e.argument} = {e.value}: {e.allowed}"


@pytest.mark.parametrize("kind,text", [("opacity", "nonsense"), ("eos", "plasma"),
                                        ("rates", "power-law:nu=-50"), ("convection", "mlt:beta=2"),
                                        ("atmosphere", "hot"), ("physics", "exotic")])
def test_a_bad_law_is_refused_with_the_grammars_reason(kind, text):
    flag = "--preset" if kind == "physics" else f"--{kind}"
    done = run_cli("zams", "--mass", "1", flag, text)
    assert done.returncode == 2
    with pytest.raises(starpoise.InputError) as caught:
        starpoise.zams(1.0, **{kind: text})
    e = caught.value
    assert e.argument == kind and e.value == text
    # The command line's parser reports the same reason and allowed values.
    assert e.allowed in done.stderr.replace("\n", " ")


def test_an_unreadable_table_is_an_input_error():
    missing = REPO / "models" / "no-such-table.csv"
    expected = cli_error("zams", "--mass", "1", "--opacity", f"table:{missing}")
    with pytest.raises(starpoise.InputError) as caught:
        starpoise.zams(1.0, opacity=f"table:{missing}")
    assert str(caught.value) == expected
    assert str(missing) in str(caught.value)


def test_input_errors_of_python_only_arguments():
    with pytest.raises(starpoise.InputError, match=r"^invalid density_g_cm3 = -1: "):
        starpoise.probe(-1.0, 1e7)
    with pytest.raises(starpoise.InputError, match=r"^invalid temperature_k = 0: "):
        starpoise.probe(1.0, 0.0)
    with pytest.raises(starpoise.InputError, match=r"^invalid density_g_cm3/temperature_k = "):
        starpoise.probe(1e-30, 10.0)
    with pytest.raises(starpoise.InputError, match=r"^invalid threads = -2: "):
        starpoise.sequence(1.0, threads=-2)
    with pytest.raises(starpoise.InputError, match=r"^invalid max_iterations = -3: .*\[1, 500\]"):
        starpoise.zams(1.0, max_iterations=-3)
    with pytest.raises(starpoise.InputError, match=r"^invalid guess = \[1\.0, 2\.0\]: give four"):
        starpoise.zams(1.0, guess=[1.0, 2.0])
    with pytest.raises(starpoise.InputError, match=r"^invalid radius = \(missing\): mass needs radius"):
        starpoise.polytrope(3, mass=1)
    with pytest.raises(starpoise.InputError, match=r"^invalid masses = \[\]: the list is empty"):
        starpoise.sequence([])
    # A value of the wrong type is Python's own TypeError.
    with pytest.raises(TypeError):
        starpoise.zams("one")  # type: ignore[arg-type]


def test_convergence_error_carries_the_history_and_the_command_lines_summary():
    flags = ["--mass", "1", "--max-iterations", "1", "--guess", "1e16", "1e7", "2", "5"]
    done = run_cli("zams", *flags, "--format", "json")
    assert done.returncode == 3
    with pytest.raises(starpoise.ConvergenceError) as caught:
        starpoise.zams(1.0, max_iterations=1, guess=(1e16, 1e7, 2, 5))
    e = caught.value
    assert isinstance(e, RuntimeError) and isinstance(e, starpoise.StarpoiseError)
    # The message is the command line's last line; the summary its JSON.
    assert str(e) == done.stderr.strip().splitlines()[-1].removeprefix("starpoise: error: ")
    expected = cli_json("zams", *flags, "--format", "json")
    expected.pop("meta", None)
    summary = dict(e.summary)
    summary.pop("meta", None)
    same(summary, expected, "failure summary")
    assert e.status == expected["status"] == "iteration-limit"
    assert e.reason == expected["reason"]
    assert e.iterations == expected["iterations"] == len(e.history) == 1
    assert e.mass_msun == 1.0
    # The history the command line prints on stderr: iteration, mismatch, step.
    printed = re.findall(r"^\s+(\d+)\s+(\S+)\s+(\S+)$", done.stderr, re.M)
    assert [int(i) for i, _, _ in printed] == [h["iteration"] for h in e.history]
    for (_, mismatch, step), h in zip(printed, e.history):
        assert float(mismatch) == pytest.approx(h["mismatch"], rel=1e-4)
        assert float(step) == pytest.approx(h["step_length"], abs=1e-4)
    assert set(e.last_guesses) == {"central_pressure_dyn_cm2", "central_temperature_k",
                                   "radius_rsun", "luminosity_lsun"}
    printed_pc = re.search(r"P_c = (\S+) dyn/cm\^2", done.stderr)
    assert printed_pc is not None
    assert float(printed_pc.group(1)) == pytest.approx(
        e.last_guesses["central_pressure_dyn_cm2"], rel=1e-6
    )


def test_computation_errors_and_panics_stay_python_exceptions():
    with pytest.raises(starpoise.ComputationError, match="demo-law: a failure made for the test"):
        starpoise._native._check_boundary("physics")
    with pytest.raises(starpoise.ComputationError, match="internal error .* a panic made for"):
        starpoise._native._check_boundary("panic")
    assert issubclass(starpoise.ComputationError, RuntimeError)
    # The module still works after a caught panic.
    assert starpoise.zams(10.0, physics="analytic").converged
