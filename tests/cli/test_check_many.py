"""plyshear check on several files: a summary row each, every file checked, the exit code."""

from __future__ import annotations

import json

from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS

EXIT_FAILS, EXIT_BAD_INPUT = 1, 2  # the contract's exit codes (docs: MODELFILE)


def _files(tmp_path):
    source = (MODELS / "fork-four-planes.toml").read_text(encoding="utf-8")
    good = tmp_path / "good.toml"
    good.write_text(source, encoding="utf-8")
    failing = tmp_path / "failing.toml"
    # 250 kN passes at utilization 0.534 (its own check); four times the load cannot pass
    failing.write_text(source.replace("load = 250", "load = 1000"), encoding="utf-8")
    refused = tmp_path / "refused.toml"
    refused.write_text(source.replace("thickness = 15", "thicknes = 15", 1), encoding="utf-8")
    return good, failing, refused


def test_three_files_one_failing_one_refused(tmp_path) -> None:
    good, failing, refused = _files(tmp_path)
    result = CliRunner().invoke(main, ["check", str(refused), str(good), str(failing)])
    assert result.exit_code == EXIT_BAD_INPUT
    lines = result.stdout.splitlines()
    rows = {
        name: next(line for line in lines if line.startswith(str(tmp_path / name)))
        for name in ("good.toml", "failing.toml", "refused.toml")
    }
    assert rows["good.toml"].endswith("passes")
    assert "bearing, ply hanger-1" in rows["good.toml"]
    assert rows["failing.toml"].endswith("FAILS")
    assert rows["refused.toml"].endswith("REFUSED (bad input)")
    assert f"error: {refused}" in result.stderr
    assert "thicknes" in result.stderr  # the key is named


def test_one_failing_file_gives_exit_1_and_details_on_request(tmp_path) -> None:
    good, failing, _ = _files(tmp_path)
    result = CliRunner().invoke(main, ["check", str(good), str(failing), "--details"])
    assert result.exit_code == EXIT_FAILS
    assert result.stdout.count("== ") == 2
    assert "governing" in result.stdout


def test_all_passing_files_give_exit_0_and_json_rows(tmp_path) -> None:
    good, _, _ = _files(tmp_path)
    other = MODELS / "gusset-three-members.toml"
    result = CliRunner().invoke(main, ["check", str(good), str(other), "--json"])
    assert result.exit_code == 0
    rows = json.loads(result.stdout)["files"]
    assert [r["file"] for r in rows] == [str(good), str(other)]
    assert all(r["passes"] for r in rows)
    single = json.loads(CliRunner().invoke(main, ["check", str(good), "--json"]).stdout)
    assert rows[0]["utilization"] == single["check"]["governing"]["utilization"]


def test_plot_and_output_need_one_file(tmp_path) -> None:
    good, failing, _ = _files(tmp_path)
    result = CliRunner().invoke(
        main, ["check", str(good), str(failing), "-o", str(tmp_path / "r.csv")]
    )
    assert result.exit_code == EXIT_BAD_INPUT
    assert "one model" in result.output


def test_a_long_title_is_clipped_in_the_summary_and_whole_in_the_json(tmp_path) -> None:
    good, _, _ = _files(tmp_path)
    long_title = "Hanger fork, grid C/4, level 3: " + "x" * 80
    text = good.read_text(encoding="utf-8")
    start = text.index("\ntitle = ") + 1
    end = text.index("\n", start)
    good.write_text(text[:start] + f'title = "{long_title}"' + text[end:], encoding="utf-8")
    other = MODELS / "gusset-three-members.toml"
    result = CliRunner().invoke(main, ["check", str(good), str(other)])
    row = next(line for line in result.stdout.splitlines() if line.startswith(str(good)))
    assert long_title[:39] in row
    assert long_title not in row
    assert "…" in row
    widths = {len(line) for line in result.stdout.splitlines() if line.startswith(str(tmp_path))}
    assert max(widths) < len(str(good)) + 100  # the table stays a terminal's width
    rows = json.loads(CliRunner().invoke(main, ["check", str(good), "--json", str(other)]).stdout)
    assert rows["files"][0]["title"] == long_title
