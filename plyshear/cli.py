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

# plyshear's systems are small banded ones, factorised many times over: BLAS threads
# cost more to wake than they save (ten times the factorisation of a capacity step,
# far more on a loaded machine). One thread unless the user asks otherwise; set
# before numpy is first imported (the package's imports are lazy).
for _var in ("OPENBLAS_NUM_THREADS", "OMP_NUM_THREADS", "MKL_NUM_THREADS"):
    os.environ.setdefault(_var, "1")

import click  # noqa: E402

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
    line = "".join(ch if ch.isprintable() else ascii(ch)[1:-1] for ch in text[: 4 * most])
    return line if len(line) <= most else line[: most - 25] + f"... ({len(text)} characters)"


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
        fail(f"{path}: cannot write ({exc.strerror or exc}); nothing was replaced", EXIT_FAULT)
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
    from plyshear.errors import ModelError

    try:
        return func()
    except ModelError as exc:
        fail(str(exc))


def _extra(func: Callable[[], Any]) -> Any:
    """Run ``func``; a missing optional package ends in one line naming its extra."""
    from plyshear.report.extras import MissingExtraError

    try:
        return func()
    except MissingExtraError as exc:
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
    from plyshear.errors import SolveError

    try:
        return _guard(lambda: plyshear.solve(joint))
    except SolveError as exc:
        fail(f"{joint.source}: {exc}")


def _pick(joint: Any, combination: str | None) -> Any:
    """The joint loaded by ``--combination NAME`` (the joint itself without the option)."""
    if combination is None:
        return joint
    if not joint.has_cases:
        fail(
            f"{joint.source}: --combination: the model has no load combinations "
            "(its loads are one case)"
        )
    try:
        return joint.for_combination(combination)
    except KeyError as exc:
        fail(f"{joint.source}: --combination: {exc.args[0]}")


def _solve_combined(joint: Any) -> Any:
    """Every case and combination of a joint with load cases, solved."""
    from plyshear.mechanics.combine import solve_combinations
    from plyshear.mechanics.solve import SolveError

    try:
        return _guard(lambda: solve_combinations(joint))
    except SolveError as exc:
        fail(f"{joint.source}: {exc}")


def _check_combined(
    joint: Any, combined: Any, standard: str | None = None, method: str | None = None
) -> Any:
    """The check of every combination (one line on a level the method does not take)."""
    from plyshear.codes.combinations import check_combinations

    try:
        return check_combinations(combined, standard, method)
    except ValueError as exc:
        fail(f"{joint.source}: check: {exc}")


def _governing_joint(joint: Any, what: str) -> Any:
    """The joint of the check's governing combination, said on stderr, for ``what``."""
    from plyshear.codes.combinations import check_combinations

    combined = _solve_combined(joint)
    try:
        name = check_combinations(combined).governing_combination
        why = "the check's governing one"
    except ValueError:
        name, why = joint.combination, "the first (the check cannot run)"
    click.echo(f"{what}: combination {name} ({why}; --combination NAME for another)", err=True)
    return joint.for_combination(name)


COMBINATION_HELP = (
    "Use one load combination of the model (default: every combination, "
    "where the model has load cases)."
)
#: Options shared by solve and check.
COMBINATION = click.option("--combination", default=None, metavar="NAME", help=COMBINATION_HELP)
STACK_PLOT = click.option(
    "--plot",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write the stack with shear and moment diagrams (.png, .svg, .pdf).",
)


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


def _export_target(output: str | None, force: bool) -> Path | None:
    """Check an export's name (.csv or .xlsx), its extra and no overwrite, before the work."""
    if output is None:
        return None
    from plyshear.report.export import FORMATS

    path = Path(output)
    if path.suffix.lower() not in FORMATS:
        fail(f"{output}: -o needs a .csv or .xlsx file name")
    if path.suffix.lower() == ".xlsx":
        from plyshear.report.extras import require

        _extra(lambda: require("openpyxl", "xlsx"))
    if path.exists() and not force:
        fail(f"{path}: exists; use --force to replace it")
    return path


def _write_export(data: dict[str, Any], path: Path | None, force: bool) -> None:
    """Write the JSON result's tables to ``path`` (CSV or XLSX), atomically."""
    if path is None:
        return
    from plyshear.report.export import export

    write_atomic(path, export(data, path.suffix.lower()), force)
    click.echo(f"results written to {path}", err=True)


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
@STACK_PLOT
@click.option(
    "-o",
    "--output",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write the results: .csv (one row per plane, ply, member) or .xlsx (a "
    "sheet each; the 'xlsx' extra).",
)
@click.option("--force", is_flag=True, help="Replace an existing --plot or -o file.")
@COMBINATION
def solve_cmd(
    model: str,
    as_json: bool,
    plot: str | None,
    output: str | None,
    force: bool,
    combination: str | None,
) -> None:
    """Solve the shear in every plane of MODEL (a TOML model file).

    With load cases, every case is solved once and every combination by
    superposition; the table shows the cases, the combinations and the envelope
    (the largest shear, moment and bearing with the combination that gives it).
    """
    target = _plot_target(plot, force)
    out_path = _export_target(output, force)
    joint = _pick(_load(model), combination)
    if joint.has_cases and combination is None:
        _solve_all(joint, as_json, target, force)
        return
    sol = _solve(joint)
    _write_export(sol.to_dict(diagram=False), out_path, force)
    if as_json:
        data = sol.to_dict()
        if combination is not None:
            data["combination"] = combination
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import solution_text

        click.echo(solution_text(sol))
    if target is not None:
        _write_plot(sol, target, force)


def _solve_all(joint: Any, as_json: bool, target: tuple[Path, str] | None, force: bool) -> None:
    """``solve`` of a joint with load cases: every combination and the envelope."""
    from plyshear.mechanics.combine import combined_dict

    combined = _solve_combined(joint)
    if as_json:
        click.echo(json.dumps(combined_dict(combined, joint.combination), indent=2))
    else:
        from plyshear.report.combinations_text import solve_text

        click.echo(solve_text(combined))
    if target is not None:
        click.echo(
            f"plot: combination {joint.combination} (--combination NAME for another)", err=True
        )
        _write_plot(combined.combinations[joint.combination], target, force)


@main.command("check")
@click.argument("models", nargs=-1, required=True, type=click.Path(dir_okay=False))
@click.option(
    "--standard",
    type=click.Choice(["aisc360-22", "en1993-1-8"]),
    default=None,
    help="Design standard (default: the model's [check] standard).",
)
@click.option(
    "--method",
    type=click.Choice(["lrfd", "asd"]),
    default=None,
    help="AISC method (default: the model's [check] method).",
)
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result with its check.")
@STACK_PLOT
@click.option(
    "-o",
    "--output",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write the results with the check: .csv (one row per plane, ply, member, "
    "check item) or .xlsx (a sheet each; the 'xlsx' extra).",
)
@click.option("--force", is_flag=True, help="Replace an existing --plot or -o file.")
@click.option(
    "--details", is_flag=True, help="With several models: each one's check table after the summary."
)
@COMBINATION
def check_cmd(
    models: tuple[str, ...],
    standard: str | None,
    method: str | None,
    as_json: bool,
    plot: str | None,
    output: str | None,
    force: bool,
    details: bool,
    combination: str | None,
) -> None:
    """Check every plane, ply and the bolt of MODELS against a design standard.

    With one model: its check table. With several (models/*.toml): one summary row
    per file (title, governing item, utilization, verdict), every file checked
    whatever the others do, then each one's table with --details. With load cases,
    every combination is checked and the table shows each item's governing
    combination; the verdict is over all combinations.
    Exit code 0 when every item passes, 1 when one fails, 2 on bad input (with
    several files: 2 if any is refused, else 1 if any fails, else 0).
    """
    if len(models) > 1:
        if plot is not None or output is not None:
            fail("check: --plot and -o apply to one model; give one file")
        sys.exit(_check_many(models, standard, method, as_json, details))
    model = models[0]
    target = _plot_target(plot, force)
    out_path = _export_target(output, force)
    joint = _pick(_load(model), combination)
    if method is not None and (standard or joint.check.standard) != "aisc360-22":
        fail(f"{model}: --method applies to AISC 360 only (EN uses partial factors)")
    if joint.has_cases and combination is None:
        _check_all(joint, standard, method, as_json, target, force)
    sol = _solve(joint)
    result = _run_check(model, joint, sol, standard, method)
    data = _check_dict(sol, result) if as_json or out_path is not None else {}
    if combination is not None and data:
        data["combination"] = data["check"]["combination"] = combination
    _write_export(data, out_path, force)
    if as_json:
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import check_text

        if combination is not None:
            click.echo(f"combination {combination}: {_factors_text(joint, combination)}")
        click.echo(check_text(result, sol))
    if target is not None:
        _write_plot(sol, target, force)
    sys.exit(0 if result.passes else 1)


def _factors_text(joint: Any, name: str) -> str:
    combo = joint.combination_named(name)
    return " + ".join(f"{v:g} {k}" for k, v in combo.factors) + f" ({combo.level})"


def _check_all(
    joint: Any,
    standard: str | None,
    method: str | None,
    as_json: bool,
    target: tuple[Path, str] | None,
    force: bool,
) -> NoReturn:
    """``check`` of a joint with load cases: every combination, the governing lines."""
    combined = _solve_combined(joint)
    checks = _check_combined(joint, combined, standard, method)
    gov = checks.governing_combination
    if as_json:
        from plyshear.mechanics.combine import combined_dict

        data = combined_dict(combined, gov)
        data["check"] = checks.to_dict()
        for entry in data["combinations"]:
            entry["check"] = {
                **checks.results[entry["name"]].to_dict(),
                "combination": entry["name"],
            }
        data["warnings"] = data["warnings"] + list(data["check"]["warnings"])
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.combinations_text import check_text

        click.echo(check_text(checks, joint))
    if target is not None:
        click.echo(f"plot: combination {gov} (the governing one)", err=True)
        _write_plot(combined.combinations[gov], target, force)
    sys.exit(0 if checks.to_dict()["passes"] else 1)


def _check_file(
    model: str, standard: str | None, method: str | None
) -> tuple[dict[str, Any], Any, Any]:
    """Load, solve and check one file; a refusal is a row with its error, never an exit."""
    import plyshear
    from plyshear.mechanics.solve import SolveError
    from plyshear.model.modelfile import ModelError

    row: dict[str, Any] = {
        "file": model,
        "title": "",
        "governing": None,
        "utilization": None,
        "passes": None,
        "error": None,
    }
    try:
        joint = plyshear.load_model(model)
        row["title"] = joint.title
        sol = plyshear.solve(joint)
        if method is not None and (standard or joint.check.standard) != "aisc360-22":
            raise ValueError("--method applies to AISC 360 only (EN uses partial factors)")
        result = plyshear.check(joint, sol, standard, method)
    except ModelError as exc:
        row["error"] = one_line(str(exc))
        return row, None, None
    except (SolveError, ValueError) as exc:
        row["error"] = one_line(f"{model}: {exc}")
        return row, None, None
    gov = result.governing
    row.update(
        passes=result.passes,
        governing=None if gov is None else f"{gov.what}, {gov.place(result.units)}",
        utilization=None if gov is None else gov.utilization,
    )
    return row, result, sol


def _check_many(
    models: tuple[str, ...], standard: str | None, method: str | None, as_json: bool, details: bool
) -> int:
    """Check every file; print the summary (and the details); return the exit code."""
    from plyshear.report.text import check_text, table

    done = [_check_file(m, standard, method) for m in models]
    rows = [r for r, _, _ in done]
    for r in rows:
        if r["error"] is not None:
            click.echo(f"error: {r['error']}", err=True)
    if as_json:
        click.echo(json.dumps({"files": rows}, indent=2))
    else:
        cells = [
            [
                r["file"],
                _clip(r["title"] or "", TITLE_WIDTH),
                r["governing"] or "-",
                "-" if r["utilization"] is None else f"{r['utilization']:.3f}",
                _verdict(r),
            ]
            for r in rows
        ]
        click.echo(table(["file", "title", "governing", "util.", "verdict"], cells, "lllrl"))
        if details:
            for r, result, sol in done:
                if result is not None:
                    click.echo(f"\n== {r['file']}\n{check_text(result, sol)}")
    if any(r["error"] is not None for r in rows):
        return EXIT_BAD_INPUT
    return EXIT_FAILS if any(r["passes"] is False for r in rows) else 0


#: Longest title the multi-file summary prints (the JSON keeps it whole).
TITLE_WIDTH = 40


def _clip(text: str, width: int) -> str:
    """``text`` cut to ``width`` characters, an ellipsis marking the cut."""
    return text if len(text) <= width else text[: width - 1].rstrip() + "…"


def _verdict(row: dict[str, Any]) -> str:
    if row["error"] is not None:
        return "REFUSED (bad input)"
    return "passes" if row["passes"] else "FAILS"


def _run_check(model: str, joint: Any, sol: Any, standard: str | None, method: str | None) -> Any:
    """The check of a solved joint; bad options end in the one-line error."""
    import plyshear

    if method is not None and (standard or joint.check.standard) != "aisc360-22":
        fail(f"{model}: --method applies to AISC 360 only (EN uses partial factors)")
    try:
        return plyshear.check(joint, sol, standard, method)
    except ValueError as exc:
        fail(f"{model}: check: {exc}")


def _check_dict(sol: Any, result: Any) -> dict[str, Any]:
    """The JSON result with its check section and the check's warnings."""
    data = sol.to_dict()
    data["check"] = result.to_dict()
    data["warnings"] = data["warnings"] + list(result.warnings)
    return data


def _summarize(joint: Any) -> Any:
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.errors import CapacityError
    from plyshear.mechanics.capacity import summarize

    try:
        return _guard(lambda: summarize(joint, nominal_bearing(joint)))
    except (CapacityError, ValueError) as exc:
        fail(f"{joint.source}: capacity: {exc}")


def _require_load_level(joint: Any, model: str) -> None:
    """Refuse design values set against loads of the other level (as the check does)."""
    from plyshear.codes.check import require_load_level

    try:
        require_load_level(joint, joint.check.standard, joint.check.method)
    except ValueError as exc:
        fail(f"{model}: capacity: {exc}")


def _check_quietly(joint: Any, sol: Any) -> Any:
    """The check of a solution for the capacity's verdict line, or None if it cannot run."""
    from plyshear.codes.check import check

    try:
        return check(sol)
    except ValueError:
        return None


@main.command("capacity")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result with its capacity.")
@click.option(
    "--plot",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write the load-slip curve and plane shears against load.",
)
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
@click.option(
    "--scatter",
    type=click.IntRange(min=1, max=100000),
    default=None,
    help="Monte Carlo of hole positions within the clearance: number of samples "
    "(about 0.2 s each).",
)
@click.option("--seed", type=int, default=0, show_default=True, help="Seed for --scatter.")
@click.option(
    "-o",
    "--output",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write the results with the capacity answers to .csv or .xlsx; with "
    "--scatter: every sample to a .csv or .jsonl file as it finishes.",
)
@click.option(
    "--resume", is_flag=True, help="With --scatter -o: continue the run that wrote the file."
)
@click.option(
    "--combination",
    default=None,
    metavar="NAME",
    help="Use one load combination as the load pattern (default, where the model "
    "has load cases: the check's governing combination).",
)
def capacity_cmd(
    model: str,
    as_json: bool,
    plot: str | None,
    force: bool,
    scatter: int | None,
    seed: int,
    output: str | None,
    resume: bool,
    combination: str | None,
) -> None:
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
    if scatter is None and resume:
        fail(f"{model}: --resume applies to --scatter only")
    export_path = _export_target(output, force) if scatter is None else None
    out_path = _sweep_output(output, force, resume) if scatter is not None else None
    target = _plot_target(plot, force)
    joint = _pick(_load(model), combination)
    if joint.has_cases and combination is None:
        joint = _governing_joint(joint, "capacity")
    _echo_sanity(joint)
    _require_load_level(joint, model)
    if scatter is not None:
        _scatter(joint, scatter, seed, as_json, target, force, out_path, resume)
        return
    summary = _summarize(joint)
    result = _check_quietly(joint, summary.solution)
    if as_json or export_path is not None:
        from plyshear.report.capacity_data import capacity_dict

        data = summary.solution.to_dict(diagram=False)
        if joint.combination:
            data["combination"] = joint.combination
        data["capacity"] = capacity_dict(summary, joint, result)
        _write_export(data, export_path, force)
    if as_json:
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import capacity_text

        click.echo(capacity_text(summary, joint, result))
    if target is not None:
        from plyshear.report import diagrams

        _write_figure(diagrams.capacity_figure(summary, joint), target, force)


def _scatter(
    joint: Any,
    samples: int,
    seed: int,
    as_json: bool,
    target: tuple[Path, str] | None,
    force: bool,
    out_path: Path | None,
    resume: bool,
) -> None:
    from plyshear.sweep.stream import OutputError

    cols = _scatter_columns(joint)
    record = {"model file content": _content_hash(joint.source), "seed": seed, "samples": samples}
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
    return [
        "sample",
        "case_key",
        "status",
        "worst_plane_shear",
        "capacity",
        *(f"hole_offset_{j}" for j in range(1, len(joint.plies) + 1)),
    ]


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
    with (
        Stopper() as stop,
        click.progressbar(length=samples, label=f"{samples} samples", file=sys.stderr) as bar,
    ):

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
                stream.append(
                    [
                        {
                            "sample": s.index,
                            "case_key": _sample_key(seed, s.index),
                            "status": s.status,
                            "worst_plane_shear": s.service_shear / f,
                            "capacity": s.capacity / f,
                            **{
                                f"hole_offset_{j}": o / ln for j, o in enumerate(s.offsets, start=1)
                            },
                        }
                    ]
                )
            done += 1
            bar.update(1)

        try:
            result = _guard(
                lambda: hole_scatter(
                    joint,
                    samples,
                    seed,
                    skip=skip,
                    on_sample=on_sample,
                    stop=lambda: stop.stopped,
                    bearing=nominal_bearing(joint),
                )
            )
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
        cap = (
            -math.inf
            if status.startswith(studies.NOT_CONVERGED)
            else (row.get("capacity") or 0.0) * f
        )
        samples.append(studies.Sample(int(row["sample"]), (), shear, cap, status))
    return studies.ScatterResult.of(
        samples, studies.service_load(joint), hole_clearance(joint), max(1, len(joint.plies) - 1)
    )


def _scatter_stopped(
    joint: Any, result: Any, samples: int, stream: Any, signum: int, done: int
) -> NoReturn:
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
        return {
            f"p{q}": (v / f if math.isfinite(v) else None)
            for q, v in zip((5, 50, 95), result.percentiles(values), strict=True)
        }

    return {
        "format": 1,
        "units": u.labels(),
        "scatter": {
            "samples": samples,
            "seed": seed,
            "failed": result.failed,
            "not_converged": result.failed,
            "below_load": result.below_load,
            "clearance": result.clearance / u.factor("length"),
            "service_load": result.service_load / f,
            "worst_plane_shear": pct(result.service_shear),
            "capacity": pct(result.capacity),
        },
    }


@main.command("planes")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option(
    "--max",
    "max_planes",
    type=click.IntRange(min=2, max=40),
    required=True,
    help="Largest number of shear planes to try (from 2).",
)
@click.option(
    "--keep",
    type=click.Choice(["total", "ply"]),
    default="total",
    show_default=True,
    help="total: each member keeps its total thickness; ply: each ply keeps its own.",
)
@click.option("--json", "as_json", is_flag=True, help="Print the study as JSON.")
@click.option(
    "--plot",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write capacity and efficiency against the number of planes.",
)
@click.option("--force", is_flag=True, help="Replace an existing --plot file.")
@click.option(
    "--combination",
    default=None,
    metavar="NAME",
    help="Use one load combination as the load pattern (default, where the model "
    "has load cases: the check's governing combination).",
)
def planes_cmd(
    model: str,
    max_planes: int,
    keep: str,
    as_json: bool,
    plot: str | None,
    force: bool,
    combination: str | None,
) -> None:
    """Does an extra plane pay? Rebuild MODEL with 2 … --max planes and compare.

    The stack must have two members; their plies alternate (A B A B ...).
    """
    from plyshear.codes.resistance import nominal_bearing
    from plyshear.errors import CapacityError
    from plyshear.mechanics.studies import planes_study

    target = _plot_target(plot, force)
    joint = _pick(_load(model), combination)
    if joint.has_cases and combination is None:
        joint = _governing_joint(joint, "planes")
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
        data = {
            "format": 1,
            "units": units.system(joint.units).labels(),
            "keep": keep,
            "planes": variants,
            "gains": plane_gains(rows, joint),
            "lugs": lug_lines(rows),
        }
        click.echo(json.dumps(data, indent=2))
    else:
        from plyshear.report.text import planes_text

        click.echo(planes_text(rows, joint, keep))
    if target is not None:
        from plyshear.report import diagrams

        _write_figure(diagrams.planes_figure(rows, joint), target, force)


@main.command("sweep")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option(
    "--vary",
    "varies",
    multiple=True,
    metavar="KEY=VALUES",
    help="A model-file key and its values: bolt.diameter=16,20,24, "
    "ply[2].thickness=8:20:2 (ends included), bolt.grade=8.8,10.9. "
    "Repeat for a full factorial.",
)
@click.option(
    "--cases",
    "cases_file",
    type=click.Path(dir_okay=False),
    default=None,
    help="A CSV of cases: a header of keys, one case a row (crossed with --vary).",
)
@click.option(
    "-o",
    "--output",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write every case to a .csv or .jsonl file (else a table is printed).",
)
@click.option(
    "--capacity",
    type=click.Choice(["none", "elastic", "full"]),
    default="elastic",
    show_default=True,
    help="elastic: the linear solution scaled to its first failure; full: also "
    "the nonlinear and plastic capacities (about 0.1 s a case).",
)
@click.option("--no-check", is_flag=True, help="Skip the design check (solve only).")
@click.option(
    "--plot",
    type=click.Path(dir_okay=False),
    default=None,
    help="Write a chart of --response against the varied keys (.png, .svg, .pdf).",
)
@click.option(
    "--response",
    default="utilization",
    show_default=True,
    help="The plotted column: utilization, max_shear, max_moment, "
    "capacity_elastic, capacity_nonlinear, capacity_collapse, capacity_plastic, "
    "shear_plane_N.",
)
@click.option(
    "--x", "x_key", default=None, help="Key on the chart's x axis (default: the first varied)."
)
@click.option(
    "--series", default=None, help="Key drawn as one line per value (default: the second varied)."
)
@click.option(
    "--workers",
    type=click.IntRange(min=1, max=256),
    default=None,
    help="Local worker processes (default: one per core).",
)
@click.option(
    "--scheduler",
    default=None,
    metavar="ADDRESS",
    help="Run on a Dask distributed cluster (tcp://host:8786); needs the 'dask' extra.",
)
@click.option("--force", is_flag=True, help="Replace an existing -o or --plot file.")
@click.option(
    "--resume",
    is_flag=True,
    help="Continue the sweep that wrote -o (its .partial file, or a complete "
    "output): skip the cases it holds, run the rest.",
)
@click.option(
    "--worker-timeout",
    type=click.FloatRange(min=0.1),
    default=60.0,
    show_default=True,
    help="With --scheduler: seconds without any Dask worker before the run ends.",
)
@click.option(
    "--chunk",
    type=click.IntRange(min=1, max=100000),
    default=None,
    help="Cases per chunk (default 250; 10 with --capacity full): the unit of "
    "progress, of a retry after a worker's death and of what an interrupt "
    "loses.",
)
@click.option("--quiet", is_flag=True, help="No progress bar.")
def sweep_cmd(
    model: str,
    varies: tuple[str, ...],
    cases_file: str | None,
    output: str | None,
    capacity: str,
    no_check: bool,
    plot: str | None,
    response: str,
    x_key: str | None,
    series: str | None,
    workers: int | None,
    scheduler: str | None,
    force: bool,
    resume: bool,
    worker_timeout: float,
    chunk: int | None,
    quiet: bool,
) -> None:
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
    if joint.has_cases:
        fail(
            f"{model}: sweep: a model with load cases is not swept yet; give plain loads "
            "(e.g. one combination's) in a copy of the file"
        )
    _echo_sanity(joint)
    data, keys, cases = _sweep_cases(model, varies, cases_file)
    key_texts = [k.text for k in keys]
    chart = _sweep_chart(
        model,
        target,
        response,
        x_key,
        series,
        keys,
        cases,
        capacity,
        no_check,
        len(joint.plies) - 1,
    )
    options = sr.Options(capacity=capacity, check=not no_check)
    cols = sr.columns(keys, len(joint.plies) - 1, options, len(joint.stations))
    record = {
        "model file content": _content_hash(model),
        "capacity": capacity,
        "check": not no_check,
    }
    stream = _open_stream(out_path, cols, force, resume, record, redo=sr.is_fault)
    rows, outcome = _sweep_run(
        model,
        data,
        keys,
        cases,
        options,
        stream,
        quiet,
        workers,
        scheduler,
        worker_timeout,
        chunk or sr.chunk_size(options),
    )
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
        fig = sweep_figure(
            rows, x, ser, fixed_at, response, joint.units, f"variants of {Path(model).name}"
        )
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


def _sweep_cases(
    model: str, varies: tuple[str, ...], cases_file: str | None
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


def _open_stream(
    path: Path | None,
    cols: list[str],
    force: bool,
    resume: bool,
    record: dict[str, Any],
    redo: Callable[[dict[str, Any]], bool] | None = None,
    what: str = "sweep",
) -> Any:
    """Reserve the output (exclusively) and open its partial file, before any case runs."""
    if path is None:
        return None
    from plyshear.sweep.stream import OutputError, Stream

    stream = Stream(path, cols, force=force, resume=resume, record=record, redo=redo, what=what)
    try:
        stream.open()
    except OutputError as exc:
        fail(str(exc))
    return stream


def _sweep_run(
    model: str,
    data: Any,
    keys: list[Any],
    cases: list[list[Any]],
    options: Any,
    stream: Any,
    quiet: bool,
    workers: int | None,
    scheduler: str | None,
    worker_timeout: float,
    chunk: int,
) -> tuple[list[dict[str, Any]], Any]:
    """Run the cases, appending each finished chunk to the output; keep the rows."""
    from plyshear.sweep import run as sr
    from plyshear.sweep.pool import Stopper
    from plyshear.sweep.stream import OutputError

    rows: list[dict[str, Any]] = []
    show = not quiet and len(cases) > chunk
    with (
        Stopper() as stop,
        click.progressbar(
            length=len(cases), label=f"{len(cases)} cases", file=sys.stderr, hidden=not show
        ) as bar,
    ):

        def sink(part: list[dict[str, Any]]) -> None:
            if stream is not None:
                stream.append(part)
            else:
                rows.extend(part)
            bar.update(len(part))

        try:
            outcome = sr.run_stream(
                data,
                str(model),
                keys,
                cases,
                options,
                sink,
                skip=stream.take_done if stream is not None else None,
                workers=workers,
                scheduler=scheduler,
                stopper=stop,
                chunk=chunk,
                worker_timeout=worker_timeout,
            )
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


def _sweep_stopped(
    model: str,
    joint: Any,
    rows: list[dict[str, Any]],
    cols: list[str],
    key_texts: list[str],
    total: int,
    stream: Any,
    outcome: Any,
) -> NoReturn:
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


def _sweep_print(
    rows: list[dict[str, Any]],
    cols: list[str],
    key_texts: list[str],
    units: str,
    stream: Any,
    outcome: Any,
) -> None:
    from plyshear.sweep import output as so

    if stream is None:
        click.echo(so.text(rows, cols, key_texts, units))
    else:
        resumed = f" ({outcome.skipped} from the earlier run)" if outcome.skipped else ""
        click.echo(f"{len(rows)} cases written to {stream.path}{resumed}", err=True)
        click.echo(so.summary(rows))
        click.echo(so.units_line(units))
    if outcome.deaths:
        click.echo(
            f"warning: {outcome.deaths} worker process(es) died and were replaced; "
            f"a chunk one was running ran again ({outcome.lost} cases lost after a "
            "second death are error rows)",
            err=True,
        )


def _sweep_exit(rows: list[dict[str, Any]], outcome: Any) -> int:
    """0: every case passes; 1: a case fails or has an error; 3: cases lost to faults."""
    if outcome.lost:
        return EXIT_FAULT
    if any(r.get("error") or r.get("passes") is False for r in rows):
        return EXIT_FAILS
    return 0


def _sweep_chart(
    model: str,
    target: Any,
    response: str,
    x_key: str | None,
    series: str | None,
    keys: list[Any],
    cases: list[list[Any]],
    capacity: str,
    no_check: bool,
    planes: int,
) -> tuple[str, str | None, list[str]] | None:
    """Check the chart's options before the long part; return (x, series, other keys)."""
    if target is None:
        return None
    from plyshear.report.sweepplot import response_dimension

    where = f"{model}: sweep: --response {response}"
    if response_dimension(response) is None:
        fail(
            f"{model}: sweep: --response {response!r} cannot be plotted; use utilization, "
            "max_shear, max_moment, capacity_elastic, capacity_nonlinear, capacity_collapse, "
            "capacity_plastic, "
            "efficiency_nonlinear or shear_plane_N"
        )
    if response == "utilization" and no_check:
        fail(f"{where} needs the check (drop --no-check)")
    if response == "capacity_elastic" and capacity == "none":
        fail(f"{where} needs --capacity elastic or full")
    if (
        response
        in ("capacity_nonlinear", "capacity_collapse", "capacity_plastic", "efficiency_nonlinear")
        and capacity != "full"
    ):
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
            fail(f"{model}: sweep: {k} has array values; plot against another key (--x, --series)")
    return x, ser, [k for k in rest if k != ser]


@main.command("report")
@click.argument("model", type=click.Path(dir_okay=False))
@click.option(
    "-o",
    "--output",
    type=click.Path(dir_okay=False),
    required=True,
    help="The report file: .html (self-contained) or .pdf.",
)
@click.option("--force", is_flag=True, help="Replace an existing report.")
@click.option(
    "--combination",
    default=None,
    metavar="NAME",
    help="Report one load combination (default, where the model has load cases: "
    "the check's governing combination).",
)
@click.option(
    "--paper",
    type=click.Choice(["letter", "a4"]),
    default=None,
    help="Paper of the PDF (default: US Letter for kip-in models, A4 otherwise).",
)
def report_cmd(
    model: str, output: str, force: bool, combination: str | None, paper: str | None
) -> None:
    """Write the calculation report of MODEL: model, loads, diagrams, check, capacity.

    The PDF is typeset with a title block on every page (the model's project, job,
    subject, prepared_by, checked_by, revision and date keys) and page numbers.
    """
    path = Path(output)
    kind = path.suffix.lower()
    if kind not in (".html", ".htm", ".pdf"):
        fail(f"{output}: the report must be a .html or .pdf file")
    if paper is not None and kind != ".pdf":
        fail(f"{output}: --paper applies to a .pdf report only")
    if kind == ".pdf":
        from plyshear.report.extras import require

        _extra(lambda: require("typst", "pdf"))
    if path.exists() and not force:
        fail(f"{output}: exists; use --force to replace it")
    joint = _pick(_load(model), combination)
    if joint.has_cases and combination is None:
        joint = _governing_joint(joint, "report")
    sol = _solve(joint)  # refuses a bad joint with the one-line error before the long part
    from plyshear.report import document

    try:
        data = _guard(lambda: document.build(sol))
    except ValueError as exc:
        fail(f"{model}: report: {exc}")
    payload = document.to_pdf(data, paper) if kind == ".pdf" else document.to_html(data).encode()
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
    click.echo(
        f"ok: {model}: {len(joint.plies)} plies, {planes} planes{row}, "
        f"units {joint.units}, check {joint.check.standard}"
    )
    if joint.has_cases:
        from plyshear.report.combinations_text import loads_text

        click.echo(f"{len(joint.cases)} load cases, {len(joint.combinations)} combinations")
        click.echo(loads_text(joint))
    for w in sanity.warnings(joint):
        click.echo(f"warning: {w}")
    for note in sanity.notes(joint):
        click.echo(f"note: {note}")


@main.command("demo")
@click.option("--json", "as_json", is_flag=True, help="Print the JSON result.")
@click.option(
    "--copy",
    "copy_to",
    type=click.Path(file_okay=False),
    default=None,
    metavar="DIR",
    help="Copy the example model files shipped with plyshear into "
    "DIR (made if missing) instead of solving.",
)
@click.option("--force", is_flag=True, help="With --copy: replace files of the same name.")
def demo_cmd(as_json: bool, copy_to: str | None, force: bool) -> None:
    """Solve a packaged example: a three-leg fork pinned to a two-plate lug."""
    from importlib import resources

    if copy_to is not None:
        _copy_examples(Path(copy_to), force)
        return
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
    click.echo(
        f"\nThe model file is {DEMO_MODEL}, one of the examples shipped with plyshear. "
        "Copy them out with `plyshear demo --copy examples`, then try `plyshear solve "
        f"examples/{DEMO_MODEL}`."
    )


def _copy_examples(target: Path, force: bool) -> None:
    """Write every packaged example into ``target``; refuse to replace one without --force."""
    from importlib import resources

    files = sorted(
        (f for f in (resources.files("plyshear") / "models").iterdir() if f.name.endswith(".toml")),
        key=lambda f: f.name,
    )
    clash = [f.name for f in files if (target / f.name).exists()]
    if clash and not force:
        fail(f"{target}: {', '.join(clash)} exist(s); use --force to replace")
    try:
        target.mkdir(parents=True, exist_ok=True)
    except OSError as exc:
        fail(f"{target}: cannot make the folder ({exc.strerror or exc})")
    for f in files:
        write_atomic(target / f.name, f.read_bytes(), force)
    click.echo(
        f"{len(files)} example models copied to {target}: " + ", ".join(f.name for f in files)
    )


DEMO_MODEL = "fork-four-planes.toml"


def _with_source(joint: Any, source: str) -> Any:
    import dataclasses

    return dataclasses.replace(joint, source=source)


if __name__ == "__main__":  # pragma: no cover
    main()
