"""Shared fixtures: small model files written on the fly."""

from __future__ import annotations

from pathlib import Path

import pytest

MODELS = Path(__file__).resolve().parent.parent / "plyshear" / "models"

FORK = """\
format = 1
title = "test fork"
units = "kN-mm"

[bolt]
diameter = 24
grade = "8.8"

[[ply]]
name = "leg-1"
member = "fork"
thickness = 10
steel = "S355"

[[ply]]
name = "lug"
member = "lug"
thickness = 20
steel = "S355"

[[ply]]
name = "leg-2"
member = "fork"
thickness = 10
steel = "S355"

[member.fork]
support = true

[member.lug]
load = 100
"""


@pytest.fixture
def write_model(tmp_path: Path):
    """Write TOML text to a file and return its path."""

    def write(text: str, name: str = "model.toml") -> Path:
        path = tmp_path / name
        path.write_text(text, encoding="utf-8")
        return path

    return write
