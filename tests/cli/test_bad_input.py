"""Every bad-input rule of the model-file contract ends in one line and exit code 2.

The rules are those of the model-file contract (MODELFILE.md, "Rules the
loader enforces"); each case edits a valid model and runs the CLI.
"""

from __future__ import annotations

import re

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import FORK

EXIT_BAD_INPUT = 2


def _edit(old: str, new: str) -> str:
    assert old in FORK
    return FORK.replace(old, new, 1)


CASES = [
    # (model text, expected key path in the message, expected fragment)
    (_edit("thickness = 20", "thickness = -3"), "ply[2].thickness", "must be > 0 (got -3)"),
    (_edit("thickness = 20", "thickness = 0"), "ply[2].thickness", "must be > 0"),
    (_edit("diameter = 24", "diameter = 0"), "bolt.diameter", "must be > 0"),
    (
        _edit('name = "lug"\nmember = "lug"', 'name = "lug"\nmember = "lug"\ngap = -1'),
        "ply[2].gap",
        "must be ≥ 0",
    ),
    (_edit('name = "leg-2"', 'name = "leg-1"'), "ply[3].name", "already the name of ply[1]"),
    (_edit('member = "lug"', 'member = "lugg"'), "ply[2].member", "not declared"),
    (FORK + "\n[member.spare]\nsupport = true\n", "member.spare", "no ply belongs to it"),
    (_edit("support = true", "support = false"), "member", "no supported member"),
    (_edit("load = 100", "load = 100\nsupport = true"), "member.lug.load", "cannot also be loaded"),
    (_edit("thickness = 20", "thicknes = 20"), "ply[2].thicknes", "did you mean 'thickness'"),
    (
        _edit('grade = "8.8"', 'grade = "8.8"\ndiamter = 3'),
        "bolt.diamter",
        "did you mean 'diameter'",
    ),
    (_edit('grade = "8.8"', 'grade = "8.9"'), "bolt.grade", "known: 4.6"),
    (_edit('steel = "S355"', 'steel = "S356"'), "ply[1].steel", "known:"),
    (_edit('units = "kN-mm"', 'units = "kN-m"'), "units", "must be one of"),
    (_edit("format = 1", "format = 2"), "format", "must be 1"),
    (_edit("diameter = 24", 'diameter = "24 kN"'), "bolt.diameter", "is not a length"),
    (_edit("diameter = 24", 'diameter = "24"'), "bolt.diameter", "has no unit"),
    (_edit("diameter = 24", "diameter = nan"), "bolt.diameter", "must be finite"),
    (_edit("diameter = 24", "diameter = true"), "bolt.diameter", "boolean"),
    (_edit("load = 100", "load = [1, 2, 3]"), "member.lug.load", "[Fx, Fy]"),
    (FORK.split("[[ply]]")[0] + "[member.fork]\nsupport = true\n", "ply", "missing"),
    (
        _edit("thickness = 20", "thickness = 20\nlink_stiffness = -5"),
        "ply[2].link_stiffness",
        "must be ≥ 0",
    ),
    (FORK + "\n[analysis]\nelements_per_ply = 0\n", "analysis.elements_per_ply", "1..1000"),
    (FORK + '\n[analysis]\nbeam = "bernoulli"\n', "analysis.beam", "did you mean"),
    (FORK + '\n[check]\nmethod = "lsd"\n', "check.method", "must be one of"),
    ('format = 1\nunits = "kN-mm"\n[bolt\n', "", "not valid TOML"),
]


@pytest.mark.parametrize(("text", "key", "fragment"), CASES, ids=[c[1] or "toml" for c in CASES])
def test_bad_input_is_one_line_with_exit_2(write_model, text: str, key: str, fragment: str) -> None:
    path = write_model(text)
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    lines = result.output.strip().splitlines()
    assert len(lines) == 1, result.output
    assert lines[0].startswith(f"error: {path}: ")
    if key:
        assert f": {key}: " in lines[0]
    assert fragment in lines[0]
    assert "Traceback" not in result.output


def test_missing_file_is_one_line(tmp_path) -> None:
    result = CliRunner().invoke(main, ["solve", str(tmp_path / "nope.toml")])
    assert result.exit_code == EXIT_BAD_INPUT
    assert re.fullmatch(r"error: .*nope\.toml: cannot read the file .*\n", result.output)


def test_non_utf8_file_is_one_line(tmp_path) -> None:
    path = tmp_path / "bad.toml"
    path.write_bytes(b'format = 1\ntitle = "\xff\xfe"\n')
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert "not UTF-8" in result.output


def test_mechanism_names_the_unreachable_member(write_model, monkeypatch) -> None:
    # A loaded member whose only ply does not bear on the bolt has no load path
    # to a support: the CLI refuses it before solving, naming the member.
    from plyshear.mechanics import bearing

    monkeypatch.setitem(
        bearing.LAWS, "component", lambda bolt, ply: 0.0 if ply.name == "lug" else 1.0e4
    )
    path = write_model(FORK)
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert (
        result.output == f"error: {path}: member.lug: is a mechanism: no path of plies "
        "and bolt reaches it from a support\n"
    )


def test_existing_plot_is_not_overwritten(write_model, tmp_path) -> None:
    path = write_model(FORK)
    target = tmp_path / "fig.png"
    target.write_bytes(b"keep me")
    result = CliRunner().invoke(main, ["solve", str(path), "--plot", str(target)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert "exists; use --force" in result.output
    assert target.read_bytes() == b"keep me"
    result = CliRunner().invoke(main, ["solve", str(path), "--plot", str(target), "--force"])
    assert result.exit_code == 0
    assert target.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    assert not list(tmp_path.glob(".fig.png.*"))
