"""Results: verdict and caution, checks with ratio bars, per-ply table, section and beam.

Every numeric cell keeps its SI value in Qt.UserRole, so tests compare numbers with
core/ rather than pixels. Verdict colours: green OK, amber OK with a ratio from the
amber threshold (QSettings ``amber_from``, 0.9 unless the user set another) up to 1.0,
red NOT OK, grey INCOMPLETE (a ratio that is not a number: the check could not be made).
"""

from __future__ import annotations

import math
from dataclasses import fields

from PySide6.QtCore import QEvent, QModelIndex, QRect, QSettings, QSize, Qt
from PySide6.QtGui import QColor, QPainter, QResizeEvent
from PySide6.QtWidgets import (
    QHeaderView,
    QLabel,
    QStyledItemDelegate,
    QStyleOptionViewItem,
    QTableWidget,
    QTableWidgetItem,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from plystack.app.safe import plain_label, plain_tip, reporter
from plystack.core.design.check import Check, ratio_text
from plystack.core.design.text import governing_per_group
from plystack.core.model.caution import CAUTION, FIRE_NOTE
from plystack.core.model.units import fmt, sig
from plystack.core.pipeline import Analysis
from plystack.core.section.transformed import PlyResult

RATIO_COLUMN = 5
AMBER_FROM = 0.9
GREEN, AMBER, RED, GREY = (QColor(46, 125, 50), QColor(214, 140, 0), QColor(190, 40, 40),
                           QColor(130, 130, 130))


def verdict_of(ratio: float, ok: bool, amber_from: float = AMBER_FROM) -> str:
    """"OK", "OK (close)", "NOT OK" or "INCOMPLETE" for a check's ratio and verdict."""
    if not isinstance(ratio, float | int) or math.isnan(ratio):
        return "INCOMPLETE"
    if not ok:
        return "NOT OK"
    return "OK (close)" if ratio >= amber_from else "OK"


def verdict_colour(verdict: str) -> QColor:
    """The colour of a verdict: green, amber, red or grey."""
    return {"OK": GREEN, "OK (close)": AMBER, "NOT OK": RED}.get(verdict, GREY)


class RatioBar(QStyledItemDelegate):
    """Draws the ratio as a bar (full width = 1.0) in its verdict's colour, number on it."""

    amber_from = AMBER_FROM

    def paint(self, painter: QPainter, option: QStyleOptionViewItem,  # noqa: D102
              index: QModelIndex) -> None:
        ratio = index.data(Qt.ItemDataRole.UserRole)
        if not isinstance(ratio, float):
            return super().paint(painter, option, index)
        painter.save()
        try:
            self._bar(painter, option.rect.adjusted(2, 3, -2, -3), ratio)
        except Exception as exc:
            reporter().report("Drawing a ratio", exc)
        finally:
            painter.restore()

    def _bar(self, painter: QPainter, r: QRect, ratio: float) -> None:
        painter.fillRect(r, QColor(240, 240, 240))
        verdict = verdict_of(ratio, ratio <= 1.0 + 1e-9, self.amber_from)
        if math.isfinite(ratio):
            w = int(r.width() * min(max(ratio, 0.0), 1.0))
            painter.fillRect(QRect(r.left(), r.top(), w, r.height()),
                             verdict_colour(verdict).lighter(170))
            text = f"{ratio:.3f}"
        else:
            if math.isinf(ratio):
                painter.fillRect(r, verdict_colour(verdict).lighter(170))
            text = "\u221e" if math.isinf(ratio) else "\u2014"
        painter.setPen(QColor(0, 0, 0))
        painter.drawText(r, Qt.AlignmentFlag.AlignCenter, text)


def _item(text: str, value: object = None) -> QTableWidgetItem:
    item = QTableWidgetItem(text)
    item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
    if value is not None:
        item.setData(Qt.ItemDataRole.UserRole, value)
    return item


def _put(table: QTableWidget, row: int, col: int, text: str,
         value: object = None) -> QTableWidgetItem:
    """Set one cell in place: the existing item is kept and only what changed is set, so
    an edit that changes a few numbers repaints a few cells.
    """
    item = table.item(row, col)
    if item is None:
        item = _item(text, value)
        table.setItem(row, col, item)
        return item
    if item.text() != text:
        item.setText(text)
    role = Qt.ItemDataRole.UserRole
    old = item.data(role)
    if type(old) is not type(value) or old != value:
        item.setData(role, value)
    return item


class ShownCells:
    """What a fill last put in each cell of a table (text and value) and in each row
    (its text colour and tooltip), so the next fill asks Qt nothing for what is the same
    again.

    Every fill of the table goes through here (``shape``, ``put``, ``row_look``); a row
    the table drops is forgotten with it, so a cell made again is set in full.
    """

    def __init__(self, table: QTableWidget) -> None:
        self.table = table
        self._cells: dict[tuple[int, int], tuple[str, object]] = {}
        self._looks: dict[int, tuple[int, QColor, str]] = {}
        self.cells_put = 0  # cells handed to Qt (for tests)

    def shape(self, rows: int) -> None:
        """Give the table ``rows`` rows, forgetting the cells that go."""
        t = self.table
        if t.rowCount() != rows:
            t.setRowCount(rows)
        if any(r >= rows for r, _c in self._cells):
            self._cells = {k: v for k, v in self._cells.items() if k[0] < rows}
        if any(r >= rows for r in self._looks):
            self._looks = {r: v for r, v in self._looks.items() if r < rows}

    def put(self, row: int, col: int, text: str, value: object = None) -> None:
        """``_put`` for a cell, asking Qt nothing where the cell has this text and value."""
        kept = self._cells.get((row, col))
        if kept is not None and kept[0] == text and _same(kept[1], value):
            return
        self.cells_put += 1
        _put(self.table, row, col, text, value)
        self._cells[(row, col)] = (text, value)

    def row_look(self, row: int, col: int, colour: QColor, tip: str) -> None:
        """Cell ``col`` of ``row`` in ``colour``, every cell of the row with ``tip``."""
        kept = self._looks.get(row)
        if kept is not None and kept[0] == col and kept[1] == colour and kept[2] == tip:
            return
        t = self.table
        item = t.item(row, col)
        if item.foreground().color() != colour:
            item.setForeground(colour)
        if t.item(row, 0).toolTip() != tip:  # the row's cells share their tooltip
            for c in range(t.columnCount()):
                cell = t.item(row, c)
                if cell is not None and cell.toolTip() != tip:
                    cell.setToolTip(tip)
        self._looks[row] = (col, QColor(colour), tip)


def _same(a: object, b: object) -> bool:
    """Values of the same type, equal to the bit (-0.0 is not 0.0; a NaN is never the
    same, so its cell is handed to Qt again, as ``_put`` alone would).
    """
    if type(a) is not type(b):
        return False
    if isinstance(a, float):
        return a == b and (a != 0.0 or math.copysign(1.0, a) == math.copysign(
            1.0, b))  # type: ignore[arg-type]
    return bool(a == b)


def set_style(widget: QWidget, css: str) -> None:
    """Set a style sheet only when it differs (setting one restyles and repaints the
    widget and lays its window out again, even when the sheet is the same).
    """
    if widget.styleSheet() != css:
        widget.setStyleSheet(css)


def _fit_columns(table: QTableWidget) -> bool:
    """Resize the columns to their contents only when the table's shape or the length of
    a column's longest text changed (measuring every cell is the costly part of a fill).
    Returns True where it resized. While ``table`` holds its widths (property
    ``hold_widths``, set during a drag) nothing is measured: the fit follows the drag.
    """
    if table.property("hold_widths"):
        return False
    longest = tuple(max((len(it.text()) for r in range(table.rowCount())
                         if (it := table.item(r, c)) is not None), default=0)
                    for c in range(table.columnCount()))
    headers = tuple(h.text() if (h := table.horizontalHeaderItem(c)) is not None else ""
                    for c in range(table.columnCount()))
    key = (table.rowCount(), headers, longest)
    if table.property("fitted_for") == repr(key):
        return False
    table.setProperty("fitted_for", repr(key))
    table.resizeColumnsToContents()
    return True


class LabelBox(QWidget):
    """A box that holds one label and gives the layout the label's own size hints, so it
    lays out exactly as the label alone would.

    A label whose text changes asks the whole window to lay out again (Qt passes the
    request up through every parent, and each tab widget on the way repaints all of
    itself), even when the new text needs the same room. While ``hold`` is on (during a
    drag) the box passes a request on only when one of the hints it gave the layout since
    the last request it passed on is no longer the label's (the layout keeps what it was
    given until told); a request held back is passed on when ``hold`` goes off, so the
    window then lays out as a fresh one does.
    """

    def __init__(self, label: QLabel) -> None:
        super().__init__()
        self.label = label
        label.setParent(self)
        self.setSizePolicy(label.sizePolicy())
        self._hold = False
        self._held_back = False
        self._given: dict[object, object] = {}  # what the layout was told, by question
        self.passed_on = 0  # requests passed on to the layout (for tests)

    def hold(self, on: bool) -> None:
        """Hold back the label's requests that would change nothing (on), or stop."""
        self._hold = on
        if not on and self._held_back:
            self._held_back = False
            self._pass_on()

    def _answer(self, key: object) -> object:
        label = self.label
        if key == "size":
            return label.sizeHint()
        if key == "minimum":
            return label.minimumSizeHint()
        return label.heightForWidth(key)  # type: ignore[arg-type]

    def _unchanged(self) -> bool:
        """True where no answer the layout was given moves the label: its heights for
        the widths asked, its minimum height, a minimum width that still fits the box
        and, for a label whose height follows its width, nothing of its size hint (a
        vertical box layout gives every item its whole width and takes such an item's
        height from ``heightForWidth`` at that width, so these change no geometry).
        """
        hfw = self.label.hasHeightForWidth()
        for key, given in self._given.items():
            answer = self._answer(key)
            if key == "size":
                if not hfw and answer.height() != given.height():  # type: ignore[attr-defined]
                    return False
            elif key == "minimum":
                if (answer.height() != given.height()  # type: ignore[attr-defined]
                        or answer.width() > self.width()):  # type: ignore[attr-defined]
                    return False
            elif answer != given:
                return False
        return True

    def _pass_on(self) -> None:
        self._given.clear()
        self.passed_on += 1
        self.updateGeometry()

    def event(self, event: QEvent) -> bool:  # noqa: D102 - Qt API
        if event.type() == QEvent.Type.LayoutRequest:
            if self._hold and self._unchanged():
                self._held_back = True
            else:
                self._pass_on()
        return super().event(event)

    def resizeEvent(self, event: QResizeEvent) -> None:  # noqa: D102 - Qt API
        self.label.setGeometry(self.rect())
        super().resizeEvent(event)

    def _give(self, key: object) -> object:
        self._given[key] = answer = self._answer(key)
        return answer

    def sizeHint(self) -> QSize:  # noqa: D102 - Qt API
        return self._give("size")  # type: ignore[return-value]

    def minimumSizeHint(self) -> QSize:  # noqa: D102 - Qt API
        return self._give("minimum")  # type: ignore[return-value]

    def hasHeightForWidth(self) -> bool:  # noqa: D102 - Qt API
        return self.label.hasHeightForWidth()

    def heightForWidth(self, width: int) -> int:  # noqa: D102 - Qt API
        return self._give(width)  # type: ignore[return-value]


class ResultsPanel(QWidget):
    """Shows an analysis, or the problem that stopped it."""

    def __init__(self, settings: QSettings | None = None) -> None:
        super().__init__()
        self.settings = settings
        self._held = False
        self._tips: dict[int, tuple[tuple[object, ...], str]] = {}
        self._pending: Analysis | None = None  # tables not filled yet (during a drag)
        self.verdict = plain_label("")
        self.verdict.setStyleSheet("font-weight: bold; font-size: 13px; padding: 4px;")
        self.caution = plain_label(CAUTION)
        self.caution.setStyleSheet("color: #6b4e00; background: #fff6d6; padding: 4px;")
        self.fire = plain_label("Fire: Plystack makes no fire check; exposed steel plates "
                                "need protection or an assessment (hover for the "
                                "published methods).")
        self.fire.setToolTip(plain_tip(FIRE_NOTE))
        self.fire.setStyleSheet("color: #555555; padding: 2px 4px;")
        self.error = plain_label("")
        self.error.setStyleSheet("color: #b00000;")
        self.checks = QTableWidget(0, 7)
        self.checks.setHorizontalHeaderLabels(["Check", "Ply / place", "Combination",
                                               "Demand", "Capacity", "Ratio", "Verdict"])
        self.ratio_bar = RatioBar(self.checks)
        self.checks.setItemDelegateForColumn(RATIO_COLUMN, self.ratio_bar)
        self.checks.setWordWrap(False)
        self._check_cells = ShownCells(self.checks)
        self.plies = QTableWidget(0, 0)
        self.section = QTableWidget(0, 2)
        self.beam = QTableWidget(0, 6)
        for t in (self.checks, self.plies, self.section, self.beam):
            t.verticalHeader().setVisible(False)
            t.setAlternatingRowColors(True)
        self.tabs = QTabWidget()
        self.tabs.addTab(self.checks, "Checks")
        self.tabs.addTab(self.plies, "Plies")
        self.tabs.addTab(self.section, "Section")
        self.tabs.addTab(self.beam, "Beam")
        self.tabs.currentChanged.connect(lambda _i: self._fill_rest())
        layout = QVBoxLayout(self)
        layout.addWidget(self.error)
        self.verdict_box = LabelBox(self.verdict)
        layout.addWidget(self.verdict_box)
        layout.addWidget(self.tabs, 1)
        layout.addWidget(self.caution)
        layout.addWidget(self.fire)

    def amber_from(self) -> float:
        """Ratios from this value up to 1.0 show amber (user setting ``amber_from``)."""
        value = self.settings.value("amber_from", AMBER_FROM) if self.settings else AMBER_FROM
        try:
            number = float(value)  # type: ignore[arg-type]
        except (TypeError, ValueError):
            return AMBER_FROM
        return number if 0.0 < number <= 1.0 else AMBER_FROM

    def hold_widths(self, on: bool) -> None:
        """Keep the column widths as they are (during a drag: True); False fits the
        columns to their contents where the contents need it, as a fresh fill would.
        """
        if on == self._held:
            return
        self._held = on
        self.verdict_box.hold(on)
        tables = (self.checks, self.plies, self.section, self.beam)
        for t in tables:
            t.setProperty("hold_widths", on)
        if not on:
            self._fill_rest()
            self._fit_checks()
            for t in tables[1:]:
                _fit_columns(t)

    def show_error(self, message: str) -> None:
        """A computation failed: say why; keep the last tables greyed out."""
        set_style(self.error, "color: #b00000;")
        self.error.setText(message)
        self.error.setVisible(True)
        self.verdict.setText("INCOMPLETE \u2014 no results: fix the problem above.")
        set_style(self.verdict, "font-weight: bold; font-size: 13px; padding: 4px; "
                  "color: #828282;")
        for t in (self.checks, self.plies, self.section, self.beam):
            t.setEnabled(False)

    def show_analysis(self, a: Analysis) -> None:
        """Fill every table from an analysis."""
        self.error.setText("\n".join(f"Warning: {w}" for w in a.warnings))
        self.error.setVisible(bool(a.warnings))
        set_style(self.error, "color: #8a5a00;")
        for t in (self.checks, self.plies, self.section, self.beam):
            t.setEnabled(True)
        self._fill_checks(a, a.project.display_units)
        self._pending = a
        self._fill_rest(self.tabs.currentWidget() if self._held else None)

    def _fill_rest(self, only: QWidget | None = None) -> None:
        """Fill the plies, section and beam tables from the pending analysis; ``only``:
        that table alone (during a drag, the one on top), the others when shown or when
        the drag is over.
        """
        a = self._pending
        if a is None:
            return
        u = a.project.display_units
        for table, fill in ((self.plies, self._fill_plies), (self.section, self._fill_section),
                            (self.beam, self._fill_beam)):
            if only is None or table is only:
                fill(a, u)
        if only is None:
            self._pending = None

    def _fill_checks(self, a: Analysis, u: str) -> None:
        amber = self.amber_from()
        self.ratio_bar.amber_from = amber
        rows = governing_per_group(a.checks)
        cells = self._check_cells
        cells.shape(len(rows))
        for r, c in enumerate(rows):
            kind = c.quantity
            where = c.ply or c.location
            if c.id == "bearing":
                where = c.location
            cells.put(r, 0, c.id, c.id)
            cells.put(r, 1, where or "", where)
            cells.put(r, 2, c.combination or "", c.combination)
            cells.put(r, 3, fmt(c.demand, kind, u), float(c.demand))
            cells.put(r, 4, fmt(c.capacity, kind, u), float(c.capacity))
            cells.put(r, 5, "", float(c.ratio))
            text = verdict_of(float(c.ratio), c.ok, amber)
            cells.put(r, 6, text, c.ok)
            cells.row_look(r, 6, verdict_colour(text), self._tip(r, c))
        self._fit_checks()
        if not a.checks:
            self.verdict.setText("INCOMPLETE \u2014 no checks: give the beam (spans, supports, "
                                 "loads) to check the member.")
            set_style(self.verdict, "font-weight: bold; font-size: 13px; padding: 4px; "
                      "color: #828282;")
            return
        gov = rows[0]
        overall = a.verdict
        if overall == "OK" and any(math.isnan(c.ratio) for c in a.checks):  # INCOMPLETE
            overall = "INCOMPLETE"
        elif overall == "OK":
            overall = verdict_of(float(gov.ratio), True, amber)
        ratio = ratio_text(gov.ratio)
        missing = "".join(f"\n  not checked: {p}" for p in a.incomplete_reasons[:4])
        more = len(a.incomplete_reasons) - 4
        if more > 0:
            missing += f"\n  and {more} more (see the warnings)"
        self.verdict.setText(f"{overall} \u2014 governing: {gov.id} in "
                             f"{gov.ply or gov.location}, {gov.combination or 'the layout'}, "
                             f"ratio {ratio}"
                             + missing)
        set_style(self.verdict, "font-weight: bold; font-size: 13px; padding: 4px; color: "
                  + verdict_colour(overall).name() + ";")

    def _tip(self, row: int, c: Check) -> str:
        """The tooltip of a check's row: its equation, factors and place (made again only
        when they changed since the row last showed them).
        """
        key = (c.equation, c.factors, c.sources, c.location)
        kept = self._tips.get(row)
        if kept is not None and kept[0] == key:
            return kept[1]
        tip = "; ".join(f"{k} = {v:.4g} ({c.sources.get(k, '')})"
                        for k, v in c.factors.items())
        tip = plain_tip(f"{c.equation}\n{tip}\n{c.location}")
        self._tips[row] = (key, tip)
        return tip

    def _fit_checks(self) -> None:
        header = self.checks.horizontalHeader()
        if _fit_columns(self.checks):
            for col in range(7):
                header.setSectionResizeMode(col, QHeaderView.ResizeMode.Interactive)
            self.checks.setColumnWidth(RATIO_COLUMN, 90)

    def _fill_plies(self, a: Analysis, u: str) -> None:
        cols = [f for f in fields(PlyResult) if f.name not in ("E",)]
        top = bot = None
        if a.beam is not None:
            combo = max(a.beam.combinations, key=lambda c: abs(c.M_governing))
            top, bot = a.section.ply_extreme_stresses(combo.M_governing)
        headers = [f.metadata["description"] for f in cols]
        if top is not None:
            headers += ["Stress top (governing M)", "Stress bottom (governing M)"]
        self.plies.setColumnCount(len(headers))
        self.plies.setHorizontalHeaderLabels(headers)
        results = a.section.ply_results()
        self.plies.setRowCount(len(results))
        for r, pr in enumerate(results):
            for c, f in enumerate(cols):
                v = getattr(pr, f.name)
                kind = f.metadata["kind"]
                if isinstance(v, str):
                    _put(self.plies, r, c, v, v)
                elif kind:
                    _put(self.plies, r, c, fmt(v, kind, u), float(v))
                else:
                    _put(self.plies, r, c, sig(v, 4), float(v))
            if top is not None and bot is not None:
                _put(self.plies, r, len(cols), fmt(float(top[r]), "stress", u), float(top[r]))
                _put(self.plies, r, len(cols) + 1, fmt(float(bot[r]), "stress", u),
                     float(bot[r]))
        _fit_columns(self.plies)

    def _fill_section(self, a: Analysis, u: str) -> None:
        s = a.section
        rows = [("Reference material", s.reference_material, None),
                ("Neutral axis y", fmt(s.neutral_axis_y, "length", u), s.neutral_axis_y),
                ("I transformed", fmt(s.I_transformed, "second_moment", u), s.I_transformed),
                ("EA", fmt(s.EA, "EA", u), s.EA),
                ("EI", fmt(s.EI, "EI", u), s.EI),
                ("Mass per length", fmt(s.mass_per_length, "mass_per_length", u),
                 s.mass_per_length),
                ("Depth", fmt(s.depth, "length", u), s.depth)]
        if a.beam is not None:
            rows.append(("EI long-term (creep)", fmt(a.beam.creep_section.EI, "EI", u),
                         a.beam.creep_section.EI))
        self.section.setRowCount(len(rows))
        self.section.setHorizontalHeaderLabels(["Property", "Value"])
        for r, (name, text, value) in enumerate(rows):
            _put(self.section, r, 0, name, name)
            _put(self.section, r, 1, text, value)
        _fit_columns(self.section)

    def _fill_beam(self, a: Analysis, u: str) -> None:
        self.beam.setHorizontalHeaderLabels(["Combination", "M max", "M min", "|V| max",
                                             "Deflection", "Deflection with creep"])
        if a.beam is None:
            self.beam.setRowCount(0)
            return
        combos = a.beam.combinations
        self.beam.setRowCount(len(combos))
        for r, c in enumerate(combos):
            e = c.extremes
            cells = [(c.name, c.name), (fmt(e.M_max, "moment", u), e.M_max),
                     (fmt(e.M_min, "moment", u), e.M_min),
                     (fmt(e.V_max_abs, "force", u), e.V_max_abs),
                     (fmt(e.deflection_max_abs, "deflection", u, 3), e.deflection_max_abs),
                     (fmt(c.total.deflection_max_abs, "deflection", u, 3),
                      c.total.deflection_max_abs)]
            for col, (text, value) in enumerate(cells):
                _put(self.beam, r, col, text, value)
        _fit_columns(self.beam)
