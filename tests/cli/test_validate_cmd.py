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


def test_a_bolt_shorter_than_the_grip_is_refused(write_model) -> None:
    # geometry: the plies add up to 10 + 20 + 10 = 40 mm, the bolt is 30 mm under the head
    path = write_model(FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 30'))
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.output == (
        f"error: {path}: bolt.length: 30 mm is shorter than the grip "
        "40 mm: the bolt does not reach through the stack; give the "
        "under-head length of a longer bolt\n"
    )


def test_a_short_protrusion_is_a_warning(write_model) -> None:
    # M24 on a 40 mm grip: ISO 4032 nut m = 21.5 mm (from memory) + 2 x 3 mm pitch
    # (ISO 261 coarse) = 27.5 mm past the grip; a 60 mm bolt protrudes 20 mm
    path = write_model(FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 60'))
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == 0, result.output
    assert "warning: bolt.length: the bolt protrudes 20 mm past the grip" in result.output
    assert "67.5 mm long" in result.output  # 40 + 27.5


def test_an_en_ply_without_width_is_noted(write_model) -> None:
    path = write_model(FORK + '\n[check]\nstandard = "en1993-1-8"\n')
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == 0, result.output
    notes = [line for line in result.output.splitlines() if line.startswith("note: ")]
    assert len(notes) == 3  # three plies, none with a width
    # EN 1993-1-8 Table 3.4 k1 = 2.8 e2/d0 - 1.7 at e2 = 1.2 d0 (Table 3.3 minimum)
    assert f"k1 = {2.8 * 1.2 - 1.7:.2f}" in notes[0]
    assert notes[0].startswith("note: ply[1] 'leg-1'.width: not given")
