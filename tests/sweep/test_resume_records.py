"""What a resumed output was made from, fault rows, and the lines a long run ends with.

* An output records the model file's content and the options that change its rows
  (``OUTPUT.run.json``); a resume with anything different is refused in one line
  naming it, whether the earlier run finished or was stopped.
* A row whose case never ran (its worker died twice) is run again on resume.
* The resume command is printed whole, on its own line.
* A --cases file with too many rows is refused at the limit, not after all of it.
* An ill-conditioned case says why it fails in its governing column.

The expected behaviour is the brief of issue 19's trial (common practice, no source);
every check below failed before the fix.
"""

from __future__ import annotations

import csv
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from plyshear.sweep import keys as sk
from plyshear.sweep import run as sr
from tests.conftest import FORK

SWEEP = ["--vary", "bolt.diameter=20,24", "--capacity", "none", "--workers", "1", "--quiet"]


def _cli(args: list[str]):
    return CliRunner().invoke(main, [str(a) for a in args])


def _rows(path: Path) -> list[dict[str, str]]:
    with open(path, newline="", encoding="utf-8") as fh:
        return list(csv.DictReader(fh))


def _one_error(r) -> str:
    lines = [ln for ln in r.stderr.splitlines() if ln.startswith("error:")]
    assert len(lines) == 1, r.stderr
    return lines[0]


def _interrupted(out: Path) -> None:
    """Leave what a stopped run leaves: the rows in the partial file, the output empty."""
    out.rename(out.with_name(out.name + ".partial"))
    out.write_bytes(b"")


@pytest.mark.parametrize("stopped", [False, True])
def test_a_scatter_resumed_with_another_seed_or_count_is_refused(
    write_model, tmp_path, stopped
) -> None:
    model, out = write_model(FORK), tmp_path / "s.csv"
    first = _cli(["capacity", model, "--scatter", 2, "--seed", 1, "-o", out])
    assert first.exit_code == 0, first.output
    if stopped:
        _interrupted(out)
    before = out.with_name(out.name + ".partial" if stopped else out.name).read_bytes()
    for seed, n, what in ((2, 2, "seed"), (1, 3, "samples")):
        r = _cli(["capacity", model, "--scatter", n, "--seed", seed, "-o", out, "--resume"])
        assert r.exit_code == 2, r.output
        line = _one_error(r)
        assert what in line
        assert str(out) in line
    after = out.with_name(out.name + ".partial" if stopped else out.name).read_bytes()
    assert after == before  # the earlier run's samples are untouched


def test_a_sweep_resumed_after_the_model_changed_is_refused(write_model, tmp_path) -> None:
    model, out = write_model(FORK), tmp_path / "out.csv"
    assert _cli(["sweep", model, *SWEEP, "-o", out]).exit_code == 0
    model.write_text(FORK.replace("load = 100", "load = 150"), encoding="utf-8")
    r = _cli(["sweep", model, *SWEEP, "-o", out, "--resume"])
    assert r.exit_code == 2, r.output
    assert "model file content" in _one_error(r)
    model.write_text(FORK, encoding="utf-8")
    again = _cli(["sweep", model, *SWEEP, "-o", out, "--resume"])  # the same: a no-op
    assert again.exit_code == 0, again.output


def test_a_fault_row_is_run_again_on_resume(write_model, tmp_path) -> None:
    model, out = write_model(FORK), tmp_path / "out.csv"
    assert _cli(["sweep", model, *SWEEP, "-o", out]).exit_code == 0
    rows = _rows(out)
    cols = list(rows[0])
    good = dict(rows[1])
    rows[1] = {c: "" for c in cols} | {
        "case": good["case"],
        "case_key": good["case_key"],
        "bolt.diameter": good["bolt.diameter"],
        "error": sr.FAULT_MARK + "the chunk's worker died twice",
    }
    with open(out, "w", newline="", encoding="utf-8") as fh:
        w = csv.DictWriter(fh, cols, lineterminator="\n")
        w.writeheader()
        w.writerows(rows)
    _interrupted(out)
    r = _cli(["sweep", model, *SWEEP, "-o", out, "--resume"])
    assert r.exit_code == 0, r.output
    assert "(1 from the earlier run)" in r.stderr  # the fault row is not done
    final = _rows(out)
    assert [x["case"] for x in final] == ["1", "2"]
    assert final[1]["error"] == ""
    assert final[1]["max_shear"] == good["max_shear"]  # the same case, solved again


def test_the_resume_command_is_printed_whole_on_its_own_line(
    write_model, tmp_path, monkeypatch
) -> None:
    from plyshear.sweep import stream as ss

    model, out = write_model(FORK), tmp_path / "out.csv"
    values = ",".join(f"{20 + i / 100:.2f}" for i in range(120))  # a command of 700+ chars
    args = [
        "sweep",
        str(model),
        "--vary",
        f"bolt.diameter={values}",
        "--capacity",
        "none",
        "--workers",
        "1",
        "--quiet",
        "-o",
        str(out),
    ]

    def full(self, rows):
        raise ss.OutputError(
            f"{self.partial}: the disk is full; the 0 rows written so far are kept"
        )

    monkeypatch.setattr(ss.Stream, "append", full)
    monkeypatch.setattr(sys, "argv", ["plyshear", *args])
    r = _cli(args)
    assert r.exit_code == 3, r.output
    resume = [ln for ln in r.stderr.splitlines() if ln.startswith("resume with: ")]
    assert len(resume) == 1, r.stderr
    assert resume[0].endswith(" --resume")
    assert values in resume[0]  # not cut at the 300-character error line


def test_too_many_cases_are_refused_at_the_limit(tmp_path, monkeypatch) -> None:
    import tomllib

    limit = 5
    monkeypatch.setattr(sk, "MAX_CASES", limit)
    parsed = []
    real = sk.parse_value
    monkeypatch.setattr(sk, "parse_value", lambda c, k: parsed.append(c) or real(c, k))
    cases = tmp_path / "cases.csv"
    cases.write_text(
        "bolt.diameter\n" + "".join(f"{20 + i}\n" for i in range(50)), encoding="utf-8"
    )
    with pytest.raises(sk.SweepError, match=f"more than {limit} cases"):
        sk.read_cases(cases, tomllib.loads(FORK))
    assert len(parsed) <= limit  # no row past the limit is parsed


def test_the_scatter_names_itself_when_its_output_exists(write_model, tmp_path) -> None:
    out = tmp_path / "s.csv"
    out.write_text("x\n", encoding="utf-8")
    r = _cli(["capacity", write_model(FORK), "--scatter", 2, "-o", out])
    assert r.exit_code == 2
    line = _one_error(r)
    assert "the scatter that wrote it" in line
    assert "sweep" not in line


def test_an_ill_conditioned_case_says_not_verified(write_model, tmp_path, monkeypatch) -> None:
    from plyshear.codes import check

    monkeypatch.setattr(check, "UNVERIFIED_CONDITION", 0.0)  # every solve: not trusted
    out = tmp_path / "out.csv"
    r = _cli(["sweep", write_model(FORK), *SWEEP, "-o", out])
    assert r.exit_code == 1, r.output
    for row in _rows(out):
        assert row["passes"] == "false"
        assert row["governing"].startswith("NOT VERIFIED")
        assert "condition estimate" in row["governing"]


def test_a_case_that_faults_again_keeps_one_fault_row(tmp_path) -> None:
    from plyshear.sweep import stream as ss

    out = tmp_path / "out.csv"
    cols = ["case", "case_key", "error"]
    fault = {"case": 2, "case_key": "b", "error": sr.FAULT_MARK + "died twice"}
    first = ss.Stream(out, cols, redo=sr.is_fault)
    first.open()
    first.append([{"case": 1, "case_key": "a", "error": ""}, fault])
    first.close()
    again = ss.Stream(out, cols, resume=True, redo=sr.is_fault)
    again.open()
    assert again.take_done("a")
    assert not again.take_done("b")  # a fault is not done
    again.append([fault])  # its worker died twice again
    again.finish()
    assert [r["case"] for r in _rows(out)] == ["1", "2"]  # one row a case
