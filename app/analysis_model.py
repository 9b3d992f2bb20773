"""The analysis beside the document: the only place in app/ that calls core's pipeline.

It listens to the document, analyses the section at once (the canvas draws clipped plies
and the neutral axis from it) and the whole member shortly after (debounced), and
publishes both. Canvas, panels, plots and tables only draw what it publishes.

The beam part of an evaluation (mesh and load cases) is kept in a core ``Evaluator``
while only the plies change; any other edit builds a new one.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import QObject, QTimer, Signal

from plystack.app.document import Document
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Project
from plystack.core.pipeline import Analysis, Evaluator
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

    """

    section_changed = Signal()
    analysis_changed = Signal()

    def __init__(self, document: Document, delay_ms: int = 15):
        super().__init__()
        self.document = document
        self.section: Section | None = None
        self.section_error: str | None = None
        self.analysis: Analysis | None = None
        self.error: str | None = None
        self._evaluator: Evaluator | None = None
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
