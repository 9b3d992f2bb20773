"""The member schedule file (CSV) and its results (CSV or JSON).

One row per member: ``mark``, ``base`` (a project file, relative to the schedule),
optionally ``alternative`` (a ply set of the base) and override columns in the project
file's own keys, dotted (:mod:`.overrides`). Read with Python's csv module: any column
order, a header row, UTF-8 with or without a byte-order mark, lines starting with ``#``
are comments. A row's changes are made to the parsed JSON of its base and the result is
read by the project file's own reader (:func:`.project_file.from_dict`), so each value
is checked exactly as in a file and the member's results equal ``plystack check`` of a
file with the same change.
"""

from __future__ import annotations

import copy
import csv
import io
import os
import re
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from ..model.caution import CAUTION
from ..model.errors import Problem, ProjectError
from ..model.project import Project
from ..model.units import UnitError, fmt
from ..pipeline import Analysis, run
from ..study.schedule import (
    INCOMPLETE,
    MemberResult,
    MemberSummary,
    RowProblem,
    fasteners_text,
    mass_text,
    plates_text,
    summarise_member,
)
from . import overrides
from .output import check_json
from .project_file import from_dict, load_data

MARK, BASE, ALTERNATIVE = "mark", "base", "alternative"
RESERVED = (MARK, BASE, ALTERNATIVE)
#: Columns of the results CSV, in order.
RESULT_COLUMNS = ("row", "mark", "base", "alternative", "verdict", "governing_check",
                  "governing_ply", "governing_combination", "governing_ratio",
                  "deflection_check", "deflection_ratio", "plate", "bolts", "mass",
                  "mass_per_length", "problems")


class ScheduleError(ValueError):
    """The schedule file itself cannot be read (no row can run)."""

    def __init__(self, messages: list[str]):
        self.messages = list(messages)
        super().__init__("\n".join(self.messages))


@dataclass(frozen=True)
class ScheduleRow:
    """One member row: its line in the file and its non-empty cells by column."""

    row: int
    cells: tuple[tuple[str, str], ...]
    extra: tuple[str, ...] = ()

    def get(self, column: str) -> str:
        """The cell of ``column`` (empty text where empty)."""
        return next((v for c, v in self.cells if c == column), "")


@dataclass(frozen=True)
class Schedule:
    """A schedule file: where it is, its columns and its member rows."""

    path: Path
    columns: tuple[str, ...]
    rows: tuple[ScheduleRow, ...]

    @property
    def folder(self) -> Path:
        """The folder base files are relative to."""
        return self.path.parent


def read_schedule(path: str | os.PathLike[str]) -> Schedule:
    """Read a schedule file. Raises ScheduleError when it cannot be read at all."""
    p = Path(path)
    try:
        if not p.is_file():
            raise ScheduleError([f"cannot read {p}: " + ("it is a folder" if p.is_dir()
                                 else "no such file" if not p.exists()
                                 else "not a regular file")])
        text = p.read_bytes().decode("utf-8-sig")
    except OSError as exc:
        raise ScheduleError([f"cannot read {p}: {exc.strerror or exc}"]) from None
    except UnicodeDecodeError:
        raise ScheduleError([f"cannot read {p}: it is not UTF-8 text"]) from None
    return parse_schedule(text, p)


def parse_schedule(text: str, path: Path) -> Schedule:
    """The rows of a schedule's text (comments and blank lines left out)."""
    text = text.removeprefix("\ufeff")
    lines = [("\n" if line.lstrip().startswith("#") else line)
             for line in text.splitlines(keepends=True)]
    reader = csv.reader(lines, strict=True)
    header: list[str] | None = None
    rows: list[ScheduleRow] = []
    try:
        start = 1
        for record in reader:
            line = start
            start = reader.line_num + 1
            if not any(cell.strip() for cell in record):
                continue
            if header is None:
                header = _header(record)
                continue
            cells = tuple((c, v.strip()) for c, v in zip(header, record, strict=False)
                          if v.strip())
            extra = tuple(v for v in record[len(header):] if v.strip())
            rows.append(ScheduleRow(line, cells, extra))
    except csv.Error as exc:
        raise ScheduleError([f"line {reader.line_num}: not readable as CSV ({exc})"]) from None
    if header is None:
        raise ScheduleError(["has no header row (mark, base, ...)"])
    if not rows:
        raise ScheduleError(["has a header but no members"])
    return Schedule(path, tuple(header), tuple(rows))


def _header(record: list[str]) -> list[str]:
    header = [c.strip() for c in record]
    lowered = [c.lower() if c.lower() in RESERVED else c for c in header]
    problems = [f'the header has no "{c}" column' for c in (MARK, BASE) if c not in lowered]
    seen: set[str] = set()
    for c in lowered:
        if not c:
            problems.append("the header has an empty column name")
        elif c in seen:
            problems.append(f'the header has the column "{c}" twice')
        seen.add(c)
    if problems:
        raise ScheduleError(problems)
    return lowered


@dataclass(frozen=True, eq=False)
class MemberJob:
    """Everything one member needs to run in any process (picklable).

    Attributes:
        row: line of the row in the schedule.
        mark: the member mark.
        base: the base file as written in the schedule.
        alternative: the alternative chosen, or None.
        changes: (column, value) of the override columns, in header order.
        data: parsed JSON of the base file (copied before any change).
        with_check: keep the ``check --json`` object of the member.
        sheet: where to write the member's calculation sheet, or None.

    """

    row: int
    mark: str
    base: str
    alternative: str | None
    changes: tuple[tuple[str, str], ...]
    data: Any
    with_check: bool = False
    sheet: str | None = None


class RowError(ValueError):
    """A row that cannot run, with its named problems."""

    def __init__(self, problems: Sequence[RowProblem]):
        self.problems = tuple(problems)
        super().__init__("\n".join(str(p) for p in self.problems))


def prepare(schedule: Schedule, with_check: bool = False,
            sheets: Path | None = None) -> list[MemberJob | MemberResult]:
    """A job for every row that can run, and the failed result of every row that
    cannot (empty mark, unreadable or invalid base, cells beyond the header, bad keys).
    Each base file is read and checked once.
    """
    bases: dict[Path, Any] = {}
    out: list[MemberJob | MemberResult] = []
    names: set[str] = set()
    marked: dict[str, int] = {}
    for r in schedule.rows:
        mark, base, alt = r.get(MARK), r.get(BASE), r.get(ALTERNATIVE) or None
        problems = []
        if r.extra:
            problems.append(RowProblem(r.row, None, f"has {len(r.extra)} more cells than the "
                                       "header has columns"))
        problems += [RowProblem(r.row, c, "holds a control character (such as NUL); the "
                                "cell must be plain text")
                     for c, v in r.cells if any(ord(ch) < 32 and ch not in "\t" for ch in v)]
        if problems:  # a cell that is no text is not looked at further (nor echoed raw)
            out.append(failed(r.row, _printable(mark), _printable(base),
                              None if alt is None else _printable(alt), problems))
            continue
        if not mark:
            problems.append(RowProblem(r.row, MARK, "is empty; every member needs a mark"))
        elif mark in marked:
            problems.append(RowProblem(r.row, MARK, f'"{mark}" is the mark of row '
                                       f"{marked[mark]}; every member needs its own mark"))
        else:
            marked[mark] = r.row
        changes = tuple((c, v) for c, v in r.cells if c not in RESERVED)
        for column, _value in changes:
            try:
                overrides.parse_key(column)
            except overrides.OverrideError as exc:
                problems.append(RowProblem(r.row, column, f"is not a key of a project file: "
                                           f"{exc}"))
        data: Any = None
        if not base:
            problems.append(RowProblem(r.row, BASE, "is empty; give the base project file"))
        else:
            found = _base(schedule.folder / base, bases)
            if isinstance(found, ProjectError):
                problems += [RowProblem(r.row, BASE, f"{base}: {p}") for p in found.problems]
            else:
                data = found
        if problems:
            out.append(failed(r.row, mark, base, alt, problems))
            continue
        sheet = None
        if sheets is not None:
            sheet = str(sheets / _sheet_name(mark, r.row, names))
        out.append(MemberJob(r.row, mark, base, alt, changes, data, with_check, sheet))
    return out


def _printable(text: str | None) -> str:
    """``text`` with each control character written as backslash, x and two hex digits."""
    return "".join(f"\\x{ord(c):02x}" if ord(c) < 32 and c != "\t" else c
                   for c in text or "")


def _base(path: Path, cache: dict[Path, Any]) -> Any:
    """The parsed JSON of a base file, or the ProjectError of reading or checking it."""
    key = path.resolve()
    if key not in cache:
        try:
            data = load_data(path)
            from_dict(data)
            cache[key] = data
        except ProjectError as exc:
            cache[key] = exc
    return cache[key]


def _sheet_name(mark: str, row: int, taken: set[str]) -> str:
    stem = re.sub(r"[^A-Za-z0-9._-]+", "_", mark).strip("._") or f"row-{row}"
    name = f"{stem}.pdf"
    if name.lower() in taken or name.lower() == "schedule.pdf":
        name = f"{stem}-row-{row}.pdf"
    taken.add(name.lower())
    return name


def failed(row: int, mark: str, base: str, alternative: str | None,
           problems: Sequence[RowProblem]) -> MemberResult:
    """The result of a row that could not run."""
    return MemberResult(row, mark, base, alternative, INCOMPLETE, tuple(problems))


def member_data(job: MemberJob) -> tuple[dict[str, Any], dict[str, str]]:
    """The base's JSON with the row's alternative, mark and changes, and the project
    paths each column changed. Raises RowError.
    """
    data = copy.deepcopy(job.data)
    problems: list[RowProblem] = []
    paths: dict[str, str] = {}
    if job.alternative is not None:
        try:
            _choose_alternative(data, job.alternative)
        except overrides.OverrideError as exc:
            problems.append(RowProblem(job.row, ALTERNATIVE, str(exc)))
    info = data.setdefault("info", {})
    if isinstance(info, dict):
        info["member"] = job.mark
    for column, value in job.changes:
        try:
            for path in overrides.apply(data, column, value):
                paths[path] = column
        except overrides.OverrideError as exc:
            problems.append(RowProblem(job.row, column, str(exc)))
    if problems:
        raise RowError(problems)
    return data, paths


def _choose_alternative(data: dict[str, Any], name: str) -> None:
    raw = data.get("alternatives")
    alts = [a for a in raw if isinstance(a, dict)] if isinstance(raw, list) else []
    chosen = next((a for a in alts if a.get("name") == name), None)
    if chosen is None:
        listed = ", ".join(f'"{a.get("name")}"' for a in alts) or "none"
        raise overrides.OverrideError(f'"{name}" is not an alternative of the base '
                                      f"(alternatives: {listed})")
    data["plies"] = copy.deepcopy(chosen.get("plies", []))
    data["current_alternative"] = name


def _within(inner: str, outer: str) -> bool:
    """True when the project path ``inner`` is ``outer`` or lies inside it."""
    return inner == outer or (inner.startswith(outer) and inner[len(outer)] in ".[")


def column_of(path: str, paths: Mapping[str, str]) -> str | None:
    """The column whose change a problem at ``path`` is in: the most specific change that
    holds the path, else a change inside it (an unknown key the column added, such as
    ``colour`` for a column ``colour.red``).
    """
    holding = [(len(c), col) for c, col in paths.items() if _within(path, c)]
    if holding:
        return max(holding)[1]
    inside = [(len(c), col) for c, col in paths.items() if path and _within(c, path)]
    return min(inside)[1] if inside else None


def member_project(job: MemberJob) -> Project:
    """The member's project, read by the project file's reader. Raises RowError."""
    return _member(job)[0]


def _member(job: MemberJob) -> tuple[Project, dict[str, str]]:
    data, paths = member_data(job)
    try:
        return from_dict(data), paths
    except ProjectError as exc:
        raise RowError(_named(job.row, exc.problems, paths)) from None


def _named(row: int, problems: Sequence[Problem], paths: Mapping[str, str]
           ) -> list[RowProblem]:
    out = []
    for p in problems:
        column = column_of(p.path, paths)
        message = p.message if column is not None and column == p.path else str(p)
        out.append(RowProblem(row, column, message))
    return out


def analyse_job(job: MemberJob) -> tuple[MemberResult, Project | None, Analysis | None]:
    """Run one member; a row that cannot run gets its named problems, never an exception."""
    try:
        project, paths = _member(job)
        try:
            analysis = run(project)
        except ProjectError as exc:
            raise RowError(_named(job.row, exc.problems, paths)) from None
    except RowError as exc:
        return failed(job.row, job.mark, job.base, job.alternative, exc.problems), None, None
    except UnitError as exc:
        return failed(job.row, job.mark, job.base, job.alternative,
                      [RowProblem(job.row, None, str(exc))]), None, None
    described = check_json(analysis)
    summary = summarise_member(analysis, described.get("verdict"))
    result = MemberResult(job.row, job.mark, job.base, job.alternative, summary.verdict,
                          summary=summary, check=described if job.with_check else None)
    return result, project, analysis


def evaluate(job: MemberJob) -> MemberResult:
    """One member's result (the worker of ``plystack schedule`` without sheets)."""
    try:
        return analyse_job(job)[0]
    except Exception as exc:  # rows are independent: a fault in one never stops the run
        return failed(job.row, job.mark, job.base, job.alternative, [RowProblem(
            job.row, None, f"could not be analysed: an unexpected fault of the program "
            f"(please report it with this row): {exc}")])


def _ratio(value: float | None) -> str:
    return "" if value is None else f"{value:.3f}"


def result_cells(r: MemberResult) -> dict[str, str]:
    """The row of the results CSV (display units of the member's project)."""
    s: MemberSummary | None = r.summary
    gov = s.governing if s else None
    defl = s.deflection if s else None
    notes = [p.within_row() for p in r.problems] + (list(s.reasons) if s else [])
    return {
        "row": str(r.row), "mark": r.mark, "base": r.base, "alternative": r.alternative or "",
        "verdict": r.verdict,
        "governing_check": gov[0] if gov else "", "governing_ply": (gov[1] or "") if gov else "",
        "governing_combination": (gov[2] or "") if gov else "",
        "governing_ratio": _ratio(gov[3] if gov else None),
        "deflection_check": defl[0] if defl else "",
        "deflection_ratio": _ratio(defl[1] if defl else None),
        "plate": plates_text(s) if s else "", "bolts": fasteners_text(s) if s else "",
        "mass": mass_text(s) if s else "",
        "mass_per_length": "" if s is None else _mass_per_length(s),
        "problems": "; ".join(notes),
    }


def _mass_per_length(s: MemberSummary) -> str:
    return fmt(s.mass_per_length, "mass_per_length", s.display_units)


def results_csv(results: Sequence[MemberResult]) -> str:
    """The results as CSV text, with the caution as a closing comment line."""
    buffer = io.StringIO()
    writer = csv.DictWriter(buffer, fieldnames=RESULT_COLUMNS, lineterminator="\n")
    writer.writeheader()
    for r in results:
        writer.writerow(result_cells(r))
    buffer.write(f"# {CAUTION}\n")
    return buffer.getvalue()


def result_json(r: MemberResult) -> dict[str, Any]:
    """One member as ``check --json`` plus the mark and the schedule's own keys (SI)."""
    out: dict[str, Any] = {"mark": r.mark, "row": r.row, "base": r.base,
                           "alternative": r.alternative, "ran": r.ran,
                           "problems": [p.to_dict() for p in r.problems]}
    if r.check is not None:
        out.update(r.check)
    out["mark"] = r.mark
    out["verdict"] = r.verdict
    s = r.summary
    if s is not None:
        out["schedule"] = {
            "verdict": s.verdict, "incomplete_because": list(s.reasons),
            "governing": None if s.governing is None else dict(zip(
                ("id", "ply", "combination", "ratio"), s.governing, strict=True)),
            "deflection": None if s.deflection is None else {"id": s.deflection[0],
                                                             "ratio": s.deflection[1]},
            "plates": [{"name": p.name, "material": p.material, "width": p.width,
                        "height": p.height} for p in s.plates],
            "fasteners": [{"kind": f.kind, "where": f.where, "diameter": f.diameter,
                           "rows": f.rows, "spacing": f.spacing, "count": f.count}
                          for f in s.fasteners],
            "mass": s.mass, "mass_per_length": s.mass_per_length, "length": s.length}
    if r.sheet is not None:
        out["sheet"] = r.sheet
    out.setdefault("units", "SI")
    out.setdefault("caution", CAUTION)
    return out
