"""`plyshear validate`: the model-file rules and the warnings, without solving."""

from __future__ import annotations

from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import FORK, MODELS

EXIT_BAD_INPUT = 2


def test_valid_examples_pass() -> None:
    for path in sorted(MODELS.glob("*.toml")):
        result = CliRunner().invoke(main, ["validate", str(path)])
        assert result.exit_code == 0, result.output
        assert result.output.startswith(f"ok: {path}: ")


def test_bad_model_is_one_line_with_exit_2(write_model) -> None:
    path = write_model(FORK.replace("thickness = 20", "thickness = -3"))
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.output == f"error: {path}: ply[2].thickness: must be > 0 (got -3)\n"


def test_grip_longer_than_the_bolt_is_a_warning(write_model) -> None:
    # geometry: the plies add up to 40 mm, the bolt is 30 mm under the head
    path = write_model(FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 30'))
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == 0
    assert "warning:" in result.output
    assert "grip" in result.output
