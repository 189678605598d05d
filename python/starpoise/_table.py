"""The containers that starpoise returns: ``Table`` (columns of numpy arrays) and ``Record``
(one set of named values), each with ``units`` and ``meta``."""

from __future__ import annotations

from collections.abc import Iterator, Mapping
from typing import Any

import numpy as np


def _needs(package: str, method: str) -> ImportError:
    return ImportError(
        f"{method}() needs {package}, which is not installed: pip install {package}"
    )


class _Named:
    """Attribute access to the entries of the dict that ``_entries`` names (column names or
    keys), and those names in ``dir()``."""

    _entries = ""

    def __getattr__(self, name: str) -> Any:
        if not name.startswith("_"):
            entries = self.__dict__.get(self._entries, {})
            if name in entries:
                return entries[name]
        raise AttributeError(f"{type(self).__name__!r} object has no attribute or entry {name!r}")

    def __dir__(self) -> list[str]:
        return sorted(set(super().__dir__()) | set(self.__dict__.get(self._entries, {})))


class Table(_Named):
    """Columns of equal length, each a numpy array under its name.

    The names are those of the command line's CSV files (``starpoise.PROFILE_COLUMNS``,
    ``starpoise.SEQUENCE_COLUMNS``), with the unit at the end of the name (``radius_cm``,
    ``luminosity_lsun``). ``table["temperature_k"]`` and ``table.temperature_k`` give a
    column; ``len(table)`` is the number of rows; iterating gives the column names.

    Attributes
    ----------
    units : dict
        The unit of every column in astropy's unit grammar (``"g / cm3"``, ``"solLum"``;
        ``""`` for a pure number or text).
    meta : dict
        What made the table: ``program``, ``version``, ``command`` (the Python call),
        ``constants`` (the sources of the physical constants) and, where they apply, the
        composition (``x``, ``y``, ``z``) and the laws (``physics``).
    """

    def __init__(
        self,
        columns: Mapping[str, Any],
        units: Mapping[str, str],
        meta: Mapping[str, Any],
    ) -> None:
        self._columns: dict[str, np.ndarray] = {
            name: np.asarray(values) for name, values in columns.items()
        }
        self.units: dict[str, str] = dict(units)
        self.meta: dict[str, Any] = dict(meta)

    @property
    def columns(self) -> list[str]:
        """The column names, in order."""
        return list(self._columns)

    _entries = "_columns"

    def __getitem__(self, name: str) -> np.ndarray:
        return self._columns[name]

    def __contains__(self, name: object) -> bool:
        return name in self._columns

    def __iter__(self) -> Iterator[str]:
        return iter(self._columns)

    def __len__(self) -> int:
        for values in self._columns.values():
            return len(values)
        return 0

    def keys(self) -> list[str]:
        """The column names (as ``columns``)."""
        return self.columns

    def items(self) -> list[tuple[str, np.ndarray]]:
        """(name, array) pairs, in order."""
        return list(self._columns.items())

    def row(self, index: int) -> dict[str, Any]:
        """Row ``index`` as a dict of Python values."""
        return {name: values[index].item() for name, values in self._columns.items()}

    def to_pandas(self) -> Any:
        """A ``pandas.DataFrame`` with the same columns; ``df.attrs["units"]`` and
        ``df.attrs["meta"]`` hold the units and the metadata."""
        try:
            import pandas as pd
        except ImportError as e:
            raise _needs("pandas", "to_pandas") from e
        frame = pd.DataFrame({name: values for name, values in self._columns.items()})
        frame.attrs["units"] = dict(self.units)
        frame.attrs["meta"] = dict(self.meta)
        return frame

    def to_astropy(self) -> Any:
        """An ``astropy.table.QTable``: every numeric column with a unit becomes a
        ``Quantity`` in that unit (solar units are astropy's IAU 2015 nominal ones, as here);
        the metadata is the table's ``meta``."""
        try:
            import astropy.units as u
            from astropy.table import QTable
        except ImportError as e:
            raise _needs("astropy", "to_astropy") from e
        table = QTable(meta=dict(self.meta))
        for name, values in self._columns.items():
            unit = self.units.get(name, "")
            if unit and values.dtype.kind in "fiu":
                table[name] = values.astype(float) * u.Unit(unit)
            else:
                table[name] = values
        return table

    def __repr__(self) -> str:
        shown = ", ".join(
            f"{name} [{self.units[name]}]" if self.units.get(name) else name
            for name in self._columns
        )
        return f"<{type(self).__name__}: {len(self)} rows; {shown}>"


class SequenceTable(Table):
    """The table of a grid of models (``starpoise.sequence``): one row per model.

    ``fits`` holds the piecewise power-law fits of L(M) and R(M) per variant and composition,
    as dicts ``{variant, x, z, ranges: [{from_msun, to_msun, models, luminosity_exponent,
    radius_exponent}, ...]}``.
    """

    def __init__(
        self,
        columns: Mapping[str, Any],
        units: Mapping[str, str],
        meta: Mapping[str, Any],
    ) -> None:
        super().__init__(columns, units, meta)
        self.fits: list[dict[str, Any]] = []


class ModesTable(Table):
    """The oscillation modes of a model (``Star.modes``): one row per mode.

    ``seismic`` holds the rest of ``starpoise modes --format json``: the large separation
    from the radial modes (``large_separation_uhz``, and dimensionless
    ``large_separation_radial``), the asymptotic one (``large_separation_asymptotic_uhz``), the
    small separation ``small_separation_d02_uhz``, the frequency they are measured around
    (``separations_around_uhz``), the asymptotic g-mode period spacing
    (``period_spacing_asymptotic_s``) and the solar-scaled relations of Kjeldsen & Bedding
    (1995) at the model's M, R, T_eff (``large_separation_scaling_uhz``,
    ``nu_max_scaling_uhz``); None where not defined.
    """

    #: Set by ``Star.modes`` on the table it returns.
    seismic: dict[str, Any]


class Record(_Named, Mapping[str, Any]):
    """One set of named values (``starpoise.probe``, ``starpoise.polytrope``): a read-only
    mapping whose keys are also attributes, named as the command line's JSON keys (units at
    the end of the name; see ``units``), with the metadata in ``meta``."""

    def __init__(
        self,
        values: Mapping[str, Any],
        units: Mapping[str, str],
        meta: Mapping[str, Any],
    ) -> None:
        self._values: dict[str, Any] = dict(values)
        self.units: dict[str, str] = dict(units)
        self.meta: dict[str, Any] = dict(meta)

    _entries = "_values"

    def __getitem__(self, key: str) -> Any:
        return self._values[key]

    def __iter__(self) -> Iterator[str]:
        return iter(self._values)

    def __len__(self) -> int:
        return len(self._values)

    def to_dict(self) -> dict[str, Any]:
        """The values as a new dict (the command line's JSON object)."""
        return dict(self._values)

    def __repr__(self) -> str:
        shown = ", ".join(
            f"{k}={v!r}" for k, v in self._values.items() if not isinstance(v, (dict, list))
        )
        return f"<Record {shown}>"


class Polytrope(Record):
    """A Lane–Emden polytrope (``starpoise.polytrope``): the values of
    ``starpoise polytrope --format json`` as a ``Record``, and its ``profile`` as a ``Table``."""

    def __init__(
        self,
        values: Mapping[str, Any],
        units: Mapping[str, str],
        meta: Mapping[str, Any],
        profile: Table,
    ) -> None:
        super().__init__(values, units, meta)
        self.profile = profile
