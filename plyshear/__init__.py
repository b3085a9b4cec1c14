"""plyshear: the shear in every plane of a bolt or pin through a stack of plies.

The stable Python API::

    import plyshear
    joint = plyshear.load_model("models/x.toml")   # raises plyshear.ModelError
    sol = plyshear.solve(joint)                    # linear solution
    sol.to_dict()                                  # the JSON result
    res = plyshear.check(joint, sol)               # .to_dict() gives the "check" section
    cap = plyshear.capacity(sol)                   # every capacity answer (nominal, N)

Imports are lazy so that ``plyshear --help`` starts without loading scipy.
"""

from __future__ import annotations

import os as _os
import typing as _typing

__version__ = "0.1.0"

if _typing.TYPE_CHECKING:
    from plyshear.codes.check import CheckResult
    from plyshear.mechanics.capacity import CapacitySummary
    from plyshear.mechanics.results import Solution
    from plyshear.model.joint import Joint

__all__ = [
    "CapacityError",
    "Joint",
    "ModelError",
    "ResourceError",
    "SolveError",
    "__version__",
    "capacity",
    "check",
    "load_model",
    "solve",
]

_LAZY = {
    "Joint": ("plyshear.model.joint", "Joint"),
    "Bolt": ("plyshear.model.joint", "Bolt"),
    "Ply": ("plyshear.model.joint", "Ply"),
    "Member": ("plyshear.model.joint", "Member"),
    "ModelError": ("plyshear.errors", "ModelError"),
    "SolveError": ("plyshear.errors", "SolveError"),
    "CapacityError": ("plyshear.errors", "CapacityError"),
    "ResourceError": ("plyshear.errors", "ResourceError"),
}


def __getattr__(name: str) -> _typing.Any:
    if name in _LAZY:
        import importlib

        module, attr = _LAZY[name]
        return getattr(importlib.import_module(module), attr)
    raise AttributeError(f"module 'plyshear' has no attribute {name!r}")


def load_model(path: str | _os.PathLike[str]) -> Joint:
    """Read, validate and load-path-check a model file.

    Args:
        path: The TOML model file.

    Returns:
        The joint, in N, mm, MPa.

    Raises:
        ModelError: For bad input or a joint that is a mechanism.
    """
    from plyshear.mechanics.loadpath import require_load_path
    from plyshear.model import modelfile

    joint = modelfile.load(path)
    require_load_path(joint)
    return joint


def solve(joint: Joint) -> Solution:
    """Solve the plane shears, bolt moments and ply bearings of ``joint``.

    Args:
        joint: The joint.

    Returns:
        The linear solution.

    Raises:
        ModelError: If the joint is a mechanism.
        SolveError: If the system cannot be solved.
        TypeError: If ``joint`` is not a :class:`Joint` (say, ``load_model``'s path).
    """
    from plyshear.mechanics.solve import solve as _solve

    _require_joint(joint, "solve")
    _notebook()
    return _solve(joint)


def check(
    joint_or_solution: Joint | Solution,
    solution: Solution | None = None,
    standard: str | None = None,
    method: str | None = None,
) -> CheckResult:
    """Check a solved joint against a design standard.

    ``plyshear.check(sol)`` and ``plyshear.check(joint, sol)`` are the same check:
    the solution carries its joint.

    Args:
        joint_or_solution: The solution, or the joint followed by its solution.
        solution: The solution, when the first argument is the joint.
        standard: ``"aisc360-22"`` or ``"en1993-1-8"`` (default: the model's).
        method: ``"lrfd"`` or ``"asd"`` for AISC (default: the model's).

    Returns:
        The check result; ``.to_dict()`` gives the JSON ``check`` section.

    Raises:
        ValueError: If no solution is given, or the solution is of another joint (one
            that differs in more than its ``[check]`` settings).
    """
    import dataclasses

    from plyshear.codes.check import check as _check
    from plyshear.mechanics.results import Solution

    if isinstance(joint_or_solution, Solution):
        if solution is not None:
            raise ValueError("give the solution once: check(sol) or check(joint, sol)")
        _notebook()
        return _check(joint_or_solution, standard, method)
    if solution is None:
        raise ValueError("check needs the solution: check(sol) or check(joint, sol)")
    joint = joint_or_solution
    if joint is not solution.joint:
        # the [check] settings do not enter the solve: a joint that differs only there
        # is checked on this solution with its own settings
        if dataclasses.replace(joint, check=solution.joint.check) != solution.joint:
            raise ValueError("the solution is of another joint: solve this joint first")
        solution = dataclasses.replace(solution, joint=joint)
    _notebook()
    return _check(solution, standard, method)


def capacity(joint_or_solution: Joint | Solution) -> CapacitySummary:
    """Every capacity answer of a joint: elastic, nonlinear, collapse and shear-only.

    Args:
        joint_or_solution: The joint, or its linear solution (which carries the
            joint and is not solved again).

    Returns:
        The summary: ``.elastic``, ``.nonlinear`` (with ``.analysis.events``),
        ``.collapse`` (with ``.mechanism``), ``.plastic`` (the shear-only
        bound), ``.strengths``; nominal loads in N.

    Raises:
        plyshear.mechanics.capacity.CapacityError: If an analysis fails.
        TypeError: If the argument is neither a joint nor a solution.
    """
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.mechanics.capacity import summarize
    from plyshear.mechanics.results import Solution

    if isinstance(joint_or_solution, Solution):
        joint = joint_or_solution.joint
    else:
        joint = _require_joint(joint_or_solution, "capacity")
    _notebook()
    return summarize(joint_or_solution, nominal_bearing(joint))


def _require_joint(value: object, verb: str) -> Joint:
    """``value`` if it is a joint; else a TypeError that says what to pass."""
    from plyshear.model.joint import Joint

    if not isinstance(value, Joint):
        raise TypeError(
            f"plyshear.{verb} needs a Joint (from plyshear.load_model(path)), "
            f"not {type(value).__name__}"
        )
    return value


def _notebook() -> None:
    """Give the results ``_repr_html_`` and ``to_frame()`` (cheap: nothing heavy is loaded)."""
    import plyshear.report.notebook  # noqa: F401


# Keep the namespace to the API: the future import's name is not part of it.
del annotations
