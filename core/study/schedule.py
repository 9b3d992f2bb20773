"""A member schedule: many members, each the full pipeline, summarised one row each.

This module holds what does not depend on files: the verdict of one member (OK, NOT OK
or INCOMPLETE), its summary (governing check, largest deflection ratio, plates, fasteners,
mass), and the runner that evaluates independent rows in parallel processes. Reading the
schedule, applying its overrides to a project file and writing results live in
``core/io/schedule_file.py``; the PDF binder in ``core/report/schedule_pdf.py``.
"""

from __future__ import annotations

import os
from collections.abc import Callable, Iterable, Mapping, Sequence
from concurrent.futures import ProcessPoolExecutor
from concurrent.futures.process import BrokenProcessPool
from dataclasses import dataclass
from typing import Any, TypeVar

from ..design.check import SERVICEABILITY_IDS, Check, governing
from ..model.errors import Problem
from ..model.units import fmt, sig, to_display
from ..pipeline import Analysis

OK = "OK"
NOT_OK = "NOT OK"
INCOMPLETE = "INCOMPLETE"
VERDICTS = (OK, NOT_OK, INCOMPLETE)

#: Warnings that do not mean a required check was left out: a ply clipped away carries
#: nothing (the rest is checked as drawn); steel reaching the supports without bearing
#: data leaves the whole reaction on the timber (conservative for the timber bearing
#: check). Every other warning (skipped strength checks, a material without design
#: values, a connector without its value, a ply connected to nothing, self-weight left
#: out) makes the member INCOMPLETE, and so does any warning this list does not know.
INFORMATIONAL_WARNINGS = ("is clipped away completely", "has no bearing data")

#: Display unit of a member's total mass (1 lb = 0.45359237 kg exactly).
MASS_UNITS = {"US": ("lb", 1 / 0.45359237), "SI": ("kg", 1.0)}


@dataclass(frozen=True)
class RowProblem:
    """A named problem of one schedule row.

    Attributes:
        row: line of the schedule file where the row starts (1 = first line).
        column: the column at fault, None where no single column is.
        message: what is wrong, in plain words (may start with the project path).

    """

    row: int
    column: str | None
    message: str

    def __str__(self) -> str:
        where = f"row {self.row}" + (f", column {self.column}" if self.column else "")
        return f"{where}: {self.message}"

    def within_row(self) -> str:
        """The problem without its row number (for a cell of that row)."""
        return f"column {self.column}: {self.message}" if self.column else self.message

    def to_dict(self) -> dict[str, Any]:
        """The problem as a JSON object."""
        return {"row": self.row, "column": self.column, "message": self.message}


@dataclass(frozen=True)
class PlateSummary:
    """A steel ply of the member (SI)."""

    name: str
    material: str
    width: float
    height: float


@dataclass(frozen=True)
class FastenerSummary:
    """The fasteners the connection checks ask for, per plate or interface (SI).

    Attributes:
        kind: "bolts" or the connector type (screw, nail, ...).
        where: the plate (bolts) or the plies of the interface (connectors).
        diameter: bolt diameter, m; None for connectors.
        rows: fasteners at each location (bolts) or per row (connectors).
        spacing: spacing along the member, m.
        count: fasteners along the member, None where not a count.

    """

    kind: str
    where: str
    diameter: float | None
    rows: int | None
    spacing: float | None
    count: int | None


@dataclass(frozen=True)
class MemberSummary:
    """One member's line of the schedule (SI).

    Attributes:
        verdict: OK, NOT OK or INCOMPLETE.
        reasons: why the member is INCOMPLETE (empty otherwise).
        warnings: every warning of the analysis.
        governing: id, ply, combination and ratio of the governing check, or None.
        deflection: id and ratio of the deflection check with the largest ratio, or None.
        plates: the steel plies.
        fasteners: bolts per plate and connectors per interface.
        mass_per_length: kg/m.
        length: member length, m (0 without a beam).
        display_units: "US" or "SI" (of the project).

    """

    verdict: str
    reasons: tuple[str, ...]
    warnings: tuple[str, ...]
    governing: tuple[str, str | None, str | None, float] | None
    deflection: tuple[str, float] | None
    plates: tuple[PlateSummary, ...]
    fasteners: tuple[FastenerSummary, ...]
    mass_per_length: float
    length: float
    display_units: str

    @property
    def mass(self) -> float:
        """Mass of the member, kg."""
        return self.mass_per_length * self.length


@dataclass(frozen=True, eq=False)
class MemberResult:
    """The outcome of one schedule row.

    Attributes:
        row: line of the schedule file where the row starts.
        mark: the member mark.
        base: the base project file as written in the schedule.
        alternative: the alternative of the base chosen, or None.
        verdict: OK, NOT OK or INCOMPLETE (a row that could not run is INCOMPLETE).
        problems: why the row could not run (empty when it ran).
        summary: the member's summary, None when the row could not run.
        check: the ``check --json`` object of the member, where asked for.
        sheet: the member's calculation sheet (file name), where written.
        sheet_pages: pages of that sheet.

    """

    row: int
    mark: str
    base: str
    alternative: str | None
    verdict: str
    problems: tuple[RowProblem, ...] = ()
    summary: MemberSummary | None = None
    check: Mapping[str, Any] | None = None
    sheet: str | None = None
    sheet_pages: int = 0

    @property
    def ran(self) -> bool:
        """True when the member was analysed."""
        return self.summary is not None


def unmade_checks(warnings: Iterable[Problem]) -> tuple[str, ...]:
    """The warnings that mean a required check was not made (see INFORMATIONAL_WARNINGS)."""
    return tuple(str(w) for w in warnings
                 if not any(marker in w.message for marker in INFORMATIONAL_WARNINGS))


def derived_verdict(checks: Sequence[Check], warnings: Iterable[Problem]
                    ) -> tuple[str, tuple[str, ...]]:
    """OK, NOT OK or INCOMPLETE from the checks and warnings, with the reasons for
    INCOMPLETE. A failing check makes the member NOT OK even where other checks are
    missing; no checks at all, or a warning of a check not made, make it INCOMPLETE.
    """
    if not checks:
        return INCOMPLETE, ("no design checks: the project needs a beam with loads",)
    if not all(c.ok for c in checks):
        return NOT_OK, ()
    reasons = unmade_checks(warnings)
    return (INCOMPLETE, reasons) if reasons else (OK, ())


def reported_verdict(value: Any) -> str | None:
    """A verdict reported by the analysis output (``"verdict"`` of ``check --json``),
    read as OK, NOT OK or INCOMPLETE; None where absent or not one of them.
    """
    if isinstance(value, Mapping):
        value = next((value[k] for k in ("verdict", "status", "value") if k in value), None)
    if not isinstance(value, str):
        return None
    text = " ".join(value.replace("_", " ").replace("-", " ").upper().split())
    return text if text in VERDICTS else None


def summarise_member(a: Analysis, reported: Any = None) -> MemberSummary:
    """The schedule line of one analysis. ``reported`` is the verdict the analysis output
    gives (``check --json``'s ``"verdict"``), used where it is one of the three.
    """
    verdict, reasons = derived_verdict(a.checks, a.warnings)
    outside = reported_verdict(reported)
    if outside is not None:
        verdict = outside
        reasons = unmade_checks(a.warnings) if outside == INCOMPLETE else ()
    gov = governing(a.checks)
    deflections = [c for c in a.checks if c.id in SERVICEABILITY_IDS]
    worst = governing(deflections)
    plates = tuple(PlateSummary(p.name, m.id, p.width, p.height)
                   for p, m in zip(a.section.plies, a.section.materials, strict=True)
                   if m.kind == "steel")
    length = a.beam.spec.layout.length if a.beam is not None else 0.0
    return MemberSummary(
        verdict=verdict, reasons=reasons, warnings=tuple(str(w) for w in a.warnings),
        governing=None if gov is None else (gov.id, gov.ply, gov.combination, gov.ratio),
        deflection=None if worst is None else (worst.id, worst.ratio),
        plates=plates, fasteners=fasteners_of(a), mass_per_length=a.section.mass_per_length,
        length=length, display_units=a.project.display_units)


def fasteners_of(a: Analysis) -> tuple[FastenerSummary, ...]:
    """Bolts per plate and connectors per interface, as the checks lay them out (the
    spacing of one plate's bolts is the same in every combination).
    """
    out: dict[tuple[str, str], FastenerSummary] = {}
    for c in a.checks:
        if c.id not in ("bolts", "connectors") or c.fasteners is None:
            continue
        f = c.fasteners
        kind = "bolts" if c.id == "bolts" else a.design.connector.type
        key = (kind, c.ply or "")
        if key not in out:
            out[key] = FastenerSummary(kind, c.ply or "",
                                       a.design.bolt.diameter if c.id == "bolts" else None,
                                       f.rows, f.spacing, f.count)
    return tuple(out.values())


def plates_text(s: MemberSummary) -> str:
    """The steel plies in display units, e.g. "flitch plate A36 0.375 x 8.750 in"."""
    if not s.plates:
        return "none"
    u = s.display_units
    return "; ".join(f"{p.name} {p.material} {sig(to_display(p.width, 'length', u), 3)} x "
                     f"{fmt(p.height, 'length', u)}" for p in s.plates)


def fasteners_text(s: MemberSummary) -> str:
    """Bolts and connectors in display units, e.g. "flitch plate: 0.5 in bolts, 2 per
    location every 24 in (12)".
    """
    if not s.fasteners:
        return "none"
    u = s.display_units
    parts = []
    for f in s.fasteners:
        size = f" {fmt(f.diameter, 'length', u, 3)}" if f.diameter is not None else ""
        every = f" every {fmt(f.spacing, 'length', u, 3)}" if f.spacing is not None else ""
        per = " per location" if f.kind == "bolts" else " per row"
        count = f" ({f.count})" if f.count is not None else ""
        parts.append(f"{f.where}:{size} {f.kind}, {f.rows or 1}{per}{every}{count}")
    return "; ".join(parts)


def mass_text(s: MemberSummary) -> str:
    """The member's mass in display units (lb or kg)."""
    label, factor = MASS_UNITS[s.display_units]
    return f"{sig(s.mass * factor, 4)} {label}"


def default_jobs() -> int:
    """The number of CPUs this process may use."""
    try:
        return max(1, len(os.sched_getaffinity(0)))
    except (AttributeError, OSError):
        return max(1, os.cpu_count() or 1)


J = TypeVar("J")
R = TypeVar("R")


def run_rows(worker: Callable[[J], R], jobs: Sequence[J], processes: int = 1,
             progress: Callable[[], None] | None = None) -> list[R]:
    """``worker`` on every job, results in the order of the jobs.

    Args:
        worker: a module-level function (it is sent to other processes by name).
        jobs: independent jobs; each must be picklable when ``processes`` > 1.
        processes: 1 runs in this process; more uses a ProcessPoolExecutor.
        progress: called once per finished job.

    """
    processes = max(1, min(processes, len(jobs)))
    out: list[R] = []
    if processes == 1:
        for job in jobs:
            out.append(worker(job))
            if progress is not None:
                progress()
        return out
    chunk = max(1, min(16, len(jobs) // (processes * 8)))
    try:
        with ProcessPoolExecutor(max_workers=processes) as pool:
            for result in pool.map(worker, jobs, chunksize=chunk):
                out.append(result)
                if progress is not None:
                    progress()
    except (BrokenProcessPool, OSError):
        # A worker process died (or the system cannot start one): the rows are run
        # again here, where a fault is that row's own named problem.
        return out + run_rows(worker, jobs[len(out):], 1, progress)
    return out


def exit_status(results: Sequence[MemberResult]) -> int:
    """0 when every row ran and is OK (its sheet written where asked); 1 when any is
    NOT OK, INCOMPLETE, did not run or has a problem.
    """
    return 0 if results and all(r.ran and r.verdict == OK and not r.problems
                                for r in results) else 1
