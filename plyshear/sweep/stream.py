"""Result files that grow as long work runs, survive its end, and resume it.

``OUTPUT`` is reserved before the first case runs: created empty and exclusively
(``O_EXCL``), so a missing or read-only folder, or a second run on the same new
path, is an error at once and exactly one run wins. Rows are appended to
``OUTPUT.partial`` as chunks finish, whole rows per write, flushed and fsynced;
the partial file is locked while a run writes it. When the work completes the
rows are sorted by case into a temporary file that is renamed onto ``OUTPUT``.

A run that is stopped or killed leaves ``OUTPUT`` (empty) and ``OUTPUT.partial``;
``--resume`` reads the rows the partial (or a complete ``OUTPUT``) holds, skips
their cases by their keys, and appends the rest. A killed write can leave a last
row cut short: it is dropped on resume.

What made the rows (the model file's content hash and the options that change a
row: the sweep's ``--capacity`` and check, the scatter's seed and sample count) is
recorded beside the output in ``OUTPUT.run.json``; ``--resume`` refuses, in one
line naming what differs, an output whose record does not match this run. Rows
whose chunk could not run (a worker died twice) are faults, not results: a
resume runs their cases again and the sorted output keeps the new rows.
"""

from __future__ import annotations

import contextlib
import csv
import errno
import hashlib
import json
import os
from collections import Counter
from collections.abc import Callable, Sequence
from pathlib import Path
from typing import Any

from plyshear.sweep.output import to_csv, to_jsonl

try:
    import fcntl
except ImportError:  # pragma: no cover - not POSIX: no lock, the O_EXCL reservation stays
    fcntl = None  # type: ignore[assignment]

PARTIAL = ".partial"
#: The record of what made an output, beside it.
RECORD = ".run.json"
FORMATS = {".csv": "csv", ".jsonl": "jsonl", ".ndjson": "jsonl"}


class OutputError(Exception):
    """An output that cannot be reserved, resumed or written; one line naming the file."""


def case_key(names: Sequence[str], values: Sequence[Any]) -> str:
    """A stable key of one case: a hash of its varied keys and values (16 hex digits).

    The same values under the same keys give the same key in any run, whatever the
    case's number or the order of the keys.
    """
    pairs = sorted(zip(names, (_canonical(v) for v in values), strict=True))
    text = json.dumps(pairs, separators=(",", ":"), allow_nan=True)
    return hashlib.sha256(text.encode("utf-8")).hexdigest()[:16]


def _canonical(value: Any) -> Any:
    if isinstance(value, float) and value.is_integer():
        return int(value)  # 20 and 20.0 are one case
    if isinstance(value, list):
        return [_canonical(v) for v in value]
    return value


class Stream:
    """An output file written row by row (see the module docstring).

    Args:
        path: The output file (``.csv`` or ``.jsonl``).
        cols: Its columns; one of them is ``key_col``.
        key_col: The column holding each row's case key.
        force: Replace an existing output when the run completes.
        resume: Continue the rows of an earlier run.
        record: What made the rows (label → value, JSON-able), written beside the
            output and checked on resume; None: not recorded, not checked.
        redo: Given a row, True if it is a fault to run again on resume.
        what: The kind of run, for messages ("sweep", "scatter").
    """

    def __init__(
        self,
        path: Path,
        cols: Sequence[str],
        key_col: str = "case_key",
        force: bool = False,
        resume: bool = False,
        record: dict[str, Any] | None = None,
        redo: Callable[[dict[str, Any]], bool] | None = None,
        what: str = "sweep",
    ) -> None:
        self.path = path
        self.partial = path.with_name(path.name + PARTIAL)
        self.record_path = path.with_name(path.name + RECORD)
        self.record = record
        self.redo = redo
        self.what = what
        self.cols = list(cols)
        self.key_col = key_col
        self.fmt = FORMATS[path.suffix.lower()]
        self.force = force
        self.resume = resume
        self.done: Counter[str] = Counter()
        self.rows_written = 0
        self._fd: int | None = None
        self._reserved = False
        self._from_complete = False
        self._appended = 0

    # -- opening ------------------------------------------------------------

    def open(self) -> None:
        """Reserve the output and open the partial file; read done rows on resume.

        Raises:
            OutputError: The folder is missing or not writable, the output exists
                (without ``--force`` or ``--resume``), another run writes it, or the
                rows to resume were written with other columns.
        """
        folder = self.path.parent if str(self.path.parent) else Path(".")
        if not folder.is_dir():
            raise OutputError(f"{self.path}: folder {folder} does not exist")
        complete = self._complete_rows() if self.resume else None
        earlier = self.resume and (complete is not None or self._partial_has_rows())
        if earlier:
            self._check_record()
        self._reserve()
        self._open_partial(complete)
        if not earlier:
            self._write_record()

    def _partial_has_rows(self) -> bool:
        try:
            return self.partial.stat().st_size > len(self._header())
        except OSError:
            return False

    def _check_record(self) -> None:
        """Refuse to resume rows that another model file or other options made."""
        if self.record is None:
            return
        try:
            earlier = json.loads(self.record_path.read_text(encoding="utf-8")).get("run")
        except (OSError, ValueError, AttributeError):
            earlier = None
        if not isinstance(earlier, dict):
            raise OutputError(
                f"{self.path}: no record of the run that wrote it "
                f"({self.record_path.name} is missing or unreadable); "
                "use --force to start again"
            )
        changed = [k for k in self.record if earlier.get(k) != self.record[k]]
        changed += [k for k in earlier if k not in self.record]
        if changed:
            raise OutputError(
                f"{self.path}: written by a {self.what} with a different "
                f"{', '.join(changed)}; resume with the same, or use --force"
            )

    def _write_record(self) -> None:
        if self.record is None:
            return
        tmp = self.record_path.with_name(f".{self.record_path.name}{PARTIAL}")
        text = (
            json.dumps({"format": 1, "output": self.path.name, "run": self.record}, indent=2) + "\n"
        )
        try:
            tmp.write_text(text, encoding="utf-8")
            os.replace(tmp, self.record_path)
        except OSError as exc:
            with contextlib.suppress(OSError):
                tmp.unlink()
            self.discard()  # nothing ran: what this run created goes
            raise OutputError(f"{self.record_path}: cannot write ({exc.strerror or exc})") from None

    def _complete_rows(self) -> list[str] | None:
        """The records of a complete output to resume from (None: no such output)."""
        try:
            if self.partial.exists() or self.path.stat().st_size == 0:
                return None
        except FileNotFoundError:
            return None
        return self._records(self.path.read_bytes(), self.path)

    def _reserve(self) -> None:
        try:
            fd = os.open(self.path, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o666)
        except FileExistsError:
            if not (self.force or self.resume):
                raise OutputError(
                    f"{self.path}: exists; use --force to replace it, or "
                    f"--resume to continue the {self.what} that wrote it"
                ) from None
            return
        except OSError as exc:
            raise OutputError(
                f"{self.path}: cannot create the file ({exc.strerror or exc})"
            ) from None
        os.close(fd)
        self._reserved = True

    def _open_partial(self, complete: list[str] | None) -> None:
        try:
            fd = os.open(self.partial, os.O_RDWR | os.O_CREAT, 0o666)
        except OSError as exc:
            self._unreserve()
            raise OutputError(
                f"{self.partial}: cannot create the file ({exc.strerror or exc})"
            ) from None
        if fcntl is not None:
            try:
                fcntl.flock(fd, fcntl.LOCK_EX | fcntl.LOCK_NB)
            except OSError:
                os.close(fd)
                self._unreserve()
                raise OutputError(
                    f"{self.path}: another run is writing it ({self.partial} is locked)"
                ) from None
        self._fd = fd
        try:
            if self.resume and complete is None:
                self._read_partial()
            else:
                os.ftruncate(fd, 0)
                self._write_all(self._header())
                if complete:
                    self._write_all("".join(complete).encode("utf-8"))
                    self._count(complete)
                    self._from_complete = True
            os.fsync(fd)
        except OSError as exc:
            self.close()
            raise OutputError(f"{self.partial}: cannot write ({exc.strerror or exc})") from None

    def _read_partial(self) -> None:
        assert self._fd is not None
        size = os.fstat(self._fd).st_size
        raw = os.pread(self._fd, size, 0) if size else b""
        if not raw:
            self._write_all(self._header())
            return
        cut = raw.rfind(b"\n") + 1  # a row cut short by a killed write is dropped
        if cut < len(raw):
            os.ftruncate(self._fd, cut)
        records = self._records(raw[:cut], self.partial)
        self._count(records)
        os.lseek(self._fd, 0, os.SEEK_END)

    def _header(self) -> bytes:
        return to_csv([], self.cols).encode("utf-8") if self.fmt == "csv" else b""

    def _records(self, raw: bytes, where: Path) -> list[str]:
        """Split a file's text into its rows (after checking a CSV header)."""
        text = raw.decode("utf-8", errors="replace")
        if self.fmt == "csv":
            head, _, body = text.partition("\n")
            if head and next(csv.reader([head])) != self.cols:
                raise OutputError(
                    f"{where}: written by a sweep with other columns; resume "
                    "with the same model, keys and options, or use --force"
                )
            return [line + "\n" for line in body.split("\n") if line]
        return [line + "\n" for line in text.split("\n") if line.strip()]

    def _count(self, records: list[str]) -> None:
        for rec in records:
            row = self._parse(rec)
            if self.fmt == "jsonl" and sorted(row) != sorted(self.cols):
                raise OutputError(
                    f"{self.partial}: written by a sweep with other columns; "
                    "resume with the same model, keys and options, or use "
                    "--force"
                )
            key = row.get(self.key_col)
            if key and not (self.redo is not None and self.redo(row)):
                self.done[str(key)] += 1
                self.rows_written += 1

    def _parse(self, record: str) -> dict[str, Any]:
        if self.fmt == "csv":
            return dict(zip(self.cols, next(csv.reader([record.rstrip("\n")])), strict=False))
        try:
            return json.loads(record)
        except ValueError:
            return {}

    def take_done(self, key: str) -> bool:
        """True (and counted off) if a row of this case key is already written."""
        if self.done[key] > 0:
            self.done[key] -= 1
            return True
        return False

    # -- writing ------------------------------------------------------------

    def append(self, rows: Sequence[dict[str, Any]]) -> None:
        """Append whole rows, flushed and fsynced.

        Raises:
            OutputError: The disk is full or the write fails; the file keeps every
                row written before.
        """
        if not rows or self._fd is None:
            return
        text = (
            to_csv(rows, self.cols).split("\n", 1)[1]
            if self.fmt == "csv"
            else to_jsonl(rows, self.cols)
        )
        end = os.lseek(self._fd, 0, os.SEEK_END)
        try:
            self._write_all(text.encode("utf-8"))
            os.fsync(self._fd)
        except OSError as exc:
            with contextlib.suppress(OSError):
                os.ftruncate(self._fd, end)  # no row cut short
            full = exc.errno in (errno.ENOSPC, errno.EDQUOT)
            what = "the disk is full" if full else f"cannot write ({exc.strerror or exc})"
            raise OutputError(
                f"{self.partial}: {what}; the {self.rows_written} rows written so far are kept"
            ) from None
        self.rows_written += len(rows)
        self._appended += len(rows)

    def _write_all(self, data: bytes) -> None:
        assert self._fd is not None
        view = memoryview(data)
        while view:
            n = os.write(self._fd, view)
            view = view[n:]

    def finish(self, case_col: str = "case") -> None:
        """Sort the rows by case into a temporary file, rename it onto the output.

        Raises:
            OutputError: If the output cannot be written (the partial file stays).
        """
        assert self._fd is not None
        if self._from_complete and not self._appended:  # resumed a finished run: a no-op
            with contextlib.suppress(OSError):
                self.partial.unlink()
            self.close()
            return
        size = os.fstat(self._fd).st_size
        records = self._without_redone(self._records(os.pread(self._fd, size, 0), self.partial))
        records.sort(key=lambda r: _number(self._parse(r).get(case_col)))
        tmp = self.path.with_name(f".{self.path.name}.sorted{PARTIAL}")
        try:
            with open(tmp, "wb") as fh:
                fh.write(self._header())
                fh.write("".join(records).encode("utf-8"))
                fh.flush()
                os.fsync(fh.fileno())
            os.replace(tmp, self.path)
        except OSError as exc:
            with contextlib.suppress(OSError):
                tmp.unlink()
            raise OutputError(
                f"{self.path}: cannot write ({exc.strerror or exc}); the rows "
                f"are kept in {self.partial}"
            ) from None
        with contextlib.suppress(OSError):
            self.partial.unlink()
        self.close()
        _sync_folder(self.path)

    def _without_redone(self, records: list[str]) -> list[str]:
        """Drop the fault rows of cases that a later run wrote again (keep the last fault)."""
        if self.redo is None:
            return records
        parsed = [self._parse(r) for r in records]
        keys = [str(p.get(self.key_col)) for p in parsed]
        faults = [self.redo(p) for p in parsed]
        solved = {k for k, f in zip(keys, faults, strict=True) if not f}
        last = {k: i for i, (k, f) in enumerate(zip(keys, faults, strict=True)) if f}
        return [
            r
            for i, (r, k, f) in enumerate(zip(records, keys, faults, strict=True))
            if not f or (k not in solved and last[k] == i)
        ]

    def close(self) -> None:
        """Close (and unlock) the partial file; the files stay as they are."""
        if self._fd is not None:
            with contextlib.suppress(OSError):
                os.close(self._fd)
            self._fd = None

    def discard(self) -> None:
        """Remove what this run created when it ends before any row (a bad scheduler)."""
        if self.rows_written == 0 and not self.resume:
            with contextlib.suppress(OSError):
                self.partial.unlink()
            if self._reserved and self.record is not None:
                with contextlib.suppress(OSError):
                    self.record_path.unlink()
            self._unreserve()
        self.close()

    def _unreserve(self) -> None:
        if self._reserved:
            with contextlib.suppress(OSError):
                self.path.unlink()
            self._reserved = False


def _number(value: Any) -> float:
    try:
        return float(value)
    except (TypeError, ValueError):
        return float("inf")


def _sync_folder(path: Path) -> None:
    """Make a rename durable (POSIX; a no-op where folders cannot be opened)."""
    with contextlib.suppress(OSError, AttributeError):
        fd = os.open(path.parent if str(path.parent) else ".", os.O_RDONLY)
        try:
            os.fsync(fd)
        finally:
            os.close(fd)
