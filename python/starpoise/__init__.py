"""starpoise: zero-age main-sequence stellar interiors by fitting-point shooting, with
swappable microphysics, from Python.

    >>> import starpoise
    >>> star = starpoise.zams(1.0, x=0.70, z=0.02)
    >>> star.luminosity_lsun, star.radius_rsun, star.teff_k
    >>> prof = star.profile(points=400)          # numpy arrays under the CSV column names
    >>> grid = starpoise.sequence([0.5, 1, 2], variants={"base": "", "hot": "opacity-factor:2"})

Functions: ``zams``, ``sequence``, ``compare``, ``polytrope``, ``probe``, ``limits`` (the
commands of the ``starpoise`` program, with the same names, values and law grammar), and
``Star.modes`` (``starpoise modes --mass``). Names carry their
units (``radius_cm``, ``luminosity_lsun``); every result has ``.units`` and ``.meta``.
Exceptions: ``InputError`` (a ValueError), ``ConvergenceError`` and ``ComputationError``
(RuntimeErrors), all ``StarpoiseError``.
"""

from ._errors import ComputationError, ConvergenceError, InputError, StarpoiseError
from ._native import (
    PROFILE_COLUMNS,
    SEQUENCE_COLUMNS,
    SUMMARY_FIELDS,
    Star,
    __version__,
    compare,
    limits,
    polytrope,
    probe,
    sequence,
    zams,
)
from ._table import ModesTable, Polytrope, Record, SequenceTable, Table

__all__ = [
    "PROFILE_COLUMNS",
    "SEQUENCE_COLUMNS",
    "SUMMARY_FIELDS",
    "ComputationError",
    "ConvergenceError",
    "InputError",
    "ModesTable",
    "Polytrope",
    "Record",
    "SequenceTable",
    "Star",
    "StarpoiseError",
    "Table",
    "__version__",
    "compare",
    "limits",
    "polytrope",
    "probe",
    "sequence",
    "zams",
]

# Shown as starpoise.InputError, starpoise.Table, ... in tracebacks and reprs.
for _cls in (StarpoiseError, InputError, ConvergenceError, ComputationError, Table,
             SequenceTable, ModesTable, Record, Polytrope):
    _cls.__module__ = __name__
del _cls
