"""The analysis beside the document: the only place in app/ that calls core's pipeline.

It listens to the document, analyses the section at once (the canvas draws clipped plies
and the neutral axis from it) and the whole member shortly after (debounced), and
publishes both. Canvas, panels, plots and tables only draw what it publishes.

It also holds the station chosen on the elevation (None: the full section). On a member
whose plies stop short of its ends the station picks a segment: the canvas then draws
only that segment's plies, and the stress plot its section under its own actions.

The beam part of an evaluation (mesh and load cases) is kept in a core ``Evaluator``
while only the plies change; any other edit builds a new one.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import QObject, QTimer, Signal

from plystack.app.document import Document
from plystack.app.elevation_model import segment_at
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Project
from plystack.core.pipeline import Analysis, Evaluator
from plystack.core.section.segments import Segment, is_stepped, segments_of
from plystack.core.section.transformed import Section


def _same_apart_from_plies(a: Project, b: Project) -> bool:
    if a.library is not b.library:
        return False
    return replace(a, plies=()) == replace(b, plies=())


class AnalysisModel(QObject):
    """Latest section and analysis of the document's project.

    Signals:
        section_changed: the section of the current plies (or None) is ready.
        analysis_changed: the full analysis (or None, with ``error`` set) is ready.
        station_changed: another station (or none) was chosen.

    """

    section_changed = Signal()
    analysis_changed = Signal()
    station_changed = Signal()

    def __init__(self, document: Document, delay_ms: int = 15):
        super().__init__()
        self.document = document
        self.section: Section | None = None
        self.section_error: str | None = None
        self.analysis: Analysis | None = None
        self.error: str | None = None
        self._evaluator: Evaluator | None = None
        self.station: float | None = None
        self._timer = QTimer(self)
        self._timer.setSingleShot(True)
        self._timer.setInterval(delay_ms)
        self._timer.timeout.connect(self.recompute)
        document.changed.connect(self._on_change)
        self._update_section()

    def _evaluator_for(self, project: Project) -> Evaluator:
        ev = self._evaluator
        if ev is None or not _same_apart_from_plies(ev.project, project):
            ev = Evaluator(project)
            self._evaluator = ev
        return ev

    def _on_change(self) -> None:
        beam = self.document.project.beam
        if self.station is not None and (beam is None
                                         or not 0 <= self.station <= beam.layout.length):
            self.station = None  # another member (a file opened): the full section
            self.station_changed.emit()
        self._update_section()
        self._timer.start()

    def _update_section(self) -> None:
        project = self.document.project
        self.section, self.section_error = None, None
        if project.plies:
            try:
                self.section = self._evaluator_for(project).section(project.plies)
            except ProjectError as exc:
                self.section_error = "\n".join(str(p) for p in exc.problems)
            except Exception as exc:
                self.section_error = f"The section could not be analysed ({exc})"
        self.section_changed.emit()

    def recompute(self) -> None:
        """Analyse the current project now and publish the result."""
        self._timer.stop()
        project = self.document.project
        self.analysis, self.error = None, None
        try:
            ev = self._evaluator_for(project)
            if self.section is not None and self.section.plies == project.plies:
                self.analysis = ev.analyse_sections(project.plies, self.section)
            else:
                self.analysis = ev.analyse(project.plies)
        except ProjectError as exc:
            self.error = "\n".join(str(p) for p in exc.problems)
        except Exception as exc:
            self.error = f"The computation failed: {exc}"
        self.analysis_changed.emit()

    def analyse(self, project: Project) -> Analysis:
        """The analysis of another project (an alternative), reusing the beam when it can."""
        return self._evaluator_for(project).analyse(project.plies)

    # --- the station chosen on the elevation ----------------------------------------------

    def set_station(self, x: float | None) -> None:
        """Show the section at ``x`` (m from the left end); None: the full section."""
        if x == self.station:
            return
        self.station = x
        self.station_changed.emit()

    def shown_segment(self) -> Segment | None:
        """The segment at the station, on a member whose plies stop short of its ends
        (None: the full section is shown).
        """
        project = self.document.project
        if self.station is None or project.beam is None or not project.plies:
            return None
        length = project.beam.layout.length
        if not is_stepped(project.plies, length):
            return None
        try:
            return segment_at(segments_of(project.plies, length, project.display_units),
                              self.station)
        except ProjectError:
            return None  # a stretch without plies: the analysis names it

    def shown_plies(self) -> tuple[int, ...] | None:
        """Indices of the plies drawn on the canvas (None: all of them)."""
        seg = self.shown_segment()
        return None if seg is None else seg.plies

    def shown_section(self) -> Section | None:
        """The section of the shown segment from the latest analysis, where that analysis
        is of the current plies (None: not available yet, or the full section is shown).
        """
        seg = self.shown_segment()
        found = self._segment_result(seg)
        return None if found is None else found.section

    def shown_analysis(self) -> Analysis | None:
        """The analysis the stress plot shows: the shown segment's section and actions
        (its extremes within the segment), else the member's.
        """
        found = self._segment_result(self.shown_segment())
        if found is None or self.analysis is None:
            return self.analysis
        return replace(self.analysis, section=found.section, beam=found.beam)

    def _segment_result(self, seg: Segment | None):  # type: ignore[no-untyped-def]
        a = self.analysis
        if seg is None or a is None or a.project.plies != self.document.project.plies:
            return None
        tol = 1e-12 * max(seg.end, 1.0)
        return next((r for r in a.segments if r.plies == seg.plies
                     and abs(r.start - seg.start) <= tol and abs(r.end - seg.end) <= tol),
                    None)
