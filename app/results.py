"""Results: verdict and caution, checks with ratio bars, per-ply table, section and beam.

Every numeric cell keeps its SI value in Qt.UserRole, so tests compare numbers with
core/ rather than pixels.
"""

from __future__ import annotations

from dataclasses import fields

from PySide6.QtCore import QModelIndex, QRect, Qt
from PySide6.QtGui import QColor, QPainter
from PySide6.QtWidgets import (
    QLabel,
    QStyledItemDelegate,
    QStyleOptionViewItem,
    QTableWidget,
    QTableWidgetItem,
    QTabWidget,
    QVBoxLayout,
    QWidget,
)

from plystack.core.design.text import governing_per_group
from plystack.core.model.caution import CAUTION
from plystack.core.model.units import fmt, sig
from plystack.core.pipeline import Analysis
from plystack.core.section.transformed import PlyResult

RATIO_COLUMN = 5


class RatioBar(QStyledItemDelegate):
    """Draws the ratio as a bar (full width = 1.0) with the number on it."""

    def paint(self, painter: QPainter, option: QStyleOptionViewItem,  # noqa: D102
              index: QModelIndex) -> None:
        ratio = index.data(Qt.ItemDataRole.UserRole)
        if not isinstance(ratio, float):
            return super().paint(painter, option, index)
        r = option.rect.adjusted(2, 3, -2, -3)
        painter.save()
        painter.fillRect(r, QColor(240, 240, 240))
        w = int(r.width() * min(ratio, 1.0))
        color = QColor(70, 140, 90) if ratio <= 1.0 else QColor(190, 50, 50)
        painter.fillRect(QRect(r.left(), r.top(), w, r.height()), color)
        painter.setPen(QColor(0, 0, 0))
        painter.drawText(r, Qt.AlignmentFlag.AlignCenter, f"{ratio:.3f}")
        painter.restore()


def _item(text: str, value: object = None) -> QTableWidgetItem:
    item = QTableWidgetItem(text)
    item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
    if value is not None:
        item.setData(Qt.ItemDataRole.UserRole, value)
    return item


class ResultsPanel(QWidget):
    """Shows an analysis, or the problem that stopped it."""

    def __init__(self) -> None:
        super().__init__()
        self.verdict = QLabel("")
        self.verdict.setWordWrap(True)
        self.verdict.setStyleSheet("font-weight: bold; font-size: 13px; padding: 4px;")
        self.caution = QLabel(CAUTION)
        self.caution.setWordWrap(True)
        self.caution.setStyleSheet("color: #6b4e00; background: #fff6d6; padding: 4px;")
        self.error = QLabel("")
        self.error.setWordWrap(True)
        self.error.setStyleSheet("color: #b00000;")
        self.checks = QTableWidget(0, 7)
        self.checks.setHorizontalHeaderLabels(["Check", "Ply / place", "Combination",
                                               "Demand", "Capacity", "Ratio", "Verdict"])
        self.checks.setItemDelegateForColumn(RATIO_COLUMN, RatioBar(self.checks))
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
        layout = QVBoxLayout(self)
        layout.addWidget(self.error)
        layout.addWidget(self.verdict)
        layout.addWidget(self.tabs, 1)
        layout.addWidget(self.caution)

    def show_error(self, message: str) -> None:
        """A computation failed: say why; keep the last tables greyed out."""
        self.error.setStyleSheet("color: #b00000;")
        self.error.setText(message)
        self.verdict.setText("No results: fix the problem above.")
        for t in (self.checks, self.plies, self.section, self.beam):
            t.setEnabled(False)

    def show_analysis(self, a: Analysis) -> None:
        """Fill every table from an analysis."""
        self.error.setText("\n".join(f"Warning: {w}" for w in a.warnings))
        self.error.setStyleSheet("color: #8a5a00;")
        for t in (self.checks, self.plies, self.section, self.beam):
            t.setEnabled(True)
        u = a.project.display_units
        self._fill_checks(a, u)
        self._fill_plies(a, u)
        self._fill_section(a, u)
        self._fill_beam(a, u)

    def _fill_checks(self, a: Analysis, u: str) -> None:
        rows = governing_per_group(a.checks)
        self.checks.setRowCount(len(rows))
        for r, c in enumerate(rows):
            kind = c.quantity
            where = c.ply or c.location
            if c.id == "bearing":
                where = c.location
            self.checks.setItem(r, 0, _item(c.id, c.id))
            self.checks.setItem(r, 1, _item(where or "", where))
            self.checks.setItem(r, 2, _item(c.combination or "", c.combination))
            self.checks.setItem(r, 3, _item(fmt(c.demand, kind, u), float(c.demand)))
            self.checks.setItem(r, 4, _item(fmt(c.capacity, kind, u), float(c.capacity)))
            self.checks.setItem(r, 5, _item("", float(c.ratio)))
            verdict = _item("OK" if c.ok else "NOT OK", c.ok)
            verdict.setForeground(QColor(30, 120, 50) if c.ok else QColor(190, 30, 30))
            self.checks.setItem(r, 6, verdict)
            tip = "; ".join(f"{k} = {v:.4g} ({c.sources.get(k, '')})"
                            for k, v in c.factors.items())
            for col in range(7):
                item = self.checks.item(r, col)
                item.setToolTip(f"{c.equation}\n{tip}\n{c.location}")
        self.checks.resizeColumnsToContents()
        self.checks.setColumnWidth(RATIO_COLUMN, 110)
        if not a.checks:
            self.verdict.setText("No checks: give the beam (spans, supports, loads) to check "
                                 "the member.")
            return
        ok = all(c.ok for c in a.checks)
        gov = rows[0]
        self.verdict.setText(f"{'OK' if ok else 'NOT OK'} \u2014 governing: {gov.id} in "
                             f"{gov.ply or gov.location}, {gov.combination}, ratio "
                             f"{gov.ratio:.3f}")
        self.verdict.setStyleSheet("font-weight: bold; font-size: 13px; padding: 4px; color: "
                                   + ("#1e7a32;" if ok else "#be1e1e;"))

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
                    self.plies.setItem(r, c, _item(v, v))
                elif kind:
                    self.plies.setItem(r, c, _item(fmt(v, kind, u), float(v)))
                else:
                    self.plies.setItem(r, c, _item(sig(v, 4), float(v)))
            if top is not None and bot is not None:
                self.plies.setItem(r, len(cols), _item(fmt(float(top[r]), "stress", u),
                                                       float(top[r])))
                self.plies.setItem(r, len(cols) + 1, _item(fmt(float(bot[r]), "stress", u),
                                                           float(bot[r])))
        self.plies.resizeColumnsToContents()

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
            self.section.setItem(r, 0, _item(name, name))
            self.section.setItem(r, 1, _item(text, value))
        self.section.resizeColumnsToContents()

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
                self.beam.setItem(r, col, _item(text, value))
        self.beam.resizeColumnsToContents()
