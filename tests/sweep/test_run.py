"""Sweeps and the batch path: the same numbers as single runs, however they are computed.

* A sweep's rows equal single runs of the same cases: the model file edited by
  hand, loaded, solved (:func:`plyshear.solve`), checked and scaled to its
  elastic capacity one at a time.
* The batch path (:func:`plyshear.mechanics.batch.solve_many`) equals the
  per-case path to :data:`REL_BATCH`: assembly by one sparse operator and one
  banded factorisation of all the joints side by side against the per-joint
  scatter and factorisation.
* Local worker processes and a Dask cluster (``distributed.LocalCluster``) give
  the same table as the in-process run.
"""

from __future__ import annotations

import csv
import dataclasses
import json
import math
import tomllib
from pathlib import Path

import numpy as np
import pytest
from click.testing import CliRunner

import plyshear
from plyshear.cli import main
from plyshear.mechanics.batch import solve_many
from plyshear.mechanics.capacity import elastic_capacity
from plyshear.model import modelfile
from plyshear.sweep import keys as sk
from plyshear.sweep import run as sr
from tests.conftest import FORK, MODELS

REL_BATCH = 1e-12  # the bar: batch path = per-case path to 1e-12 relative
ABS_ZERO_N = 1e-6  # N: components that statics makes zero are compared absolutely
FORK_MODEL = MODELS / "fork-four-planes.toml"


def _close(a: float, b: float, rel: float = REL_BATCH, abs_: float = 0.0) -> bool:
    return math.isclose(a, b, rel_tol=rel, abs_tol=abs_)


def _assert_same_solution(a, b, rel: float = REL_BATCH) -> None:
    for ba, bb in zip(a.bolts, b.bolts, strict=True):
        for name in ("V", "M", "w", "q"):
            x, y = getattr(ba, name), getattr(bb, name)
            scale = max(float(np.abs(y).max()), 1e-300)
            np.testing.assert_allclose(x, y, rtol=0, atol=rel * scale)
        for pa, pb in zip(ba.planes, bb.planes, strict=True):
            assert pa.shear == pytest.approx(pb.shear, rel=rel, abs=ABS_ZERO_N)
            assert pa.threads == pb.threads
        for pa, pb in zip(ba.plies, bb.plies, strict=True):
            assert pa.force_xy == pytest.approx(pb.force_xy, rel=rel, abs=ABS_ZERO_N)
    for ma, mb in zip(a.members, b.members, strict=True):
        assert ma.reaction_xy == pytest.approx(mb.reaction_xy, rel=rel, abs=ABS_ZERO_N)
        assert ma.displacement_xy == pytest.approx(mb.displacement_xy, rel=rel, abs=1e-15)
    assert a.warnings == b.warnings
    assert a.condition == pytest.approx(b.condition, rel=1e-9)
    np.testing.assert_allclose(a.segment_forces, b.segment_forces, rtol=rel, atol=ABS_ZERO_N)


def _variants() -> list:
    """Joints of several shapes, in a mixed order, including a row and clamped ends."""
    out = []
    for name in (
        "fork-four-planes.toml",
        "splice-six-bolts.toml",
        "lug-cheek-plates.toml",
        "gusset-three-members.toml",
        "splice-with-filler.toml",
    ):
        base = plyshear.load_model(MODELS / name)
        for t in (0.8, 1.0, 1.3):
            out.append(base.with_ply(0, thickness=base.plies[0].thickness * t))
    out.append(out[0].with_bolt(diameter=30.0))
    return out[::2] + out[1::2]


#: The 1e-12 bar holds where round-off allows it: the variants are well conditioned
#: (κ up to 2e5, the gusset). Near the warning threshold the paths differ by about κ·ε.
COND_VARIANTS = 1e6


def test_batch_path_equals_the_per_case_path() -> None:
    joints = _variants()
    batched = solve_many(joints)
    assert len(batched) == len(joints)
    for joint, sol in zip(joints, batched, strict=True):
        assert sol.condition < COND_VARIANTS
        _assert_same_solution(sol, plyshear.solve(joint))


def test_batch_path_cut_into_small_batches_gives_the_same(monkeypatch) -> None:
    from plyshear.mechanics import batch

    joints = _variants()
    whole = solve_many(joints)
    monkeypatch.setattr(batch, "BATCH_ENTRIES", 1)  # one joint a batch
    for a, b in zip(solve_many(joints), whole, strict=True):
        _assert_same_solution(a, b)  # round-off only: BLAS sums stacks of other sizes apart


def test_a_joint_too_large_to_solve_is_its_own_error() -> None:
    # found in review: the layout's "too large" ModelError escaped the batch and ended
    # the whole sweep in a traceback
    big = modelfile.loads(
        FORK.replace(
            "[member.fork]",
            "[analysis]\nelements_per_ply = 1000\n"
            "[pattern]\ncount = 500\npitch = 75\n[member.fork]",
        )
        .replace("thickness = 10\n", "thickness = 80\nwidth = 300\n")
        .replace("thickness = 20\n", "thickness = 80\nwidth = 300\n"),
        "big.toml",
    )
    with pytest.raises(plyshear.ResourceError, match="the system is too large") as info:
        plyshear.solve(big)
    # a resource limit, not a wrong key: the line names the file and no key
    assert (info.value.path, info.value.key) == ("big.toml", "")
    assert str(info.value).startswith("big.toml: the system is too large")
    good = plyshear.load_model(FORK_MODEL)
    out = solve_many([good, big])
    _assert_same_solution(out[0], plyshear.solve(good))
    assert isinstance(out[1], modelfile.ModelError)
    assert "the system is too large" in str(out[1])


def test_loads_in_two_directions_have_no_elastic_capacity() -> None:
    # found in review: the sweep scaled a non-collinear pattern that plyshear capacity
    # refuses; now both refuse it
    _, _, rows = _sweep_model(
        MODELS / "gusset-three-members.toml", ["member.angle-b.load=[0,35],-35"], sr.Options()
    )
    assert rows[0]["capacity_event"].startswith("the member loads are not collinear")
    assert "capacity_elastic" not in rows[0]
    assert rows[1]["capacity_elastic"] > 0
    assert rows[1]["load_factor"] == pytest.approx(
        rows[1]["capacity_elastic"] / (40 + 35 + 20), rel=1e-12
    )  # Σ|P| of the gusset, kN


def test_batch_path_reports_each_failing_case_as_its_own_error() -> None:
    good = plyshear.load_model(FORK_MODEL)
    # nothing holds it (a Joint built in code, past the loader's rule): a mechanism
    lost = dataclasses.replace(
        good, members=tuple(dataclasses.replace(m, support=False) for m in good.members)
    )
    joints = [good, lost, good.with_ply(1, thickness=25.0)]
    out = solve_many(joints)
    _assert_same_solution(out[0], plyshear.solve(good))
    assert isinstance(out[1], modelfile.ModelError)
    with pytest.raises(modelfile.ModelError) as single:
        plyshear.solve(lost)
    assert str(out[1]) == str(single.value)
    _assert_same_solution(out[2], plyshear.solve(joints[2]))


def _sweep_model(path: Path, varies: list[str], options: sr.Options, **kw):
    data = modelfile.read(path)
    keys, cases = sk.cases([sk.parse_vary(v, data) for v in varies])
    return keys, cases, sr.run(data, str(path), keys, cases, options, **kw)


def _sweep(varies: list[str], options: sr.Options, **kw):
    return _sweep_model(FORK_MODEL, varies, options, **kw)


VARIES = ["bolt.diameter=20,24,30", "ply[2].thickness=12:24:6", "bolt.grade=8.8,10.9"]


def test_sweep_rows_equal_single_runs_of_the_same_cases() -> None:
    keys, cases, rows = _sweep(VARIES, sr.Options(), workers=1)
    assert [r["case"] for r in rows] == list(range(1, 19))
    data = modelfile.read(FORK_MODEL)
    for values, row in zip(cases, rows, strict=True):
        # the case by hand: edit the parsed file, load, solve, check, capacity
        edited = tomllib.loads(FORK_MODEL.read_text(encoding="utf-8"))
        edited["bolt"]["diameter"], edited["ply"][1]["thickness"], edited["bolt"]["grade"] = values
        assert edited == sk.apply(data, keys, values)
        joint = modelfile.from_dict(edited, str(FORK_MODEL))
        sol = plyshear.solve(joint)
        res = plyshear.check(joint, sol)
        kn = 1e3  # the model is in kN-mm
        assert row["error"] == ""
        assert row["max_shear"] == pytest.approx(
            max(p.shear for p in sol.first_bolt_planes) / kn, rel=REL_BATCH
        )
        for p in sol.first_bolt_planes:
            assert row[f"shear_plane_{p.index}"] == pytest.approx(p.shear / kn, rel=REL_BATCH)
        assert row["max_moment"] == pytest.approx(sol.bolts[0].max_moment / kn, rel=REL_BATCH)
        assert row["utilization"] == pytest.approx(res.governing.utilization, rel=REL_BATCH)
        assert row["passes"] == res.passes
        assert row["capacity_elastic"] == pytest.approx(
            elastic_capacity(joint, sol).load / kn, rel=REL_BATCH
        )


def test_batch_and_per_case_sweeps_give_the_same_table() -> None:
    _, _, fast = _sweep(VARIES, sr.Options(batch=True), workers=1)
    _, _, slow = _sweep(VARIES, sr.Options(batch=False), workers=1)
    _assert_same_rows(fast, slow)


def _assert_same_rows(a: list[dict], b: list[dict], rel: float = REL_BATCH) -> None:
    assert len(a) == len(b)
    for ra, rb in zip(a, b, strict=True):
        assert ra.keys() == rb.keys()
        for k, v in ra.items():
            if isinstance(v, float) and not isinstance(v, bool):
                assert v == pytest.approx(rb[k], rel=rel, abs=1e-12), (ra["case"], k)
            else:
                assert v == rb[k], (ra["case"], k)


def test_a_case_outside_the_catalogue_is_a_row_with_its_error() -> None:
    # S355 is tabulated to 80 mm (EN 10025-2 via the catalogue): the 100 mm case fails
    _, _, rows = _sweep(["ply[2].thickness=20,100"], sr.Options(), workers=1)
    assert rows[0]["error"] == ""
    assert rows[1]["error"].startswith("ply[2].thickness: steel S355: thickness 100")
    assert "utilization" not in rows[1]


def test_local_processes_give_the_same_table() -> None:
    _, _, inline = _sweep(VARIES, sr.Options(capacity="none"), workers=1, chunk=4)
    _, _, pooled = _sweep(VARIES, sr.Options(capacity="none"), workers=2, chunk=4)
    _assert_same_rows(pooled, inline, rel=0.0)


def test_dask_cluster_gives_the_same_table() -> None:
    distributed = pytest.importorskip("distributed")
    with distributed.LocalCluster(
        n_workers=1, threads_per_worker=2, processes=False, dashboard_address=None
    ) as cluster:
        ticks: list[int] = []
        _, _, remote = _sweep(
            VARIES,
            sr.Options(capacity="none"),
            scheduler=cluster.scheduler_address,
            chunk=5,
            progress=ticks.append,
        )
    _, _, local = _sweep(VARIES, sr.Options(capacity="none"), workers=1)
    _assert_same_rows(remote, local, rel=0.0)
    assert sum(ticks) == len(local)


def test_dask_scheduler_that_cannot_be_reached_is_one_error_line(write_model) -> None:
    pytest.importorskip("distributed")
    path = write_model(FORK)
    result = CliRunner().invoke(
        main,
        ["sweep", str(path), "--vary", "bolt.diameter=20,24", "--scheduler", "tcp://127.0.0.1:9"],
    )
    assert result.exit_code == 2
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1
    assert "cannot reach the Dask scheduler at tcp://127.0.0.1:9" in lines[0]


def test_cli_writes_csv_and_jsonl_and_never_overwrites(tmp_path: Path) -> None:
    out_csv, out_jsonl = tmp_path / "s.csv", tmp_path / "s.jsonl"
    args = [
        "sweep",
        str(FORK_MODEL),
        "--vary",
        "bolt.diameter=20,24",
        "--vary",
        "bolt.grade=8.8,10.9",
        "--quiet",
    ]
    r = CliRunner().invoke(main, [*args, "-o", str(out_csv)])
    assert r.exit_code == 0, r.output
    assert "4 cases, 4 solved, 0 with errors" in r.stdout
    rows = list(csv.DictReader(out_csv.open(encoding="utf-8")))
    assert [row["bolt.grade"] for row in rows] == ["8.8", "10.9", "8.8", "10.9"]
    r = CliRunner().invoke(main, [*args, "-o", str(out_jsonl)])
    lines = [json.loads(s) for s in out_jsonl.read_text(encoding="utf-8").splitlines()]
    assert [x["case"] for x in lines] == [1, 2, 3, 4]
    for row, line in zip(rows, lines, strict=True):
        assert float(row["utilization"]) == pytest.approx(line["utilization"], rel=1e-15)
    before = out_csv.read_bytes()
    r = CliRunner().invoke(main, [*args, "-o", str(out_csv)])
    assert r.exit_code == 2
    assert "exists; use --force" in r.stderr
    assert out_csv.read_bytes() == before
    assert not list(tmp_path.glob(".*.part"))  # nothing half-written left behind


def test_cli_plot_carries_the_swept_response(tmp_path: Path, monkeypatch) -> None:
    from plyshear.report import sweepplot

    figures = []
    real = sweepplot.sweep_figure

    def spy(*a, **kw):
        figures.append(real(*a, **kw))
        return figures[-1]

    monkeypatch.setattr(sweepplot, "sweep_figure", spy)
    plot = tmp_path / "sweep.png"
    out = tmp_path / "sweep.csv"
    r = CliRunner().invoke(
        main,
        [
            "sweep",
            str(FORK_MODEL),
            "--vary",
            "ply[2].thickness=12:24:4",
            "--vary",
            "bolt.diameter=20,24",
            "--plot",
            str(plot),
            "--response",
            "max_shear",
            "-o",
            str(out),
            "--quiet",
        ],
    )
    assert r.exit_code == 0, r.output
    assert plot.stat().st_size > 1000
    rows = list(csv.DictReader(out.open(encoding="utf-8")))
    lines = figures[0].axes[0].get_lines()
    assert len(lines) == 2  # one per bolt.diameter
    for line, d in zip(lines, ("20", "24"), strict=True):
        want = [float(r["max_shear"]) for r in rows if r["bolt.diameter"] == d]
        assert list(line.get_ydata()) == pytest.approx(want, rel=1e-12)
        assert list(line.get_xdata()) == [12, 16, 20, 24]


def test_progress_bar_on_long_runs(write_model) -> None:
    path = write_model(FORK)
    r = CliRunner().invoke(
        main,
        [
            "sweep",
            str(path),
            "--vary",
            "ply[2].thickness=10:40:0.1",
            "--capacity",
            "none",
            "--workers",
            "1",
        ],
    )
    assert r.exit_code == 0, r.output
    assert "301 cases" in r.stderr  # the bar's label
    assert "301 cases, 301 solved" in r.stdout


def test_a_row_names_the_bolt_of_its_worst_plane() -> None:
    row_model = MODELS / "splice-six-bolts.toml"
    keys, cases, rows = _sweep_model(
        row_model, ["pattern.pitch=60,90"], sr.Options(capacity="none"), workers=1
    )
    data = modelfile.read(row_model)
    for values, row in zip(cases, rows, strict=True):
        sol = plyshear.solve(modelfile.from_dict(sk.apply(data, keys, values), str(row_model)))
        shears = np.array([[p.shear for p in b.planes] for b in sol.bolts])
        bolt, plane = np.unravel_index(np.argmax(shears), shears.shape)
        assert (row["worst_bolt"], row["worst_plane"]) == (bolt + 1, plane + 1)
        assert row["max_shear"] == pytest.approx(shears.max() / 1e3, rel=REL_BATCH)  # kN
