"""Optional packages (the ``pdf``, ``xlsx`` and ``pandas`` extras) and the error naming them."""

from __future__ import annotations

import importlib
from types import ModuleType


class MissingExtraError(ImportError):
    """An optional package is not installed; the message names the extra that brings it."""


def require(module: str, extra: str) -> ModuleType:
    """Import ``module`` or raise :class:`MissingExtraError` naming the extra.

    Args:
        module: The package to import (``"typst"``, ``"openpyxl"``, ``"pandas"``).
        extra: The plyshear extra that installs it.

    Returns:
        The imported module.
    """
    try:
        return importlib.import_module(module)
    except ImportError:
        raise MissingExtraError(
            f"this needs the optional package {module!r}: pip install 'plyshear[{extra}]'"
        ) from None
