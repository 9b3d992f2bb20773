"""File > Open schedule: every member of a schedule (CSV) checked, shown as a sortable
table (failing rows red, incomplete rows grey); double-clicking a row opens that member
as an untitled project in the main window.
"""

from __future__ import annotations

from collections.abc import Callable
from pathlib import Path

from PySide6.QtCore import Qt
from PySide6.QtGui import QBrush, QColor, QStandardItem, QStandardItemModel
from PySide6.QtWidgets import (
    QAbstractItemView,
    QDialog,
    QFileDialog,
    QHeaderView,
    QLabel,
    QMessageBox,
    QTableView,
    QVBoxLayout,
    QWidget,
)

from plystack.core.io.schedule_file import (
    MemberJob,
    RowError,
    ScheduleError,
    evaluate,
    member_project,
    prepare,
    read_schedule,
    result_cells,
)
from plystack.core.model.caution import CAUTION
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Project
from plystack.core.study.schedule import INCOMPLETE, NOT_OK, MemberResult, run_rows

#: (header, key of result_cells) of the table's columns.
COLUMNS = (("Row", "row"), ("Mark", "mark"), ("Verdict", "verdict"),
           ("Governing check", "governing_check"), ("Ply", "governing_ply"),
           ("Combination", "governing_combination"), ("Ratio", "governing_ratio"),
           ("Deflection ratio", "deflection_ratio"), ("Plate", "plate"), ("Bolts", "bolts"),
           ("Mass", "mass"), ("Base", "base"), ("Alternative", "alternative"),
           ("Problems", "problems"))
SORT_ROLE = Qt.ItemDataRole.UserRole
ROW_ROLE = Qt.ItemDataRole.UserRole + 1
FAILING = QColor(255, 205, 205)
INCOMPLETE_BACKGROUND = QColor(225, 225, 225)
INCOMPLETE_TEXT = QColor(95, 95, 95)


def _sort_key(result: MemberResult, key: str, text: str) -> object:
    """Numbers sort as numbers (rows that did not run last); text as lower-case text."""
    s = result.summary
    if key == "row":
        return float(result.row)
    if key in ("governing_ratio", "deflection_ratio", "mass"):
        if s is None:
            return float("inf")
        if key == "governing_ratio":
            return s.governing[3] if s.governing else float("inf")
        if key == "deflection_ratio":
            return s.deflection[1] if s.deflection else float("inf")
        return s.mass
    return text.lower()


class ScheduleView(QDialog):
    """The results of one schedule. ``open_member`` receives the project of a row."""

    def __init__(self, path: Path, results: list[MemberResult], jobs: dict[int, MemberJob],
                 open_member: Callable[[Project], None], parent: QWidget | None = None):
        super().__init__(parent)
        self.path = path
        self.results = {r.row: r for r in results}
        self.jobs = jobs
        self.open_member = open_member
        self.setWindowTitle(f"Schedule: {path.name}")
        self.model = QStandardItemModel(0, len(COLUMNS), self)
        self.model.setHorizontalHeaderLabels([h for h, _k in COLUMNS])
        self.model.setSortRole(SORT_ROLE)
        for r in results:
            self.model.appendRow(self._items(r))
        self.table = QTableView()
        self.table.setModel(self.model)
        self.table.setSortingEnabled(True)
        self.table.verticalHeader().setVisible(False)
        self.table.sortByColumn(0, Qt.SortOrder.AscendingOrder)
        self.table.setSelectionBehavior(QAbstractItemView.SelectionBehavior.SelectRows)
        self.table.setEditTriggers(QAbstractItemView.EditTrigger.NoEditTriggers)
        self.table.horizontalHeader().setSectionResizeMode(QHeaderView.ResizeMode.Interactive)
        self.table.resizeColumnsToContents()
        self.table.doubleClicked.connect(lambda index: self.open_row(self.row_at(index.row())))
        counts = {v: sum(1 for r in results if r.verdict == v) for v in ("OK", NOT_OK,
                                                                          INCOMPLETE)}
        summary = QLabel(f"{len(results)} members: " + ", ".join(
            f"{n} {v}" for v, n in counts.items()) + ". Double-click a row to open that "
            "member as an untitled project. Failing rows are red, incomplete ones grey.")
        caution = QLabel(CAUTION)
        caution.setWordWrap(True)
        caution.setStyleSheet("background: #fff5d6; border: 1px solid #997300; padding: 4px;")
        layout = QVBoxLayout(self)
        layout.addWidget(summary)
        layout.addWidget(self.table, 1)
        layout.addWidget(caution)
        self.resize(1300, 520)

    def _items(self, r: MemberResult) -> list[QStandardItem]:
        cells = result_cells(r)
        items = []
        for _header, key in COLUMNS:
            text = cells[key]
            item = QStandardItem(text)
            item.setData(_sort_key(r, key, text), SORT_ROLE)
            item.setData(r.row, ROW_ROLE)
            if key == "problems" and text:
                item.setToolTip(text.replace("; ", "\n"))
            if r.verdict == NOT_OK:
                item.setBackground(QBrush(FAILING))
            elif r.verdict == INCOMPLETE:
                item.setBackground(QBrush(INCOMPLETE_BACKGROUND))
                item.setForeground(QBrush(INCOMPLETE_TEXT))
            items.append(item)
        return items

    def row_at(self, table_row: int) -> int:
        """The schedule row (line in the file) shown in ``table_row`` of the table."""
        return int(self.model.item(table_row, 0).data(ROW_ROLE))

    def open_row(self, row: int) -> None:
        """Open the member of schedule row ``row``, or say why it cannot be opened."""
        job = self.jobs.get(row)
        problems = [str(p) for p in self.results[row].problems]
        if job is not None:
            try:
                self.open_member(member_project(job))
                return
            except RowError as exc:
                problems = [str(p) for p in exc.problems]
        QMessageBox.warning(self, "Cannot open this member", "\n".join(problems))


def load_schedule(path: Path, open_member: Callable[[Project], None],
                  parent: QWidget | None = None) -> ScheduleView:
    """Run every member of the schedule (in this process) and build its table.

    Raises:
        ScheduleError: the schedule itself cannot be read.

    """
    prepared = prepare(read_schedule(path))
    jobs = {j.row: j for j in prepared if isinstance(j, MemberJob)}
    done = iter(run_rows(evaluate, list(jobs.values()), 1))
    results = [next(done) if isinstance(j, MemberJob) else j for j in prepared]
    return ScheduleView(path, results, jobs, open_member, parent)


def open_member_untitled(window, project: Project) -> None:  # type: ignore[no-untyped-def]
    """Show ``project`` in the main window as an untitled project (asks to save first)."""
    if not window.maybe_save():
        return
    window.document.replace_all(project, None)
    window.canvas.request_fit()
    window.canvas.select(None)
    window.canvas.rebuild()
    window.statusBar().showMessage(f"Opened member {project.info.get('member', '')} as an "
                                   "untitled project")


def open_schedule(window, path: Path | None = None) -> ScheduleView | None:  # type: ignore[no-untyped-def]
    """File > Open schedule: choose a CSV, check every member, show the table."""
    if path is None:
        name, _ = QFileDialog.getOpenFileName(window, "Open schedule", "",
                                              "Member schedules (*.csv)")
        if not name:
            return None
        path = Path(name)
    window.setCursor(Qt.CursorShape.WaitCursor)
    try:
        view = load_schedule(path, lambda p: open_member_untitled(window, p), window)
    except (ScheduleError, ProjectError) as exc:
        messages = exc.messages if isinstance(exc, ScheduleError) else [
            str(p) for p in exc.problems]
        QMessageBox.warning(window, "Cannot open schedule",
                            "\n".join(f"{path}: {m}" for m in messages))
        return None
    finally:
        window.unsetCursor()
    view.show()
    return view
