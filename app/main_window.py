"""The main window: section canvas, plots, panels and results around one document."""

from __future__ import annotations

from dataclasses import replace
from pathlib import Path

from PySide6.QtCore import QSettings, QStandardPaths, Qt, QTimer
from PySide6.QtGui import QAction, QCloseEvent, QKeySequence
from PySide6.QtWidgets import (
    QComboBox,
    QFileDialog,
    QHBoxLayout,
    QLabel,
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
from plystack.app.icons import app_icon
from plystack.app.plots import DiagramPlot, ProfilePlot
from plystack.app.ply_panel import PlyPanel
from plystack.app.results import ResultsPanel
from plystack.app.schedule_view import open_schedule
from plystack.core.io.project_file import dumps, load
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Project
from plystack.core.pipeline import Analysis

AUTOSAVE_MS = 60_000


def autosave_dir() -> Path:
    """Folder for autosaves (the platform's application-data folder)."""
    base = QStandardPaths.writableLocation(QStandardPaths.StandardLocation.AppDataLocation)
    return Path(base or Path.home() / ".plystack") / "autosave"


class MainWindow(QMainWindow):
    """Plystack's window. ``ask`` can be replaced in tests to answer prompts."""

    def __init__(self, project: Project, path: Path | None = None):
        super().__init__()
        self.document = Document(project, path)
        self.analysis_model = AnalysisModel(self.document)
        self.settings = QSettings("Plystack", "Plystack")
        self.canvas = SectionCanvas(self.document, self.analysis_model)
        self.ply_panel = PlyPanel(self.document)
        self.beam_panel = BeamPanel(self.document)
        self.results = ResultsPanel()
        self.profiles = ProfilePlot()
        self.diagrams = DiagramPlot()
        self.combo_pick = QComboBox()
        self.combo_pick.setToolTip("Combination shown in the plots")
        panels = QTabWidget()
        panels.addTab(self.ply_panel, "Plies")
        panels.addTab(self.beam_panel, "Loads")
        panels.setMinimumWidth(330)
        top = QSplitter(Qt.Orientation.Horizontal)
        top.addWidget(self.canvas)
        plot_box = QWidget()
        pl = QVBoxLayout(plot_box)
        pl.setContentsMargins(0, 0, 0, 0)
        row = QHBoxLayout()
        row.addWidget(QLabel("Plots for"))
        row.addWidget(self.combo_pick, 1)
        pl.addLayout(row)
        pl.addWidget(self.profiles, 1)
        top.addWidget(plot_box)
        top.setSizes([520, 520])
        centre = QSplitter(Qt.Orientation.Vertical)
        centre.addWidget(top)
        centre.addWidget(self.diagrams)
        centre.setSizes([460, 360])
        main = QSplitter(Qt.Orientation.Horizontal)
        main.addWidget(panels)
        main.addWidget(centre)
        self.alternatives = AlternativesPanel(self.document, self.analysis_model)
        self.right_tabs = QTabWidget()
        self.right_tabs.addTab(self.results, "Results")
        self.right_tabs.addTab(self.alternatives, "Alternatives")
        self.right_tabs.currentChanged.connect(lambda _i: self._refresh_alternatives())
        main.addWidget(self.right_tabs)
        main.setSizes([330, 900, 640])
        self.setCentralWidget(main)
        self.statusBar().showMessage("Drag on the section to draw a ply; click a ply to "
                                     "select it.")
        self.canvas.status.connect(self.statusBar().showMessage)
        self.canvas.selection_changed.connect(self.ply_panel.set_index)
        self.ply_panel.materials_button.clicked.connect(self.open_materials)
        self.combo_pick.activated.connect(lambda _i: self._redraw_plots())
        self.analysis_model.analysis_changed.connect(self.show_analysis)
        self.document.file_changed.connect(self._update_title)
        self._autosave = QTimer(self)
        self._autosave.setInterval(AUTOSAVE_MS)
        self._autosave.timeout.connect(self.autosave)
        self._autosave.start()
        self._build_menus()
        self.setWindowIcon(app_icon())
        self.resize(1600, 950)
        self._update_title()
        self.recompute()

    # --- menus ------------------------------------------------------------------------

    def _action(self, menu, text: str, slot, shortcut=None) -> QAction:  # type: ignore[no-untyped-def]
        act = QAction(text, self)
        if shortcut is not None:
            act.setShortcut(QKeySequence(shortcut))
        act.triggered.connect(lambda _checked=False: slot())
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
        f.addSeparator()
        self._action(f, "&Quit", self.close, QKeySequence.StandardKey.Quit)
        e = bar.addMenu("&Edit")
        undo = self.document.undo_stack.createUndoAction(self, "&Undo")
        undo.setShortcut(QKeySequence.StandardKey.Undo)
        redo = self.document.undo_stack.createRedoAction(self, "&Redo")
        redo.setShortcut(QKeySequence.StandardKey.Redo)
        e.addAction(undo)
        e.addAction(redo)
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

    # --- tools --------------------------------------------------------------------------

    def open_sweep(self) -> None:
        """Tools > Sweep."""
        SweepDialog(self.document, self).exec()

    def auto_size_selected(self) -> None:
        """Smallest stock plate thickness of the selected ply that passes."""
        from plystack.core.model.units import fmt
        from plystack.core.section.templates import PLATES_SI, PLATES_US
        from plystack.core.study.compare import auto_size

        i = self.canvas.selected
        p = self.document.project
        if i is None:
            QMessageBox.information(self, "Auto-size", "Select a ply first.")
            return
        options = list((PLATES_US if p.display_units == "US" else PLATES_SI).values())
        try:
            r = auto_size(p, p.plies[i].name, "width", options)
        except ProjectError as exc:
            QMessageBox.warning(self, "Auto-size", str(exc))
            return
        u = p.display_units
        if r.chosen is None:
            QMessageBox.information(self, "Auto-size", r.message)
            return
        text = (f"{p.plies[i].name}: {fmt(r.chosen.value, 'length', u)} passes "
                f"({r.chosen.governing_id}, ratio {r.chosen.governing_ratio:.3f}).")
        if r.next_smaller is not None:
            text += (f"\nNext smaller, {fmt(r.next_smaller.value, 'length', u)}, fails: "
                     f"{r.next_smaller.governing_id} ratio {r.next_smaller.governing_ratio:.3f}.")
        from plystack.core.model.caution import CAUTION

        answer = QMessageBox.question(self, "Auto-size", text + "\n\nUse this thickness?\n\n"
                                      + CAUTION)
        if answer == QMessageBox.StandardButton.Yes:
            from plystack.core.study.compare import with_dimension

            self.document.apply(p.with_plies(with_dimension(p.plies, p.plies[i].name, "width",
                                                            r.chosen.value)), "Auto-size ply")

    def show_longest_span(self) -> None:
        """Tools > Longest span."""
        from plystack.core.model.caution import CAUTION
        from plystack.core.model.units import fmt
        from plystack.core.study.compare import longest_span

        p = self.document.project
        try:
            r = longest_span(p)
        except ProjectError as exc:
            QMessageBox.warning(self, "Longest span", str(exc))
            return
        u = p.display_units
        QMessageBox.information(self, "Longest span",
                                f"Longest span that passes every check: "
                                f"{fmt(r.span, 'span', u)} (to {fmt(r.tolerance, 'length', u, 3)})"
                                f"; governing {r.governing_id}, ratio {r.governing_ratio:.3f}."
                                f"\n\n{CAUTION}")

    # --- computation --------------------------------------------------------------------

    @property
    def analysis(self) -> Analysis | None:
        """The latest analysis the analysis model published."""
        return self.analysis_model.analysis

    def recompute(self) -> None:
        """Analyse the current project now (results and plots follow)."""
        self.analysis_model.recompute()

    def show_analysis(self) -> None:
        """Show what the analysis model published: results, plots, alternatives."""
        if self.analysis is None:
            self.results.show_error(self.analysis_model.error or "Nothing to analyse yet.")
        else:
            self.results.show_analysis(self.analysis)
        names = [c.name for c in self.analysis.beam.combinations] if (
            self.analysis and self.analysis.beam) else []
        current = self.combo_pick.currentText()
        self.combo_pick.blockSignals(True)
        self.combo_pick.clear()
        self.combo_pick.addItem("governing combination")
        self.combo_pick.addItems(names)
        if current in names:
            self.combo_pick.setCurrentText(current)
        self.combo_pick.blockSignals(False)
        self._redraw_plots()
        self._refresh_alternatives()

    def _refresh_alternatives(self) -> None:
        if self.right_tabs.currentWidget() is self.alternatives:
            self.alternatives.refresh()

    def _redraw_plots(self) -> None:
        name = self.combo_pick.currentText()
        pick = None if name == "governing combination" else name
        self.profiles.update_from(self.analysis, pick)
        self.diagrams.update_from(self.analysis, pick)

    # --- edits ------------------------------------------------------------------------

    def _plies(self) -> list:  # type: ignore[type-arg]
        return list(self.document.project.plies)

    def delete_ply(self) -> None:
        """Remove the selected ply."""
        i = self.canvas.selected
        if i is None:
            return
        plies = self._plies()
        del plies[i]
        self.canvas.select(None)
        self.document.apply(self.document.project.with_plies(tuple(plies)), "Delete ply")

    def duplicate_ply(self) -> None:
        """Copy the selected ply beside itself (to the right)."""
        i = self.canvas.selected
        if i is None:
            return
        plies = self._plies()
        p = plies[i]
        plies.append(replace(p, name=f"{p.name} copy", x=p.x + p.width))
        self.document.apply(self.document.project.with_plies(tuple(plies)), "Duplicate ply")
        self.canvas.select(len(plies) - 1)

    def mirror_ply(self) -> None:
        """Mirror the selected ply about the section's vertical centre line."""
        i = self.canvas.selected
        if i is None:
            return
        plies = self._plies()
        x0 = min(p.x for p in plies)
        x1 = max(p.x + p.width for p in plies)
        p = plies[i]
        plies[i] = replace(p, x=x0 + x1 - p.x - p.width)
        self.document.apply(self.document.project.with_plies(tuple(plies)), "Mirror ply")

    def restack(self, step: int) -> None:
        """Move the selected ply up or down the stacking order."""
        i = self.canvas.selected
        if i is None:
            return
        plies = self._plies()
        j = i + step
        if not 0 <= j < len(plies):
            return
        plies[i], plies[j] = plies[j], plies[i]
        self.document.apply(self.document.project.with_plies(tuple(plies)),
                            "Bring forward" if step > 0 else "Send back")
        self.canvas.select(j)

    def toggle_transformed(self) -> None:
        """Show or hide the transformed outline."""
        self.canvas.show_transformed = self.transformed_action.isChecked()
        self.canvas.rebuild()

    def set_units(self, system: str) -> None:
        """Switch the display units (US or SI)."""
        self.document.apply(replace(self.document.project, display_units=system),
                            f"{system} units")
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
            QMessageBox.warning(self, "Snap step", str(exc))
            return
        if step <= 0:
            QMessageBox.warning(self, "Snap step", "snap step: must be greater than zero")
            return
        self.canvas.snap_override = step

    def open_materials(self) -> None:
        """Browse materials and add one to the project."""
        p = self.document.project
        dlg = MaterialsDialog(p.all_materials(), p.display_units, self)
        if dlg.exec() and dlg.added is not None:
            mats = {**p.materials, dlg.added.id: dlg.added}
            self.document.apply(replace(p, materials=mats), "Add material")

    # --- files ------------------------------------------------------------------------

    def ask(self, title: str, text: str, buttons, default):  # type: ignore[no-untyped-def]
        """Ask the user (replaced in tests)."""
        return QMessageBox.question(self, title, text, buttons, default)

    def maybe_save(self) -> bool:
        """True when it is fine to drop the current document."""
        if not self.document.modified:
            return True
        b = QMessageBox.StandardButton
        answer = self.ask("Unsaved changes", "Save the changes to this project first?",
                          b.Save | b.Discard | b.Cancel, b.Save)
        if answer == b.Save:
            return self.save()
        return bool(answer == b.Discard)

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
        self.document.replace_all(project, None)
        self.canvas.request_fit()
        self.canvas.rebuild()

    def open_path(self, path: Path) -> bool:
        """Open a project file; show its problems if it cannot be read."""
        try:
            project = load(path)
        except ProjectError as exc:
            QMessageBox.warning(self, "Cannot open", "\n".join(str(p) for p in exc.problems))
            return False
        self.document.replace_all(project, Path(path))
        self.canvas.request_fit()
        self.canvas.select(None)
        self.canvas.rebuild()
        self._remember(Path(path))
        return True

    def export_sheet(self, target: Path | None = None) -> bool:
        """File > Export calculation sheet: choose paper, see the page count, save."""
        dlg = SheetDialog(self.document.project, self)
        if target is None:
            if not dlg.exec():
                return False
            name, _ = QFileDialog.getSaveFileName(self, "Export calculation sheet",
                                                  "calculation.pdf", "PDF (*.pdf)")
            if not name:
                return False
            target = Path(name)
        if not dlg.data:
            QMessageBox.warning(self, "Export calculation sheet", dlg.preview.text())
            return False
        tmp = target.with_name(f".{target.name}.tmp")
        try:
            tmp.write_bytes(dlg.data)
            tmp.replace(target)
        except OSError as exc:
            QMessageBox.critical(self, "Export failed", f"{target}: {exc}")
            return False
        self.statusBar().showMessage(f"Wrote {target} ({dlg.pages} pages)")
        return True

    def open_dialog(self) -> None:
        """File > Open."""
        if not self.maybe_save():
            return
        name, _ = QFileDialog.getOpenFileName(self, "Open project", "",
                                              "Plystack projects (*.plystack.json *.json)")
        if name:
            self.open_path(Path(name))

    def save(self) -> bool:
        """File > Save (asks for a name the first time)."""
        if self.document.path is None:
            return self.save_as()
        return self._save_to(self.document.path)

    def save_as(self) -> bool:
        """File > Save as."""
        name, _ = QFileDialog.getSaveFileName(self, "Save project", "untitled.plystack.json",
                                              "Plystack projects (*.plystack.json)")
        return self._save_to(Path(name)) if name else False

    def _save_to(self, path: Path) -> bool:
        try:
            self.document.save_to(path)
        except OSError as exc:
            QMessageBox.critical(self, "Save failed", f"{path}: {exc}. The old file is "
                                 "unchanged.")
            return False
        self._remember(path)
        self._clear_autosave()
        return True

    def _remember(self, path: Path) -> None:
        recent = [str(path)] + [p for p in self._recent() if p != str(path)]
        self.settings.setValue("recent", recent[:8])
        self._fill_recent()

    def _recent(self) -> list[str]:
        value = self.settings.value("recent", [])
        return [str(v) for v in value] if isinstance(value, list) else (
            [str(value)] if value else [])

    def _fill_recent(self) -> None:
        self.recent_menu.clear()
        for p in self._recent():
            act = self.recent_menu.addAction(p)
            act.triggered.connect(lambda _c=False, p=p: self.maybe_save() and self.open_path(
                Path(p)))

    def _update_title(self) -> None:
        name = self.document.path.name if self.document.path else "untitled"
        mark = "*" if self.document.modified else ""
        self.setWindowTitle(f"{name}{mark} \u2014 Plystack")

    # --- autosave and closing ---------------------------------------------------------

    def _autosave_path(self) -> Path:
        stem = self.document.path.name if self.document.path else "untitled.plystack.json"
        return autosave_dir() / stem

    def autosave(self) -> Path | None:
        """Write the project to the autosave folder while it has unsaved changes."""
        if not self.document.modified:
            return None
        target = self._autosave_path()
        try:
            target.parent.mkdir(parents=True, exist_ok=True)
            tmp = target.with_suffix(".tmp")
            tmp.write_text(dumps(self.document.project), encoding="utf-8")
            tmp.replace(target)
        except OSError:
            return None
        return target

    def _clear_autosave(self) -> None:
        try:
            self._autosave_path().unlink(missing_ok=True)
        except OSError:
            pass

    def closeEvent(self, event: QCloseEvent) -> None:  # noqa: D102
        if self.maybe_save():
            self._clear_autosave()
            event.accept()
        else:
            event.ignore()


def _eu_design():  # type: ignore[no-untyped-def]
    from plystack.core.model.design import DesignSpec

    return DesignSpec(basis="EU-LSD")
