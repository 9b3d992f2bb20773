"""The main window: section canvas, plots, panels and results around one document.

Layout (fits 1366 x 768): on the left the ply table and the selected ply (tab "Plies")
or the beam, loads and reactions (tab "Beam / Loads"); in the middle the section canvas
beside the plots (tabs: stresses over the depth, actions along the member), under them
the elevation of the member (a click there picks the station whose section the canvas
and the stress plot show); below them the results and the alternatives.

Undo and redo (Ctrl+Z, Ctrl+Shift+Z or Ctrl+Y) act on the project wherever the focus is:
a text field with an entry not yet committed commits it first (so Ctrl+Z then takes the
entry back). Switching display units is an undoable edit: it changes how the file
writes its quantities, so it marks the project modified like any other edit.
"""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

from PySide6.QtCore import QEvent, QObject, QSettings, Qt, QTimer
from PySide6.QtGui import QAction, QCloseEvent, QKeyEvent, QKeySequence
from PySide6.QtWidgets import (
    QAbstractItemView,
    QApplication,
    QComboBox,
    QFileDialog,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QMainWindow,
    QMessageBox,
    QSplitter,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from plystack.app.alternatives import AlternativesPanel, SweepDialog
from plystack.app.analysis_model import AnalysisModel
from plystack.app.beam_panel import BeamPanel, default_beam
from plystack.app.canvas import SectionCanvas
from plystack.app.dialogs import MaterialsDialog, NewSectionDialog, SheetDialog
from plystack.app.document import Document
from plystack.app.elevation import ElevationView, segment_caption
from plystack.app.icons import app_icon
from plystack.app.plots import DiagramPlot, ProfilePlot
from plystack.app.ply_panel import PlyPanel
from plystack.app.results import ResultsPanel
from plystack.app.safe import guarded, plain_label, reporter, show_message
from plystack.app.schedule_view import open_schedule
from plystack.app.window_files import FileActions, autosave_dir
from plystack.app.window_tools import ToolActions
from plystack.core.model.project import Project
from plystack.core.pipeline import Analysis

__all__ = ["MainWindow", "autosave_dir"]

AUTOSAVE_MS = 60_000


def _matches_undo_redo(event: QKeyEvent) -> str | None:
    combo = QKeySequence(event.keyCombination())
    for which, std in (("undo", QKeySequence.StandardKey.Undo),
                       ("redo", QKeySequence.StandardKey.Redo)):
        if any(combo.matches(k) == QKeySequence.SequenceMatch.ExactMatch
               for k in QKeySequence.keyBindings(std)):
            return which
    if combo.matches(QKeySequence("Ctrl+Shift+Z")) == QKeySequence.SequenceMatch.ExactMatch:
        return "redo"
    return None


class MainWindow(FileActions, ToolActions, QMainWindow):
    """Plystack's window. ``ask``, ``warn`` and the file dialogs can be replaced in tests."""

    def __init__(self, project: Project, path: Path | None = None):
        super().__init__()
        self.document = Document(project, path)
        self.analysis_model = AnalysisModel(self.document)
        self.settings = QSettings("Plystack", "Plystack")
        self.canvas = SectionCanvas(self.document, self.analysis_model)
        self.elevation = ElevationView(self.document, self.analysis_model, self.canvas)
        self.section_caption = plain_label(segment_caption(self.analysis_model),
                                           word_wrap=False)
        self.ply_panel = PlyPanel(self.document)
        self.beam_panel = BeamPanel(self.document, self.analysis_model)
        self.results = ResultsPanel(self.settings)
        self.profiles = ProfilePlot()
        self.diagrams = DiagramPlot()
        self.alternatives = AlternativesPanel(self.document, self.analysis_model)
        self.combo_pick = QComboBox()
        self.combo_pick.setToolTip("Combination shown in the plots")
        self._build_layout()
        self.file_flag = plain_label("", word_wrap=False)
        self.file_flag.setStyleSheet("color: #8a5a00; font-weight: bold;")
        self.file_flag.setVisible(False)
        self.statusBar().addPermanentWidget(self.file_flag)
        self.statusBar().showMessage("Drag on the section to draw a ply; click a ply to "
                                     "select it.")
        self.canvas.status.connect(self.statusBar().showMessage)
        self.elevation.status.connect(self.statusBar().showMessage)
        self.elevation.ply_picked.connect(self.canvas.select)
        self.analysis_model.station_changed.connect(self._station_changed)
        reporter().message.connect(self.statusBar().showMessage)
        self.canvas.selection_changed.connect(self.ply_panel.set_index)
        self.ply_panel.table.picked.connect(self.canvas.select)
        self.ply_panel.materials_button.clicked.connect(self.open_materials)
        self.combo_pick.activated.connect(lambda _i: self._redraw_plots())
        self.analysis_model.analysis_changed.connect(self.show_analysis)
        self.document.drag_finished.connect(self._drag_finished)
        self.document.file_changed.connect(self._update_title)
        self._autosave = QTimer(self)
        self._autosave.setInterval(AUTOSAVE_MS)
        self._autosave.timeout.connect(self.autosave)
        self._autosave.start()
        self._init_files()
        self._build_menus()
        QApplication.instance().installEventFilter(self)
        self.setWindowIcon(app_icon())
        self.resize(1600, 950)
        self._update_title()
        self.recompute()

    def _build_layout(self) -> None:
        panels = QTabWidget()
        panels.addTab(self.ply_panel, "Plies")
        panels.addTab(self.beam_panel, "Beam / Loads")
        panels.setMinimumWidth(390)
        self.plot_tabs = QTabWidget()
        self.plot_tabs.addTab(self.profiles, "Strain and stress")
        self.plot_tabs.addTab(self.diagrams, "Shear, moment, deflection")
        plot_box = QWidget()
        pl = QVBoxLayout(plot_box)
        pl.setContentsMargins(0, 0, 0, 0)
        row = QHBoxLayout()
        row.addWidget(QLabel("Plots for"))
        row.addWidget(self.combo_pick, 1)
        pl.addLayout(row)
        pl.addWidget(self.plot_tabs, 1)
        top = QSplitter(Qt.Orientation.Horizontal)
        top.addWidget(self.canvas)
        top.addWidget(plot_box)
        top.setSizes([480, 520])
        shown = QWidget()  # the section and its plots, under the line naming the section
        sl = QVBoxLayout(shown)
        sl.setContentsMargins(0, 0, 0, 0)
        sl.setSpacing(2)
        self.section_caption.setStyleSheet("color: #00509e;")
        sl.addWidget(self.section_caption)
        sl.addWidget(top, 1)
        self.right_tabs = QTabWidget()
        self.right_tabs.addTab(self.results, "Results")
        self.right_tabs.addTab(self.alternatives, "Alternatives")
        self.right_tabs.currentChanged.connect(lambda _i: self._refresh_alternatives())
        centre = QSplitter(Qt.Orientation.Vertical)
        centre.addWidget(shown)
        centre.addWidget(self.elevation)
        centre.addWidget(self.right_tabs)
        centre.setSizes([400, 260, 280])
        main = QSplitter(Qt.Orientation.Horizontal)
        main.addWidget(panels)
        main.addWidget(centre)
        main.setStretchFactor(1, 1)
        main.setSizes([400, 966])
        self.setCentralWidget(main)

    # --- asking (replaced in tests) -------------------------------------------------------

    def ask(self, title: str, text: str, buttons, default):  # type: ignore[no-untyped-def]
        """Ask the user (plain text; replaced in tests)."""
        return show_message(self, QMessageBox.Icon.Question, title, text, buttons, default)

    def warn(self, title: str, text: str) -> None:
        """Tell the user something went wrong (plain text; replaced in tests)."""
        self.statusBar().showMessage(f"{title}: {text.splitlines()[0] if text else ''}")
        show_message(self, QMessageBox.Icon.Warning, title, text)

    def inform(self, title: str, text: str) -> None:
        """Tell the user a result (plain text)."""
        show_message(self, QMessageBox.Icon.Information, title, text)

    # --- menus ------------------------------------------------------------------------

    def _action(self, menu, text: str, slot, shortcut=None) -> QAction:  # type: ignore[no-untyped-def]
        act = QAction(text, self)
        if shortcut is not None:
            act.setShortcut(QKeySequence(shortcut))
        act.triggered.connect(guarded(text.replace("&", "").rstrip("\u2026"))(
            lambda _checked=False: slot()))
        menu.addAction(act)
        return act

    def _build_menus(self) -> None:
        bar = self.menuBar()
        f = bar.addMenu("&File")
        self._action(f, "&New from template\u2026", self.new_from_template,
                     QKeySequence.StandardKey.New)
        self._action(f, "&Open\u2026", self.open_dialog, QKeySequence.StandardKey.Open)
        self.recent_menu = f.addMenu("Open &recent")
        self._action(f, "Open sc&hedule\u2026", lambda: open_schedule(self))
        self._action(f, "&Save", self.save, QKeySequence.StandardKey.Save)
        self._action(f, "Save &as\u2026", self.save_as, QKeySequence.StandardKey.SaveAs)
        self._action(f, "&Export calculation sheet (PDF)\u2026", self.export_sheet, "Ctrl+E")
        self._action(f, "Export &plate drawings\u2026", self.export_plates)
        f.addSeparator()
        self._action(f, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        e = bar.addMenu("&Edit")
        stack = self.document.undo_stack
        self.undo_action = stack.createUndoAction(self, "&Undo")
        self.undo_action.setShortcuts(QKeySequence.keyBindings(QKeySequence.StandardKey.Undo))
        self.redo_action = stack.createRedoAction(self, "&Redo")
        redo_keys = QKeySequence.keyBindings(QKeySequence.StandardKey.Redo)
        for extra in ("Ctrl+Shift+Z", "Ctrl+Y"):
            if QKeySequence(extra) not in redo_keys:
                redo_keys.append(QKeySequence(extra))
        self.redo_action.setShortcuts(redo_keys)
        for act in (self.undo_action, self.redo_action):
            act.triggered.disconnect()
        self.undo_action.triggered.connect(lambda _c=False: self.undo())
        self.redo_action.triggered.connect(lambda _c=False: self.redo())
        e.addAction(self.undo_action)
        e.addAction(self.redo_action)
        e.addSeparator()
        self._action(e, "&Delete ply", self.delete_ply, QKeySequence.StandardKey.Delete)
        self._action(e, "D&uplicate ply", self.duplicate_ply, "Ctrl+D")
        self._action(e, "&Mirror ply about the centre line", self.mirror_ply, "Ctrl+M")
        self._action(e, "Bring &forward", lambda: self.restack(+1), "Ctrl+]")
        self._action(e, "Send &back", lambda: self.restack(-1), "Ctrl+[")
        self._action(e, "&Materials\u2026", self.open_materials)
        v = bar.addMenu("&View")
        self._action(v, "&Fit section", self.canvas.fit, "F")
        self.transformed_action = self._action(v, "Show &transformed section",
                                               self.toggle_transformed, "T")
        self.transformed_action.setCheckable(True)
        self._action(v, "Snap &step\u2026", self.ask_snap_step)
        self.us_action = self._action(v, "US units", lambda: self.set_units("US"))
        self.si_action = self._action(v, "SI units", lambda: self.set_units("SI"))
        t = bar.addMenu("&Tools")
        self._action(t, "&Sweep a ply dimension\u2026", self.open_sweep)
        self._action(t, "&Auto-size the selected ply (thickness)", self.auto_size_selected)
        self._action(t, "&Longest span", self.show_longest_span)
        self._action(t, "&Keep current as alternative\u2026", self.alternatives.add_current)
        self._fill_recent()

    # --- undo wherever the focus is ---------------------------------------------------

    def eventFilter(self, watched: QObject, event: QEvent) -> bool:  # noqa: D102
        # A text field takes Ctrl+Z for its own undo (it overrides the shortcut); here the
        # key press goes to the project's undo instead, after the field commits.
        if (event.type() == QEvent.Type.KeyPress and isinstance(watched, QLineEdit)
                and isinstance(event, QKeyEvent) and watched.window() is self):
            which = _matches_undo_redo(event)
            if which == "undo":
                self.undo()
                return True
            if which == "redo":
                self.redo()
                return True
        return False

    def commit_focused_entry(self) -> None:
        """Commit a text field the user is typing in (before undo or redo)."""
        w = QApplication.focusWidget()
        if not isinstance(w, QLineEdit) or w.window() is not self or not w.isModified():
            return
        parent = w.parent()
        while parent is not None and not isinstance(parent, QAbstractItemView):
            parent = parent.parent()
        if isinstance(parent, QAbstractItemView):
            self.canvas.setFocus()  # a table cell editor commits when it loses focus
        else:
            w.editingFinished.emit()
        if w is not None and isinstance(w, QLineEdit):
            w.setModified(False)

    @guarded("Undo")
    def undo(self) -> None:
        """Edit > Undo: commit a field being typed in, then undo the last edit."""
        self.commit_focused_entry()
        self.document.undo_stack.undo()

    @guarded("Redo")
    def redo(self) -> None:
        """Edit > Redo."""
        self.commit_focused_entry()
        self.document.undo_stack.redo()

    # --- tools --------------------------------------------------------------------------

    def open_sweep(self) -> None:
        """Tools > Sweep."""
        SweepDialog(self.document, self).exec()

    # --- computation --------------------------------------------------------------------

    @property
    def analysis(self) -> Analysis | None:
        """The latest analysis the analysis model published."""
        return self.analysis_model.analysis

    def recompute(self) -> None:
        """Analyse the current project now (results and plots follow)."""
        self.analysis_model.recompute()

    @guarded("Showing the results")
    def show_analysis(self) -> None:
        """Show what the analysis model published: results, plots, alternatives."""
        self.results.hold_widths(self.document.dragging)
        if self.analysis is None:
            self.results.show_error(self.analysis_model.error or "Nothing to analyse yet.")
        else:
            self.results.show_analysis(self.analysis)
        names = [c.name for c in self.analysis.beam.combinations] if (
            self.analysis and self.analysis.beam) else []
        items = ["governing combination", *names]
        pick = self.combo_pick
        if [pick.itemText(i) for i in range(pick.count())] != items:
            # refilled only when the combinations change: a new list resizes the box and
            # lays the whole window out again (an edit of a ply keeps the same list)
            current = pick.currentText()
            pick.blockSignals(True)
            pick.clear()
            pick.addItems(items)
            if current in names:
                pick.setCurrentText(current)
            pick.blockSignals(False)
        self._redraw_plots()
        self._refresh_alternatives()

    @guarded("Finishing the drag")
    def _drag_finished(self) -> None:
        """The button came up: what was held still during the drag catches up."""
        self.results.hold_widths(False)
        self._redraw_plots()  # limits from the data and the layout, as a fresh window

    @guarded("Comparing the alternatives")
    def _refresh_alternatives(self) -> None:
        if self.right_tabs.currentWidget() is self.alternatives:
            self.alternatives.refresh()

    @guarded("Showing the station")
    def _station_changed(self) -> None:
        """Another station picked on the elevation: its section in the stress plot."""
        self.section_caption.setText(segment_caption(self.analysis_model))
        self._redraw_plots()

    @guarded("Drawing the plots")
    def _redraw_plots(self) -> None:
        name = self.combo_pick.currentText()
        pick = None if name == "governing combination" else name
        self.section_caption.setText(segment_caption(self.analysis_model))
        dragging = self.document.dragging
        self.profiles.update_from(self.analysis_model.shown_analysis(), pick, dragging)
        self.diagrams.update_from(self.analysis, pick, dragging)

    # --- edits ------------------------------------------------------------------------

    def toggle_transformed(self) -> None:
        """Show or hide the transformed outline."""
        self.canvas.show_transformed = self.transformed_action.isChecked()
        self.canvas.rebuild()

    def set_units(self, system: str) -> None:
        """Switch the display units (US or SI): one undoable edit."""
        self.document.apply(replace(self.document.project, display_units=system),
                            f"Switch to {system} units")
        self.canvas.rebuild()

    def ask_snap_step(self) -> None:
        """View > Snap step: any length (a bare number is in the display unit)."""
        from PySide6.QtWidgets import QInputDialog

        from plystack.app.quantity import parse_entry
        from plystack.core.model import units

        u = self.document.project.display_units
        current = units.display_string(self.canvas.snap_step, "length", u, 6)
        text, ok = QInputDialog.getText(self, "Snap step", "Snap step (e.g. 1/16 in, 1 mm):",
                                        text=current)
        if not ok:
            return
        try:
            step = parse_entry(text, "length", u, "snap step")
        except units.UnitError as exc:
            self.warn("Snap step", str(exc))
            return
        if not 0 < step < 1.0:
            self.warn("Snap step", "snap step: must be greater than zero and below 1 m")
            return
        self.canvas.snap_override = step

    def open_materials(self) -> None:
        """Browse materials and add one to the project."""
        p = self.document.project
        dlg = MaterialsDialog(p.all_materials(), p.display_units, self,
                              basis=p.design_or_default().basis)
        if dlg.exec() and dlg.added is not None:
            mats = {**p.materials, dlg.added.id: dlg.added}
            self.document.apply(replace(p, materials=mats), "Add material")

    # --- files ------------------------------------------------------------------------

    def new_from_template(self) -> None:
        """Start a new project from a section template."""
        if not self.maybe_save():
            return
        p = self.document.project
        dlg = NewSectionDialog(p.display_units, p.all_materials(), self)
        if not dlg.exec():
            return
        system = dlg.units.currentText()
        project = Project(title="New section", display_units=system, plies=dlg.plies(),
                          beam=default_beam(system),
                          design=None if system == "US" else _eu_design())
        self.replace_project(project)

    def export_sheet(self, target: Path | None = None) -> bool:
        """File > Export calculation sheet: choose paper, see the page count, save."""
        from plystack.core.io.atomic import write_bytes
        from plystack.core.model.errors import ProjectError

        dlg = SheetDialog(self.document.project, self)
        if target is None:
            if not dlg.exec():
                return False
            start = str(Path(self._last_dir()) / "calculation.pdf")
            name, _ = QFileDialog.getSaveFileName(self, "Export calculation sheet", start,
                                                  "PDF (*.pdf)")
            if not name:
                return False
            target = Path(name if name.lower().endswith(".pdf") else name + ".pdf")
        if not dlg.data:
            self.warn("Export calculation sheet", dlg.preview.text())
            return False
        try:
            write_bytes(target, dlg.data, "calculation sheet")
        except (OSError, ProjectError) as exc:
            text = ("\n".join(str(p) for p in exc.problems) if isinstance(exc, ProjectError)
                    else exc.strerror or str(exc))
            self.warn("Export failed", f"{target}: {text}")
            return False
        self.statusBar().showMessage(f"Wrote {target} ({dlg.pages} pages)")
        return True

    def _update_title(self) -> None:
        name = self.document.path.name if self.document.path else "untitled"
        mark = "*" if self.document.modified else ""
        self.setWindowTitle(f"{name}{mark} \u2014 Plystack")

    def closeEvent(self, event: QCloseEvent) -> None:  # noqa: D102
        if self.maybe_save():
            self.close_files()
            app = QApplication.instance()
            if app is not None:
                app.removeEventFilter(self)
            event.accept()
        else:
            event.ignore()


def _eu_design():  # type: ignore[no-untyped-def]
    from plystack.core.model.design import DesignSpec

    return DesignSpec(basis="EU-LSD")
