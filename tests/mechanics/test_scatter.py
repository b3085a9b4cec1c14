"""The hole-position scatter counts every sample; its command shows progress and resumes.

* Percentiles are those of the empirical distribution of all samples (the
  smallest value with at least q % of the samples at or below it: Hyndman &
  Fan 1996, "Sample quantiles in statistical packages", definition 1), computed
  here from the order statistics; a sample that fails below the model's load
  or does not converge ranks as the worst, so it moves the percentiles.
* ``capacity --scatter N -o samples.csv`` writes each sample as it finishes;
  SIGINT keeps them (exit 130) and ``--resume`` completes the same draws.
"""

from __future__ import annotations

import csv
import math
import signal
import sys
from pathlib import Path

import numpy as np
import pytest

from plyshear.mechanics import studies
from plyshear.model import modelfile
from tests.conftest import FORK
from tests.sweep.procs import PATIENCE, run, start, wait_lines

INF = math.inf
#: Offsets are written with repr(): they read back exactly.
REL_EXACT = 0.0


def _order_statistic(values: list[float], q: float) -> float:
    """Hyndman & Fan definition 1: x_(k), k = ceil(q n / 100) (at least 1)."""
    ranked = sorted(values)
    return ranked[max(1, math.ceil(q * len(ranked) / 100.0)) - 1]


def _samples(shears: list[float], caps: list[float], statuses: list[str]):
    return [
        studies.Sample(i + 1, (), s, c, st)
        for i, (s, c, st) in enumerate(zip(shears, caps, statuses, strict=True))
    ]


def test_percentiles_count_failed_and_unconverged_samples_as_worst() -> None:
    shears = [50.0, 52.0, 49.0, INF, 55.0, 51.0, INF, 53.0, 48.0, INF]
    caps = [200.0, 210.0, 190.0, 90.0, 205.0, 195.0, 80.0, 215.0, 185.0, -INF]
    statuses = (
        [studies.OK] * 3
        + [studies.BELOW_LOAD]
        + [studies.OK] * 2
        + [studies.BELOW_LOAD]
        + [studies.OK] * 2
        + [studies.NOT_CONVERGED + ": x"]
    )
    res = studies.ScatterResult.of(_samples(shears, caps, statuses), 100.0, 2.0)
    assert res.below_load == 2
    assert res.failed == 1
    for q in (5, 50, 95):
        got = res.percentiles(res.service_shear, (q,))[0]
        assert got == _order_statistic(shears, q)
        got = res.percentiles(res.capacity, (q,))[0]
        assert got == _order_statistic(caps, q)
    # the survivors alone would put the median shear at 51 and the 95 % at 55:
    # counting every sample moves the 95 % to "fails"
    assert res.percentiles(res.service_shear, (50, 95)) == [_order_statistic(shears, 50), INF]


def test_offsets_repeat_for_a_seed_and_stay_within_the_clearance() -> None:
    joint = modelfile.loads(
        FORK.replace("[member.fork]", '[analysis]\nbearing = "elastic-plastic"\n\n[member.fork]')
    )
    a = studies.scatter_offsets(joint, 50, seed=7)
    b = studies.scatter_offsets(joint, 50, seed=7)
    np.testing.assert_array_equal(a, b)
    c = studies.hole_clearance(joint)
    assert c > 0.0
    assert np.all(np.abs(a) <= 0.5 * c)  # uniform in (-c/2, c/2)


@pytest.mark.skipif(not sys.platform.startswith("linux"), reason="signals a process")
def test_scatter_interrupt_keeps_samples_and_resume_completes(tmp_path: Path) -> None:
    model = tmp_path / "fork.toml"
    model.write_text(
        FORK.replace("[member.fork]", '[analysis]\nbearing = "elastic-plastic"\n\n[member.fork]'),
        encoding="utf-8",
    )
    out = tmp_path / "samples.csv"
    partial = tmp_path / "samples.csv.partial"
    n = 10
    args = ["capacity", str(model), "--scatter", str(n), "--seed", "3", "-o", str(out)]
    proc = start(args, tmp_path)
    wait_lines(partial, 1 + 2, proc)  # the header and two samples
    proc.send_signal(signal.SIGINT)
    _, err = proc.communicate(timeout=PATIENCE)
    assert proc.returncode == 130, err
    with partial.open(encoding="utf-8", newline="") as fh:
        kept = list(csv.DictReader(fh))
    assert 2 <= len(kept) < n
    assert f"interrupted: {len(kept)} of {n} samples done" in err

    done = run([*args, "--resume"], tmp_path)
    assert done.returncode == 0, done.stderr
    with out.open(encoding="utf-8", newline="") as fh:
        rows = list(csv.DictReader(fh))
    assert [int(r["sample"]) for r in rows] == list(range(1, n + 1))  # each exactly once
    joint = modelfile.load(model)
    draws = studies.scatter_offsets(joint, n, seed=3)  # the same draws, resumed or not
    for r in rows:
        got = [float(r[f"hole_offset_{j}"]) for j in range(1, len(joint.plies) + 1)]
        assert got == pytest.approx(list(draws[int(r["sample"]) - 1]), rel=REL_EXACT)
    assert f"{n} samples" in done.stdout
