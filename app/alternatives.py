"""Alternatives side by side, a chart of their ratios, and the sweep / size / span tools."""

from __future__ import annotations

import math
import textwrap
from dataclasses import replace

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.figure import Figure
from PySide6.QtCore import Qt
from PySide6.QtGui import QColor, QFont
from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QFormLayout,
    QHBoxLayout,
    QInputDialog,
    QLineEdit,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from plystack.app.analysis_model import AnalysisModel
from plystack.app.dialogs import StudyProgress
from plystack.app.document import Document
from plystack.app.results import GREY
from plystack.app.safe import plain_label, reporter
from plystack.core.model import units
from plystack.core.model.caution import CAUTION
from plystack.core.model.errors import ProjectError
from plystack.core.model.project import Alternative
from plystack.core.pipeline import Analysis
from plystack.core.study.compare import (
    Outcome,
    Stopped,
    alternatives_with_current,
    summarise,
    sweep,
)

#: Rows of the side-by-side table: label, how to read it, display kind, best is "min"/"max".
ROWS = (
    ("EI", "EI", "EI", "max"),
    ("Mass per length", "mass", "mass_per_length", "min"),
    ("Governing ratio", "ratio", "", "min"),
    ("Governing check", "gov_id", "", ""),
    ("Deflection, short-term", "d_short", "deflection", "min"),
    ("Deflection, long-term part", "d_long", "deflection", "min"),
    ("Deflection, total with creep", "d_total", "deflection", "min"),
    ("Bolt locations", "bolts", "", "min"),
    ("Checks made pass", "ok", "", ""),
    ("Verdict", "verdict", "", ""),
)


def column_values(a: Analysis) -> dict[str, object]:
    """The side-by-side values of one analysed alternative (SI)."""
    o: Outcome = summarise(a)
    combos = a.beam.combinations if a.beam else ()
    worst = max(combos, key=lambda c: c.total.deflection_max_abs) if combos else None
    bolts = [c for c in a.checks if c.id == "bolts"]
    n_bolts = float("nan")
    if bolts and bolts[0].fasteners is not None and bolts[0].fasteners.locations is not None:
        n_bolts = float(bolts[0].fasteners.locations)
    values: dict[str, object] = {
        "EI": a.section.EI, "mass": a.section.mass_per_length, "ratio": o.governing_ratio,
        "gov_id": o.governing_id,
        "d_short": worst.extremes.deflection_max_abs if worst else 0.0,
        "d_long": (worst.long_term.deflection_max_abs if worst and worst.long_term else 0.0),
        "d_total": worst.total.deflection_max_abs if worst else 0.0,
        "bolts": n_bolts, "ok": o.ok, "verdict": o.verdict,
    }
    groups: dict[str, float] = {}
    for c in a.checks:
        key = f"{c.id}: {c.ply or c.location}"
        groups[key] = max(groups.get(key, 0.0), c.ratio)
    values["checks"] = groups
    defl = [c.ratio for c in a.checks if c.id.startswith("deflection")]
    values["deflection_ratio"] = max(defl) if defl else 0.0
    return values


class AlternativesPanel(QWidget):
    """Side-by-side table of alternatives with best values marked, and a chart."""

    def __init__(self, document: Document, analysis_model: AnalysisModel):
        super().__init__()
        self.document = document
        self.analysis_model = analysis_model
        self.table = QTableWidget(0, 0)
        self.figure = Figure(figsize=(5, 2.4), layout="constrained")
        self.chart = FigureCanvasQTAgg(self.figure)
        self.ax = self.figure.subplots()
        add = self.add_button = QPushButton("Keep current as alternative")
        promote = QPushButton("Make selected current")
        remove = QPushButton("Remove selected")
        add.clicked.connect(lambda _checked=False: self.add_current())
        promote.clicked.connect(self.promote_selected)
        remove.clicked.connect(self.remove_selected)
        buttons = QHBoxLayout()
        for b in (add, promote, remove):
            buttons.addWidget(b)
        self.message = plain_label("")
        self.message.setStyleSheet("color: #b00000;")
        caution = plain_label(CAUTION)
        caution.setStyleSheet("color: #6b4e00; background: #fff6d6; padding: 4px;")
        layout = QVBoxLayout(self)
        layout.addLayout(buttons)
        layout.addWidget(self.message)
        layout.addWidget(self.table, 2)
        layout.addWidget(self.chart, 1)
        layout.addWidget(caution)
        self.values: list[dict[str, object]] = []
        self.names: list[str] = []
        self._context: object = None
        self._cache: dict[tuple[object, ...], dict[str, object]] = {}

    def refresh(self) -> None:
        """Analyse every alternative and fill the table and chart."""
        p = self.document.project
        alts = alternatives_with_current(p) if p.plies else []
        # everything but the plies decides the results: keep them while it is unchanged
        context = replace(p, plies=(), alternatives=())
        if context != self._context:
            self._context, self._cache = context, {}
        self.names, self.values = [], []
        for alt in alts:
            if alt.plies not in self._cache:
                try:
                    v = column_values(self.analysis_model.analyse(p.with_plies(alt.plies)))
                except ProjectError as exc:
                    v = {"error": "; ".join(str(q) for q in exc.problems)}
                except Exception as exc:
                    reporter().report(f"Analysing the alternative \u201c{alt.name}\u201d", exc)
                    v = {"error": f"could not be analysed ({exc})"}
                self._cache[alt.plies] = v
            self.names.append(alt.name)
            self.values.append(self._cache[alt.plies])
        self._cache = {alt.plies: self._cache[alt.plies] for alt in alts}
        check_rows = sorted({k for v in self.values for k in v.get("checks", {})})  # type: ignore[attr-defined]
        labels = [r[0] for r in ROWS] + [f"ratio \u2014 {k}" for k in check_rows]
        self.table.clear()
        self.table.setColumnCount(len(self.names))
        self.table.setRowCount(len(labels))
        self.table.setHorizontalHeaderLabels(self.names)
        self.table.setVerticalHeaderLabels(labels)
        u = p.display_units
        # an INCOMPLETE alternative (a required check not made) is never marked best
        passing = [v.get("ok") is True and v.get("verdict") != "INCOMPLETE"
                   for v in self.values]
        for r, (_label, key, kind, best) in enumerate(ROWS):
            nums = [v.get(key) for v in self.values]
            self._fill_row(r, nums, kind, best, u, passing, whole=key == "bolts")
        for k, name in enumerate(check_rows):
            nums = [v.get("checks", {}).get(name, math.nan) for v in self.values]  # type: ignore[attr-defined]
            self._fill_row(len(ROWS) + k, nums, "", "min", u, passing)
        errors = [f"{n}: {v['error']}" for n, v in zip(self.names, self.values, strict=True)
                  if "error" in v]
        self.message.setText("\n".join(errors))
        self.table.resizeColumnsToContents()
        self._draw_chart()

    def _fill_row(self, r: int, nums: list[object], kind: str, best: str, u: str,
                  passing: list[bool], whole: bool = False) -> None:
        """One row; the best value is marked among the alternatives that pass only."""
        finite = [x for x, ok in zip(nums, passing, strict=True)
                  if ok and isinstance(x, float) and math.isfinite(x)]
        target = (min(finite) if best == "min" else max(finite)) if finite and best else None
        for c, x in enumerate(nums):
            if isinstance(x, bool):
                text = "yes" if x else "NO"
            elif isinstance(x, float):
                text = "\u2014" if not math.isfinite(x) else (
                    units.fmt(x, kind, u) if kind else f"{x:.0f}" if whole else f"{x:.3f}")
            else:
                text = "" if x is None else str(x)
            item = QTableWidgetItem(text)
            item.setData(Qt.ItemDataRole.UserRole, x)
            item.setFlags(item.flags() & ~Qt.ItemFlag.ItemIsEditable)
            if target is not None and x == target and passing[c] and len(nums) > 1:
                f = QFont()
                f.setBold(True)
                item.setFont(f)
                item.setBackground(QColor(220, 240, 220))
                item.setToolTip("best in this row among the alternatives that pass")
            if isinstance(x, bool) and not x:
                item.setForeground(QColor(190, 30, 30))
            self.table.setItem(r, c, item)

    def _draw_chart(self) -> None:
        self.ax.clear()
        if self.names:
            idx = np.arange(len(self.names))
            gov = [float(v.get("ratio", math.nan)) for v in self.values]  # type: ignore[arg-type]
            defl = [float(v.get("deflection_ratio", math.nan)) for v in self.values]  # type: ignore[arg-type]
            self.ax.bar(idx - 0.2, gov, 0.4, label="governing ratio", color="#555e6b")
            self.ax.bar(idx + 0.2, defl, 0.4, label="deflection ratio", color="#c9a25c",
                        hatch="//")
            self.ax.axhline(1.0, color="#b02020", lw=1, ls="--")
            labels = ["\n".join(textwrap.wrap(n, 18, max_lines=2, placeholder="\u2026"))
                      .replace("$", r"\$") for n in self.names]
            self.ax.set_xticks(idx, labels, fontsize=7)
            self.ax.legend(fontsize=7)
            self.ax.set_ylabel("ratio", fontsize=8)
        self.chart.draw_idle()

    def selected_column(self) -> int | None:
        """Column of the selected alternative."""
        cols = {i.column() for i in self.table.selectedIndexes()}
        return min(cols) if cols else None

    def ask_name(self, suggestion: str) -> str | None:
        """Ask for the alternative's name (None: cancelled); replaced in tests."""
        name, ok = QInputDialog.getText(self, "Alternative", "Name of the alternative:",
                                        text=suggestion)
        return name if ok else None

    def add_current(self, name: str | None = None) -> None:
        """Keep the current plies as a named alternative (a name already used gets a
        number added).
        """
        p = self.document.project
        taken = {a.name for a in p.alternatives}
        k = len(p.alternatives) + 1
        while f"alternative {k}" in taken:
            k += 1
        if name is None:
            name = self.ask_name(f"alternative {k}")
        if not isinstance(name, str) or not name.strip():
            return
        name = name.strip()
        base, n = name, 2
        while name in taken:
            name, n = f"{base} ({n})", n + 1
        alts = (*p.alternatives, Alternative(name, p.plies))
        self.document.apply(replace(p, alternatives=alts), "Add alternative")

    def promote(self, name: str) -> None:
        """Make the named alternative's plies the current design."""
        p = self.document.project
        alt = next((a for a in alternatives_with_current(p) if a.name == name), None)
        if alt is not None:
            self.document.apply(p.with_plies(alt.plies), f"Make \u201c{name}\u201d current")

    def promote_selected(self) -> None:
        """Promote the selected column."""
        c = self.selected_column()
        if c is not None and c < len(self.names):
            self.promote(self.names[c])

    def remove_selected(self) -> None:
        """Remove the selected alternative."""
        c = self.selected_column()
        p = self.document.project
        if c is None or c >= len(self.names):
            return
        alts = tuple(a for a in p.alternatives if a.name != self.names[c])
        self.document.apply(replace(p, alternatives=alts), "Remove alternative")


class SweepDialog(QDialog):
    """Vary one dimension of one ply: table and plot, pass/fail boundary marked."""

    def __init__(self, document: Document, parent: QWidget | None = None):
        super().__init__(parent)
        self.setWindowTitle("Sweep a ply dimension")
        self.resize(760, 620)
        self.document = document
        p = document.project
        self.ply = QComboBox()
        self.ply.addItems([q.name for q in p.plies])
        mats = p.all_materials()
        steel = [q.name for q in p.plies if q.material in mats and mats[q.material].kind == "steel"]
        if steel:
            self.ply.setCurrentText(steel[0])
        self.dimension = QComboBox()
        self.dimension.addItems(["width", "height"])
        self.values = QLineEdit("1/8 in, 3/16 in, 1/4 in, 5/16 in, 3/8 in, 1/2 in, 5/8 in, "
                                "3/4 in" if p.display_units == "US" else
                                "4 mm, 6 mm, 8 mm, 10 mm, 12 mm, 15 mm, 20 mm")
        go = QPushButton("Run")
        go.clicked.connect(self.run_sweep)
        self.message = plain_label("")
        self.table = QTableWidget(0, 5)
        self.table.setHorizontalHeaderLabels(["Value", "Governing ratio", "Governs",
                                              "Deflection", "Mass per length"])
        self.figure = Figure(figsize=(6, 2.6), layout="constrained")
        self.canvas = FigureCanvasQTAgg(self.figure)
        form = QFormLayout()
        form.addRow("Ply", self.ply)
        form.addRow("Dimension", self.dimension)
        form.addRow("Values", self.values)
        layout = QVBoxLayout(self)
        layout.addLayout(form)
        layout.addWidget(go)
        layout.addWidget(self.message)
        layout.addWidget(self.table, 1)
        layout.addWidget(self.canvas, 1)
        self.rows: list[Outcome] = []

    def run_sweep(self) -> None:
        """Evaluate every value and show the table and plot."""
        p = self.document.project
        u = p.display_units
        try:
            vals = [units.parse(t.strip(), "length", f"values[{i}]")
                    for i, t in enumerate(self.values.text().split(","))]
        except (units.UnitError, ProjectError) as exc:
            self.message.setText(str(exc))
            return
        progress = StudyProgress(self, "Sweep", f"Evaluating {len(vals)} values\u2026")
        note = CAUTION
        try:
            try:
                self.rows = sweep(p, self.ply.currentText(), self.dimension.currentText(),
                                  vals, progress.report)
            finally:
                progress.close()
        except (units.UnitError, ProjectError) as exc:
            self.message.setText(str(exc))
            return
        except Stopped as stop:
            self.rows = list(stop.outcomes)
            note = (f"Stopped: {len(self.rows)} of {len(vals)} values evaluated.\n"
                    + CAUTION)
        if any(o.verdict == "INCOMPLETE" for o in self.rows):
            note = ("INCOMPLETE: a check the design basis requires could not be made for "
                    "some values (shown in grey); open the member's results to see which.\n"
                    + note)
        self.message.setText(note)
        self.table.setRowCount(len(self.rows))
        for r, o in enumerate(self.rows):
            cells = (units.fmt(o.value, "length", u), f"{o.governing_ratio:.3f}",
                     o.governing_id, units.fmt(o.deflection_max_abs, "deflection", u, 3),
                     units.fmt(o.mass_per_length, "mass_per_length", u))
            for c, text in enumerate(cells):
                item = QTableWidgetItem(text)
                if not o.ok:
                    item.setForeground(QColor(190, 30, 30))
                elif o.verdict == "INCOMPLETE":
                    item.setForeground(GREY)
                self.table.setItem(r, c, item)
        self.figure.clear()
        ax1, ax2 = self.figure.subplots(1, 2)
        x = [units.to_display(o.value, "length", u) for o in self.rows]
        ax1.plot(x, [o.governing_ratio for o in self.rows], "o-", color="#333333")
        ax1.axhline(1.0, color="#b02020", ls="--", lw=1)
        for a, b in zip(self.rows, self.rows[1:], strict=False):
            if a.ok != b.ok:
                xb = units.to_display((a.value + b.value) / 2, "length", u)
                ax1.axvline(xb, color="#b02020", lw=0.8)
                ax1.annotate("pass / fail", (xb, 1.0), fontsize=7, xytext=(3, 3),
                             textcoords="offset points")
        ax1.set_xlabel(f"{self.dimension.currentText()} ({units.unit_label('length', u)})")
        ax1.set_ylabel("governing ratio")
        ax2.plot(x, [units.to_display(o.mass_per_length, "mass_per_length", u)
                     for o in self.rows], "s-", color="#9a6b2f")
        ax2.set_ylabel(f"mass ({units.unit_label('mass_per_length', u)})")
        ax2.set_xlabel(ax1.get_xlabel())
        self.canvas.draw_idle()
