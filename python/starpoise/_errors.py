"""The exceptions of starpoise (raised by the compiled part, ``starpoise._native``)."""

from __future__ import annotations

from typing import Any


class StarpoiseError(Exception):
    """Base class of every exception starpoise raises."""


class InputError(StarpoiseError, ValueError):
    """A value given is not allowed.

    The message is the command line's, with the flag replaced by the Python argument:
    ``invalid mass = 0.01: the stellar mass must be between 0.05 and 150 solar masses, e.g. 1``.

    Attributes: ``argument`` (the argument's name, or a description such as
    ``guess radius (R_sun)``; None for an unreadable file), ``value`` (as text) and ``allowed``
    (what is allowed, with an example).
    """

    def __init__(
        self,
        message: str,
        argument: str | None = None,
        value: str | None = None,
        allowed: str | None = None,
    ) -> None:
        super().__init__(message)
        self.argument = argument
        self.value = value
        self.allowed = allowed


class ConvergenceError(StarpoiseError, RuntimeError):
    """A model's shooting iteration stopped without converging.

    Attributes:

    - ``mass_msun``: the star's mass, M_sun;
    - ``status``: a short code (``start-not-integrable``, ``stalled``, ``singular-jacobian``,
      ``jacobian-failed``, ``reevaluation-failed``, ``iteration-limit``);
    - ``reason``: the reason in words;
    - ``iterations``, ``mismatch`` (max-norm of the relative mismatch of r, P, T, L at the
      fitting mass), ``rhs_evaluations``;
    - ``history``: one dict per Newton iteration, ``{iteration, mismatch, step_length}``;
    - ``last_guesses``: ``{central_pressure_dyn_cm2, central_temperature_k, radius_rsun,
      luminosity_lsun}`` of the last accepted iterate;
    - ``summary`` (from ``starpoise.zams``): the JSON object ``starpoise zams --format json``
      prints for the failure, as a dict.
    """

    def __init__(
        self,
        message: str,
        mass_msun: float = float("nan"),
        status: str = "",
        reason: str = "",
        iterations: int = 0,
        mismatch: float = float("nan"),
        rhs_evaluations: int = 0,
        history: list[dict[str, Any]] | None = None,
        last_guesses: dict[str, float] | None = None,
    ) -> None:
        super().__init__(message)
        self.mass_msun = mass_msun
        self.status = status
        self.reason = reason
        self.iterations = iterations
        self.mismatch = mismatch
        self.rhs_evaluations = rhs_evaluations
        self.history = history if history is not None else []
        self.last_guesses = last_guesses if last_guesses is not None else {}
        self.summary: dict[str, Any] | None = None


class ComputationError(StarpoiseError, RuntimeError):
    """A law or an integration failed outside the shooting iteration (the message says where
    and why), or an internal error was caught at the boundary (please report it)."""
