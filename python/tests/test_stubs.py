"""The type stubs agree with the module, and help() reads well."""

from __future__ import annotations

import ast
import inspect
import pydoc
from pathlib import Path

import pytest
import starpoise

STUB = Path(starpoise.__file__).parent / "_native.pyi"


def _stub():
    return ast.parse(STUB.read_text())


def _functions():
    return {n.name: n for n in _stub().body if isinstance(n, ast.FunctionDef)}


@pytest.mark.parametrize("name", ["zams", "sequence", "compare", "polytrope", "probe"])
def test_stub_signature_is_the_modules(name):
    stub = _functions()[name]
    actual = inspect.signature(getattr(starpoise, name))
    args = stub.args
    positional = [a.arg for a in args.args]
    keyword = [a.arg for a in args.kwonlyargs]
    assert [p.name for p in actual.parameters.values()] == positional + keyword
    kinds = {p.name: p.kind for p in actual.parameters.values()}
    assert all(kinds[a] == inspect.Parameter.POSITIONAL_OR_KEYWORD for a in positional)
    assert all(kinds[a] == inspect.Parameter.KEYWORD_ONLY for a in keyword)
    defaults = dict(zip(positional[len(positional) - len(args.defaults):], args.defaults))
    defaults.update({a.arg: d for a, d in zip(args.kwonlyargs, args.kw_defaults) if d is not None})
    for pname, node in defaults.items():
        assert actual.parameters[pname].default == ast.literal_eval(node), pname
    for pname, p in actual.parameters.items():
        if p.default is inspect.Parameter.empty:
            assert pname not in defaults, pname


def test_stub_lists_every_attribute_of_a_star(sun_like):
    star_class = next(n for n in _stub().body if isinstance(n, ast.ClassDef) and n.name == "Star")
    annotated = [n.target.id for n in star_class.body if isinstance(n, ast.AnnAssign)]
    assert annotated == list(sun_like.summary())


def test_help_reads_well():
    text = pydoc.plain(pydoc.render_doc(starpoise.zams))
    assert "zams(mass, x=0.7, z=0.02, *, physics='refined'" in text
    for phrase in ("solar masses", "Parameters", "Returns", "InputError", "ConvergenceError",
                   "releases the GIL", "kramers:guillotine=1"):
        assert phrase in text, phrase
    assert "Ctrl-C" in pydoc.plain(pydoc.render_doc(starpoise.sequence))
    assert "profile CSV" in pydoc.plain(pydoc.render_doc(starpoise.Star.profile))
    assert starpoise.__doc__ and "zams" in starpoise.__doc__


def test_star_documents_every_summary_quantity_from_the_librarys_list():
    doc = starpoise.Star.__doc__
    for key, text, unit in starpoise.SUMMARY_FIELDS:
        assert f"{key} [{unit}]" in doc if unit else f"\n{key}\n" in doc, key
        assert text in doc, key
    profile = next(n for n in _stub().body if isinstance(n, ast.ClassDef) and n.name == "Star")
    stub_profile = next(n for n in profile.body
                        if isinstance(n, ast.FunctionDef) and n.name == "profile")
    default = ast.literal_eval(stub_profile.args.defaults[0])
    assert inspect.signature(starpoise.Star.profile).parameters["points"].default == default == 400
