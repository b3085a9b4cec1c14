"""The ``plyshear`` command line: read arguments, call the API, print or write.

Bad input ends in one line ``error: FILE: key: message`` and exit code 2; no
traceback. Files are never overwritten without ``--force`` and are written
through a temporary file renamed into place.
"""

from __future__ import annotations

import json
import os
import sys
import tempfile
from collections.abc import Callable
from pathlib import Path
from typing import Any, NoReturn

import click

EXIT_FAILS = 1
EXIT_BAD_INPUT = 2
EXIT_FAULT = 3
#: Exit codes of a run stopped by a signal: 128 + the signal's number (shells' rule).
EXIT_SIGNAL = {2: 130, 15: 143}
#: Longest error line printed: a key of a million characters is named, not echoed.
MAX_ERROR_LINE = 300
FIGURE_FORMATS = {".png": "png", ".svg": "svg", ".pdf": "pdf"}


def one_line(text: str, most: int = MAX_ERROR_LINE) -> str:
    """Escape what would break or hide a line (separators, controls); cut it at ``most``."""
    line = "".join(ch if ch.isprintable() else ascii(ch)[1:-1] for ch in text[:4 * most])
    return line if len(line) <= most else line[:most - 25] + f"... ({len(text)} characters)"


def fail(message: str, code: int = EXIT_BAD_INPUT) -> NoReturn:
    """Print one error line and exit with ``code`` (2: bad input)."""
    click.echo(f"error: {one_line(message)}", err=True)
    sys.exit(code)


def fail_resumable(message: str, code: int = EXIT_FAULT) -> NoReturn:
    """Print one error line, then the command that resumes the run on its own (uncut) line."""
    click.echo(f"error: {one_line(message)}", err=True)
    click.echo(f"resume with: {_resume_command()}", err=True)
    sys.exit(code)


def write_atomic(path: Path, data: bytes, force: bool) -> None:
    """Write ``data`` to ``path`` through a temporary file renamed into place.

    The temporary file is locked while it is written; a stale one left by a
    killed write to the same path (unlocked) is removed first.

    Args:
        path: The target file.
        data: The bytes to write.
        force: Replace an existing file.
    """
    if path.exists() and not force:
        fail(f"{path}: exists; use --force to replace it")
    directory = path.parent if str(path.parent) else Path(".")
    if not directory.is_dir():
        fail(f"{path}: folder {directory} does not exist")
    _remove_stale(directory, path.name)
    try:
        fd, tmp = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".part", dir=directory)
    except OSError as exc:
        fail(f"{path}: cannot write in {directory} ({exc.strerror or exc})")
    try:
        _lock(fd)
        umask = os.umask(0)
        os.umask(umask)
        os.chmod(tmp, 0o666 & ~umask)
        with os.fdopen(fd, "wb") as fh:
            fh.write(data)
            fh.flush()
            os.fsync(fh.fileno())
        os.replace(tmp, path)
    except OSError as exc:
        Path(tmp).unlink(missing_ok=True)
        fail(f"{path}: cannot write ({exc.strerror or exc}); nothing was replaced",
             EXIT_FAULT)
    except BaseException:
        Path(tmp).unlink(missing_ok=True)
        raise


def _lock(fd: int, block: bool = True) -> bool:
    """Take an exclusive lock on an open file (POSIX); False if another holds it."""
    try:
        import fcntl
    except ImportError:  # pragma: no cover - not POSIX
        return True
    try:
        fcntl.flock(fd, fcntl.LOCK_EX | (0 if block else fcntl.LOCK_NB))
    except OSError:
        return False
    return True


def _remove_stale(directory: Path, name: str) -> None:
    """Remove temporary files of earlier writes to ``name`` whose writer is gone."""
    for tmp in directory.glob(f".{glob_escape(name)}.*.part"):
        try:
            fd = os.open(tmp, os.O_RDONLY)
        except OSError:
            continue
        try:
            if _lock(fd, block=False):  # nobody writes it: a killed write's leftover
                tmp.unlink(missing_ok=True)
        finally:
            os.close(fd)


def glob_escape(text: str) -> str:
    """Escape glob's special characters in a file name."""
    import glob

    return glob.escape(text)


def _guard(func: Callable[[], Any]) -> Any:
    """Run ``func`` and turn model errors into the one-line error."""
    from plyshear.model.modelfile import ModelError

    try:
        return func()
    except ModelError as exc:
        fail(str(exc))


def _load(path: str) -> Any:
    import plyshear

    return _guard(lambda: plyshear.load_model(path))


def _echo_sanity(joint: Any) -> None:
    """Print the sanity warnings to stderr, for commands whose output does not carry them."""
    from plyshear.model import sanity

    for w in sanity.warnings(joint):
        click.echo(f"warning: {one_line(w)}", err=True)


def _solve(joint: Any) -> Any:
    import plyshear
    from plyshear.mechanics.solve import SolveError

    try:
        return _guard(lambda: plyshear.solve(joint))
    except SolveError as exc:
        fail(f"{joint.source}: {exc}")


def _plot_target(plot: str | None, force: bool) -> tuple[Path, str] | None:
    """Check a --plot file name (format, and no overwrite) before any long work."""
    if plot is None:
        return None
    path = Path(plot)
    fmt = FIGURE_FORMATS.get(path.suffix.lower())
    if fmt is None:
        fail(f"{plot}: --plot needs a .png, .svg or .pdf file name")
    if path.exists() and not force:
        fail(f"{path}: exists; use --force to replace it")
    return path, fmt


def _write_figure(fig: Any, target: tuple[Path, str], force: bool) -> None:
    """Render a figure in the target's format and write it atomically."""
    from plyshear.report import diagrams

    write_atomic(target[0], diagrams.figure_bytes(fig, target[1]), force)
    click.echo(f"figure written to {target[0]}", err=True)


def _write_plot(sol: Any, target: tuple[Path, str], force: bool) -> None:
    from plyshear.report import diagrams

    fig = diagrams.row_figure(sol) if len(sol.bolts) > 1 else diagrams.solution_figure(sol)
    _write_figure(fig, target, force)


@click.group(context_settings={"help_option_names": ["-h", "--help"]})
@click.version_option(package_name="plyshear")
def main() -> None:
    """Shear in every plane of a bolt or pin through a stack of plies.

    Results support, and never replace, the judgement of a licensed engineer
    and the governing local code.
    """


@main.command("solve")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result.")
@click.option("--plot", type=click.Path(dir_okay=False), default=None,
              help="Write the stack with shear and moment diagrams (.png, .svg, .pdf).")
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
def solve_cmd(model: str, as_json: bool, plot: str | None, force: bool) -> None:
    """Solve the shear in every plane of MODEL (a TOML model file)."""
    target = _plot_target(plot, force)
    joint = _load(model)
    sol = _solve(joint)
    if as_json:
        click.echo(json.dumps(sol.to_dict(), indent=2))
    else:
        from plyshear.report.text import solution_text

        click.echo(solution_text(sol))
    if target is not None:
        _write_plot(sol, target, force)


@main.command("check")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--standard", type=click.Choice(["aisc360-22", "en1993-1-8"]), default=None,
              help="Design standard (default: the model's [check] standard).")
@click.option("--method", type=click.Choice(["lrfd", "asd"]), default=None,
              help="AISC method (default: the model's [check] method).")
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result with its check.")
@click.option("--plot", type=click.Path(dir_okay=False), default=None,
              help="Write the stack with shear and moment diagrams (.png, .svg, .pdf).")
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
def check_cmd(model: str, standard: str | None, method: str | None, as_json: bool,
              plot: str | None, force: bool) -> None:
    """Check every plane, ply and the bolt of MODEL against a design standard.

    Exit code 0 when every item passes, 1 when one fails, 2 on bad input.
    """
    import plyshear

    target = _plot_target(plot, force)
    joint = _load(model)
    sol = _solve(joint)
    if method is not None and (standard or joint.check.standard) != "aisc360-22":
        fail(f"{model}: --method applies to AISC 360 only (EN uses partial factors)")
    try:
        result = plyshear.check(joint, sol, standard, method)
    except ValueError as exc:
        fail(f"{model}: check: {exc}")
    if as_json:
        data = sol.to_dict()
        data["check"] = result.to_dict()
        data["warnings"] = data["warnings"] + list(result.warnings)
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import check_text

        click.echo(check_text(result, sol))
    if target is not None:
        _write_plot(sol, target, force)
    sys.exit(0 if result.passes else 1)


def _summarize(joint: Any) -> Any:
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.mechanics.capacity import CapacityError, summarize

    try:
        return _guard(lambda: summarize(joint, nominal_bearing(joint)))
    except (CapacityError, ValueError) as exc:
        fail(f"{joint.source}: capacity: {exc}")


def _check_quietly(joint: Any, sol: Any) -> Any:
    """The check of a solution for the capacity's verdict line, or None if it cannot run."""
    from plyshear.codes.check import check

    try:
        return check(joint, sol)
    except ValueError:
        return None


@main.command("capacity")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result with its capacity.")
@click.option("--plot", type=click.Path(dir_okay=False), default=None,
              help="Write the load-slip curve and plane shears against load.")
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
@click.option("--scatter", type=click.IntRange(min=1, max=100000), default=None,
              help="Monte Carlo of hole positions within the clearance: number of samples "
                   "(about 0.2 s each).")
@click.option("--seed", type=int, default=0, show_default=True, help="Seed for --scatter.")
@click.option("-o", "--output", type=click.Path(dir_okay=False), default=None,
              help="With --scatter: write every sample to a .csv or .jsonl file as it "
                   "finishes.")
@click.option("--resume", is_flag=True,
              help="With --scatter -o: continue the run that wrote the file.")
def capacity_cmd(model: str, as_json: bool, plot: str | None, force: bool,
                 scatter: int | None, seed: int, output: str | None, resume: bool) -> None:
    """Find the ultimate capacity of MODEL: elastic, nonlinear, collapse, shear-only.

    Nominal strengths, each with its design value under the model's standard
    (AISC phi or 1/Omega, EN 1/gamma_M2) beside it, and a line that sets the
    nonlinear design capacity against the model's load and the check's verdict.
    The bearing law is the model's [analysis] bearing, capped at each ply's
    bearing strength; the bolt yields as [analysis] bolt says.
    With --scatter, the plies' holes are placed at random within the clearance and
    the spread of the worst plane shear and of the capacity is reported; --plot then
    draws their histograms. With -o the samples are written as they finish; Ctrl-C
    keeps them and --resume continues.
    """
    if scatter is None and (output is not None or resume):
        fail(f"{model}: -o and --resume apply to --scatter only")
    out_path = _sweep_output(output, force, resume)
    target = _plot_target(plot, force)
    joint = _load(model)
    _echo_sanity(joint)
    if scatter is not None:
        _scatter(joint, scatter, seed, as_json, target, force, out_path, resume)
        return
    summary = _summarize(joint)
    result = _check_quietly(joint, summary.solution)
    if as_json:
        from plyshear.report.capacity_data import capacity_dict

        data = summary.solution.to_dict(diagram=False)
        data["capacity"] = capacity_dict(summary, joint, result)
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import capacity_text

        click.echo(capacity_text(summary, joint, result))
    if target is not None:
        from plyshear.report import diagrams

        _write_figure(diagrams.capacity_figure(summary, joint), target, force)


def _scatter(joint: Any, samples: int, seed: int, as_json: bool,
             target: tuple[Path, str] | None, force: bool, out_path: Path | None,
             resume: bool) -> None:
    from plyshear.sweep.stream import OutputError

    cols = _scatter_columns(joint)
    record = {"model file content": _content_hash(joint.source), "seed": seed,
              "samples": samples}
    stream = _open_stream(out_path, cols, force, resume, record, what="scatter")
    result, stopped, done = _scatter_run(joint, samples, seed, stream)
    if stopped is not None:
        _scatter_stopped(joint, result, samples, stream, stopped, done)
    if stream is not None:
        try:
            stream.finish(case_col="sample")
        except OutputError as exc:
            fail(str(exc), EXIT_FAULT)
        result = _scatter_read(joint, str(stream.path))
        click.echo(f"{samples} samples written to {stream.path}", err=True)
    if as_json:
        click.echo(json.dumps(scatter_dict(result, joint, samples, seed), indent=2))
    else:
        from plyshear.report.text import scatter_text

        click.echo(scatter_text(result, joint))
    if target is not None:
        from plyshear.report import diagrams

        _write_figure(diagrams.scatter_figure(result, joint), target, force)


def _scatter_columns(joint: Any) -> list[str]:
    return ["sample", "case_key", "status", "worst_plane_shear", "capacity",
            *(f"hole_offset_{j}" for j in range(1, len(joint.plies) + 1))]


def _sample_key(seed: int, index: int) -> str:
    from plyshear.sweep.stream import case_key

    return case_key(["seed", "sample"], [seed, index])


def _scatter_run(joint: Any, samples: int, seed: int, stream: Any) -> tuple[Any, int | None, int]:
    """Run the samples with a progress bar, appending each to the output as it ends."""
    from plyshear import units
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.mechanics.studies import hole_scatter
    from plyshear.sweep.pool import Stopper
    from plyshear.sweep.stream import OutputError

    u = units.system(joint.units)
    f, ln = u.factor("force"), u.factor("length")
    done = 0
    with Stopper() as stop, click.progressbar(length=samples, label=f"{samples} samples",
                                              file=sys.stderr) as bar:
        def skip(index: int) -> bool:
            nonlocal done
            taken = stream is not None and stream.take_done(_sample_key(seed, index))
            if taken:
                done += 1
                bar.update(1)
            return taken

        def on_sample(s: Any) -> None:
            nonlocal done
            if stream is not None:
                stream.append([{"sample": s.index, "case_key": _sample_key(seed, s.index),
                                "status": s.status, "worst_plane_shear": s.service_shear / f,
                                "capacity": s.capacity / f,
                                **{f"hole_offset_{j}": o / ln
                                   for j, o in enumerate(s.offsets, start=1)}}])
            done += 1
            bar.update(1)

        try:
            result = _guard(lambda: hole_scatter(joint, samples, seed, skip=skip,
                                                 on_sample=on_sample,
                                                 stop=lambda: stop.stopped,
                                                 bearing=nominal_bearing(joint)))
        except ValueError as exc:
            if stream is not None:
                stream.discard()
            fail(f"{joint.source}: {exc}")
        except OutputError as exc:
            stream.close()
            fail_resumable(str(exc))
    return result, stop.signum, done


def _scatter_read(joint: Any, path: str) -> Any:
    """All samples of a finished output file, as a result."""
    import math

    from plyshear import units
    from plyshear.mechanics import studies
    from plyshear.mechanics.capacity import hole_clearance
    from plyshear.sweep.output import read_table

    f = units.system(joint.units).factor("force")
    samples = []
    for row in read_table(path):
        status = str(row.get("status") or "")
        shear = (row.get("worst_plane_shear") or 0.0) * f if status == studies.OK else math.inf
        cap = -math.inf if status.startswith(studies.NOT_CONVERGED) else \
            (row.get("capacity") or 0.0) * f
        samples.append(studies.Sample(int(row["sample"]), (), shear, cap, status))
    return studies.ScatterResult.of(samples, studies.service_load(joint), hole_clearance(joint),
                                    max(1, len(joint.plies) - 1))


def _scatter_stopped(joint: Any, result: Any, samples: int, stream: Any, signum: int,
                     done: int) -> NoReturn:
    """Report an interrupted scatter: what is kept, how to go on; exit 130 or 143."""
    if stream is None:
        from plyshear.report.text import scatter_text

        if result.capacity.size:
            click.echo(scatter_text(result, joint))
        kept = "shown above; run with -o FILE to keep samples and --resume"
    else:
        stream.close()
        kept = f"kept in {stream.partial}"
    name = "terminated" if signum == 15 else "interrupted"
    click.echo(f"{name}: {done} of {samples} samples done, {kept}", err=True)
    if stream is not None:
        click.echo(f"resume with: {_resume_command()}", err=True)
    sys.exit(EXIT_SIGNAL.get(signum, 128 + signum))


def scatter_dict(result: Any, joint: Any, samples: int, seed: int) -> dict[str, Any]:
    """The JSON ``scatter`` section, in the joint's units (null: an infinite percentile)."""
    import math

    from plyshear import units

    u = units.system(joint.units)
    f = u.factor("force")

    def pct(values: Any) -> dict[str, float | None]:
        return {f"p{q}": (v / f if math.isfinite(v) else None) for q, v in zip(
            (5, 50, 95), result.percentiles(values), strict=True)}

    return {"format": 1, "units": u.labels(), "scatter": {
        "samples": samples, "seed": seed, "failed": result.failed,
        "not_converged": result.failed, "below_load": result.below_load,
        "clearance": result.clearance / u.factor("length"),
        "service_load": result.service_load / f,
        "worst_plane_shear": pct(result.service_shear),
        "capacity": pct(result.capacity),
    }}


@main.command("planes")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--max", "max_planes", type=click.IntRange(min=2, max=40), required=True,
              help="Largest number of shear planes to try (from 2).")
@click.option("--keep", type=click.Choice(["total", "ply"]), default="total", show_default=True,
              help="total: each member keeps its total thickness; ply: each ply keeps its own.")
@click.option("--json", "as_json", is_flag=True, help="Print the study as JSON.")
@click.option("--plot", type=click.Path(dir_okay=False), default=None,
              help="Write capacity and efficiency against the number of planes.")
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
def planes_cmd(model: str, max_planes: int, keep: str, as_json: bool, plot: str | None,
               force: bool) -> None:
    """Does an extra plane pay? Rebuild MODEL with 2 … --max planes and compare.

    The stack must have two members; their plies alternate (A B A B ...).
    """
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.mechanics.capacity import CapacityError
    from plyshear.mechanics.studies import planes_study

    target = _plot_target(plot, force)
    joint = _load(model)
    _echo_sanity(joint)
    try:
        rows = _guard(lambda: planes_study(joint, max_planes, keep, nominal_bearing))
    except (ValueError, CapacityError) as exc:
        fail(f"{model}: planes: {exc}")
    if as_json:
        from plyshear import units
        from plyshear.report.capacity_data import capacity_dict
        from plyshear.report.text import lug_lines, plane_gains

        variants = []
        for r in rows:
            entry = {"planes": r.planes, **capacity_dict(r.summary, r.joint)}
            entry.pop("curve")
            variants.append(entry)
        data = {"format": 1, "units": units.system(joint.units).labels(), "keep": keep,
                "planes": variants, "gains": plane_gains(rows, joint),
                "lugs": lug_lines(rows)}
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import planes_text

        click.echo(planes_text(rows, joint, keep))
    if target is not None:
        from plyshear.report import diagrams

        _write_figure(diagrams.planes_figure(rows, joint), target, force)


@main.command("sweep")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--vary", "varies", multiple=True, metavar="KEY=VALUES",
              help="A model-file key and its values: bolt.diameter=16,20,24, "
                   "ply[2].thickness=8:20:2 (ends included), bolt.grade=8.8,10.9. "
                   "Repeat for a full factorial.")
@click.option("--cases", "cases_file", type=click.Path(dir_okay=False), default=None,
              help="A CSV of cases: a header of keys, one case a row (crossed with --vary).")
@click.option("-o", "--output", type=click.Path(dir_okay=False), default=None,
              help="Write every case to a .csv or .jsonl file (else a table is printed).")
@click.option("--capacity", type=click.Choice(["none", "elastic", "full"]), default="elastic",
              show_default=True,
              help="elastic: the linear solution scaled to its first failure; full: also "
                   "the nonlinear and plastic capacities (about 0.1 s a case).")
@click.option("--no-check", is_flag=True, help="Skip the design check (solve only).")
@click.option("--plot", type=click.Path(dir_okay=False), default=None,
              help="Write a chart of --response against the varied keys (.png, .svg, .pdf).")
@click.option("--response", default="utilization", show_default=True,
              help="The plotted column: utilization, max_shear, max_moment, "
                   "capacity_elastic, capacity_nonlinear, capacity_collapse, capacity_plastic, "
                   "shear_plane_N.")
@click.option("--x", "x_key", default=None, help="Key on the chart's x axis (default: the "
              "first varied).")
@click.option("--series", default=None, help="Key drawn as one line per value (default: the "
              "second varied).")
@click.option("--workers", type=click.IntRange(min=1, max=256), default=None,
              help="Local worker processes (default: one per core).")
@click.option("--scheduler", default=None, metavar="ADDRESS",
              help="Run on a Dask distributed cluster (tcp://host:8786); needs the "
                   "'dask' extra.")
@click.option("--force", is_flag=True, help="Replace an existing -o or --plot file.")
@click.option("--resume", is_flag=True,
              help="Continue the sweep that wrote -o (its .partial file, or a complete "
                   "output): skip the cases it holds, run the rest.")
@click.option("--worker-timeout", type=click.FloatRange(min=0.1), default=60.0,
              show_default=True, help="With --scheduler: seconds without any Dask worker "
                                      "before the run ends.")
@click.option("--chunk", type=click.IntRange(min=1, max=100000), default=None,
              help="Cases per chunk (default 250; 10 with --capacity full): the unit of "
                   "progress, of a retry after a worker's death and of what an interrupt "
                   "loses.")
@click.option("--quiet", is_flag=True, help="No progress bar.")
def sweep_cmd(model: str, varies: tuple[str, ...], cases_file: str | None,
              output: str | None, capacity: str, no_check: bool, plot: str | None,
              response: str, x_key: str | None, series: str | None, workers: int | None,
              scheduler: str | None, force: bool, resume: bool, worker_timeout: float,
              chunk: int | None, quiet: bool) -> None:
    """Solve, check and rate MODEL for every combination of the --vary values.

    Every case goes through the model file's own validation; a case that fails it
    (a value outside a catalogue's range, say) is a row with its error, and the
    sweep goes on. Same-shaped cases are solved together (the batch path) on
    local processes, or on a Dask cluster with --scheduler. With -o, rows are
    written as they finish; Ctrl-C keeps them and --resume continues. Exit code 0
    when every case passes, 1 when one fails or has an error, 2 on bad input,
    3 when the run could not finish, 130 (143) when interrupted (terminated).
    """
    from plyshear.sweep import run as sr

    if not varies and cases_file is None:
        fail(f"{model}: sweep: give at least one --vary KEY=VALUES or --cases FILE")
    out_path = _sweep_output(output, force, resume)
    target = _plot_target(plot, force)
    joint = _load(model)
    _echo_sanity(joint)
    data, keys, cases = _sweep_cases(model, varies, cases_file)
    key_texts = [k.text for k in keys]
    chart = _sweep_chart(model, target, response, x_key, series, keys, cases, capacity,
                         no_check, len(joint.plies) - 1)
    options = sr.Options(capacity=capacity, check=not no_check)
    cols = sr.columns(keys, len(joint.plies) - 1, options, len(joint.stations))
    record = {"model file content": _content_hash(model), "capacity": capacity,
              "check": not no_check}
    stream = _open_stream(out_path, cols, force, resume, record, redo=sr.is_fault)
    rows, outcome = _sweep_run(model, data, keys, cases, options, stream, quiet, workers,
                               scheduler, worker_timeout, chunk or sr.chunk_size(options))
    if outcome.stopped is not None or outcome.fault:
        _sweep_stopped(model, joint, rows, cols, key_texts, len(cases), stream, outcome)
    if stream is not None:
        from plyshear.sweep.output import read_table
        from plyshear.sweep.stream import OutputError

        try:
            stream.finish()
        except OutputError as exc:
            fail(str(exc), EXIT_FAULT)
        rows = read_table(str(stream.path), keys)
    _sweep_print(rows, cols, key_texts, joint.units, stream, outcome)
    if chart is not None and target is not None:
        from plyshear.report.sweepplot import sweep_figure

        x, ser, fixed = chart
        fixed_at = {k: cases[0][key_texts.index(k)] for k in fixed}
        fig = sweep_figure(rows, x, ser, fixed_at, response, joint.units,
                           f"variants of {Path(model).name}")
        _write_figure(fig, target, force)
    sys.exit(_sweep_exit(rows, outcome))


def _sweep_output(output: str | None, force: bool, resume: bool) -> Path | None:
    """Check -o, --force and --resume together, before any work."""
    from plyshear.sweep.stream import FORMATS

    if output is None:
        if resume:
            fail("sweep: --resume needs -o FILE (the output of the sweep to continue)")
        return None
    path = Path(output)
    if path.suffix.lower() not in FORMATS:
        fail(f"{output}: -o needs a .csv or .jsonl file name")
    if resume and force:
        fail(f"{output}: --resume continues the file and --force replaces it; choose one")
    return path


def _sweep_cases(model: str, varies: tuple[str, ...], cases_file: str | None
                 ) -> tuple[dict[str, Any], list[Any], list[list[Any]]]:
    """The parsed model file, the varied keys and the cases (counted before expanded)."""
    from plyshear.model import modelfile
    from plyshear.sweep import keys as sk

    data = _guard(lambda: modelfile.read(model))
    try:
        table = sk.read_cases(cases_file, data) if cases_file else None
        parsed = sk.parse_varies(varies, data, rows=len(table[1]) if table else 1)
        keys, cases = sk.cases(parsed, table)
    except sk.SweepError as exc:
        fail(f"{model}: sweep: {exc}")
    return data, keys, cases


def _content_hash(path: str) -> str:
    """The SHA-256 of a model file's bytes (what an output records it was made from)."""
    import hashlib

    try:
        return hashlib.sha256(Path(path).read_bytes()).hexdigest()
    except OSError as exc:
        fail(f"{path}: cannot read the file ({exc.strerror or exc})")


def _open_stream(path: Path | None, cols: list[str], force: bool, resume: bool,
                 record: dict[str, Any], redo: Callable[[dict[str, Any]], bool] | None = None,
                 what: str = "sweep") -> Any:
    """Reserve the output (exclusively) and open its partial file, before any case runs."""
    if path is None:
        return None
    from plyshear.sweep.stream import OutputError, Stream

    stream = Stream(path, cols, force=force, resume=resume, record=record, redo=redo,
                    what=what)
    try:
        stream.open()
    except OutputError as exc:
        fail(str(exc))
    return stream


def _sweep_run(model: str, data: Any, keys: list[Any], cases: list[list[Any]], options: Any,
               stream: Any, quiet: bool, workers: int | None, scheduler: str | None,
               worker_timeout: float, chunk: int) -> tuple[list[dict[str, Any]], Any]:
    """Run the cases, appending each finished chunk to the output; keep the rows."""
    from plyshear.sweep import run as sr
    from plyshear.sweep.pool import Stopper
    from plyshear.sweep.stream import OutputError

    rows: list[dict[str, Any]] = []
    show = not quiet and len(cases) > chunk
    with Stopper() as stop, click.progressbar(length=len(cases), label=f"{len(cases)} cases",
                                              file=sys.stderr, hidden=not show) as bar:
        def sink(part: list[dict[str, Any]]) -> None:
            if stream is not None:
                stream.append(part)
            else:
                rows.extend(part)
            bar.update(len(part))

        try:
            outcome = sr.run_stream(data, str(model), keys, cases, options, sink,
                                    skip=stream.take_done if stream is not None else None,
                                    workers=workers, scheduler=scheduler, stopper=stop,
                                    chunk=chunk,
                                    worker_timeout=worker_timeout)
        except RuntimeError as exc:
            if stream is not None:
                stream.discard()
            fail(f"{model}: sweep: {exc}")
        except OutputError as exc:
            stream.close()
            fail_resumable(str(exc))
    rows.sort(key=lambda r: r["case"])
    return rows, outcome


def _resume_command() -> str:
    """The command that continues this sweep (this one's arguments, with --resume)."""
    import shlex

    if not Path(sys.argv[0]).name.startswith("plyshear"):
        return "the same command with --resume"
    args = [a for a in sys.argv[1:] if a != "--force"]
    if "--resume" not in args:
        args.append("--resume")
    return shlex.join(["plyshear", *args])


def _sweep_stopped(model: str, joint: Any, rows: list[dict[str, Any]], cols: list[str],
                   key_texts: list[str], total: int, stream: Any, outcome: Any) -> NoReturn:
    """Report a stopped or unfinished run: what is kept, how to go on; exit."""
    from plyshear.sweep import output as so

    done = outcome.done - outcome.lost + outcome.skipped  # a fault row is not done
    if stream is None:
        if rows:
            click.echo(so.text(rows, cols, key_texts, joint.units))
        kept = "shown above; run with -o FILE to keep rows and --resume"
    else:
        stream.close()
        kept = f"kept in {stream.partial}"
    if outcome.fault:
        message = f"{model}: sweep: {outcome.fault}; {done} of {total} cases done, {kept}"
        if stream is None:
            fail(message, EXIT_FAULT)
        fail_resumable(message)
    name = "terminated" if outcome.stopped == 15 else "interrupted"
    click.echo(f"{name}: {done} of {total} cases done, {kept}", err=True)
    if stream is not None:
        click.echo(f"resume with: {_resume_command()}", err=True)
    sys.exit(EXIT_SIGNAL.get(outcome.stopped, 128 + outcome.stopped))


def _sweep_print(rows: list[dict[str, Any]], cols: list[str], key_texts: list[str],
                 units: str, stream: Any, outcome: Any) -> None:
    from plyshear.sweep import output as so

    if stream is None:
        click.echo(so.text(rows, cols, key_texts, units))
    else:
        resumed = f" ({outcome.skipped} from the earlier run)" if outcome.skipped else ""
        click.echo(f"{len(rows)} cases written to {stream.path}{resumed}", err=True)
        click.echo(so.summary(rows))
        click.echo(so.units_line(units))
    if outcome.deaths:
        click.echo(f"warning: {outcome.deaths} worker process(es) died; their chunks were "
                   f"run again ({outcome.lost} cases lost after a second death are error "
                   "rows)", err=True)


def _sweep_exit(rows: list[dict[str, Any]], outcome: Any) -> int:
    """0: every case passes; 1: a case fails or has an error; 3: cases lost to faults."""
    if outcome.lost:
        return EXIT_FAULT
    if any(r.get("error") or r.get("passes") is False for r in rows):
        return EXIT_FAILS
    return 0


def _sweep_chart(model: str, target: Any, response: str, x_key: str | None,
                 series: str | None, keys: list[Any], cases: list[list[Any]], capacity: str,
                 no_check: bool, planes: int) -> tuple[str, str | None, list[str]] | None:
    """Check the chart's options before the long part; return (x, series, other keys)."""
    if target is None:
        return None
    from plyshear.report.sweepplot import response_dimension

    where = f"{model}: sweep: --response {response}"
    if response_dimension(response) is None:
        fail(f"{model}: sweep: --response {response!r} cannot be plotted; use utilization, "
             "max_shear, max_moment, capacity_elastic, capacity_nonlinear, capacity_collapse, "
             "capacity_plastic, "
             "efficiency_nonlinear or shear_plane_N")
    if response == "utilization" and no_check:
        fail(f"{where} needs the check (drop --no-check)")
    if response == "capacity_elastic" and capacity == "none":
        fail(f"{where} needs --capacity elastic or full")
    if response in ("capacity_nonlinear", "capacity_collapse", "capacity_plastic",
                    "efficiency_nonlinear") and \
            capacity != "full":
        fail(f"{where} needs --capacity full")
    if response.startswith("shear_plane_") and not 1 <= int(response[12:]) <= planes:
        fail(f"{where}: the model has planes 1 to {planes}")
    texts = [k.text for k in keys]
    for name, k in (("--x", x_key), ("--series", series)):
        if k is not None and k not in texts:
            fail(f"{model}: sweep: {name} {k!r} is not a varied key ({', '.join(texts)})")
    x = x_key or texts[0]
    rest = [k for k in texts if k != x]
    ser = series if series is not None and series != x else (rest[0] if rest else None)
    for k in (x, ser):
        if k is not None and any(isinstance(c[texts.index(k)], list | dict) for c in cases):
            fail(f"{model}: sweep: {k} has array values; plot against another key (--x, "
                 "--series)")
    return x, ser, [k for k in rest if k != ser]


@main.command("report")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("-o", "--output", type=click.Path(dir_okay=False), required=True,
              help="The report file: .html (self-contained) or .pdf.")
@click.option("--force", is_flag=True, help="Replace an existing report.")
def report_cmd(model: str, output: str, force: bool) -> None:
    """Write the calculation report of MODEL: model, diagrams, check, capacity."""
    path = Path(output)
    kind = path.suffix.lower()
    if kind not in (".html", ".htm", ".pdf"):
        fail(f"{output}: the report must be a .html or .pdf file")
    if path.exists() and not force:
        fail(f"{output}: exists; use --force to replace it")
    joint = _load(model)
    _solve(joint)  # refuses a bad joint with the one-line error before the long part
    from plyshear.report import document

    try:
        data = _guard(lambda: document.build(joint))
    except ValueError as exc:
        fail(f"{model}: report: {exc}")
    payload = document.to_pdf(data) if kind == ".pdf" else document.to_html(data).encode()
    write_atomic(path, payload, force)
    click.echo(f"report written to {path}", err=True)


@main.command("validate")
@click.argument("model", type=click.Path(dir_okay=False))
def validate_cmd(model: str) -> None:
    """Check MODEL without solving: every model-file rule, the load path, and warnings.

    Exit code 0 when the model can be solved (warnings included), 2 when it cannot.
    """
    from plyshear.model import sanity

    joint = _load(model)
    planes = len(joint.plies) - 1
    bolts = len(joint.stations)
    row = f", {bolts} bolts" if bolts > 1 else ""
    click.echo(f"ok: {model}: {len(joint.plies)} plies, {planes} planes{row}, "
               f"units {joint.units}, check {joint.check.standard}")
    for w in sanity.warnings(joint):
        click.echo(f"warning: {w}")
    for note in sanity.notes(joint):
        click.echo(f"note: {note}")


@main.command("demo")
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result.")
def demo_cmd(as_json: bool) -> None:
    """Solve a packaged example: a three-leg fork pinned to a two-plate lug."""
    from importlib import resources

    ref = resources.files("plyshear") / "models" / DEMO_MODEL
    with resources.as_file(ref) as path:
        joint = _load(str(path))
    joint = _with_source(joint, f"(demo) {DEMO_MODEL}")
    sol = _solve(joint)
    if as_json:
        click.echo(json.dumps(sol.to_dict(), indent=2))
        return
    from plyshear.report.text import solution_text

    click.echo(solution_text(sol))
    click.echo(f"\nThe model file is {DEMO_MODEL} among the examples shipped with plyshear "
               "(models/ in the source tree); try `plyshear solve models/<file>.toml`.")


DEMO_MODEL = "fork-four-planes.toml"


def _with_source(joint: Any, source: str) -> Any:
    import dataclasses

    return dataclasses.replace(joint, source=source)


if __name__ == "__main__":  # pragma: no cover
    main()
