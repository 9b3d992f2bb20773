"""Beam and design panel: spans, supports, overhangs, loads table, combinations, basis,
and the reactions of every load case and combination (from the analysis model).

Only the fields of the chosen design basis are shown (the other basis's keys stay in the
project as they are, but are not offered for editing).
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt, Signal
from PySide6.QtGui import QColor, QShowEvent
from PySide6.QtWidgets import (
    QCheckBox,
    QComboBox,
    QFormLayout,
    QHBoxLayout,
    QHeaderView,
    QLabel,
    QLineEdit,
    QPushButton,
    QScrollArea,
    QSpinBox,
    QStyledItemDelegate,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
    QWidget,
)

from plystack.app.analysis_model import AnalysisModel
from plystack.app.document import Document
from plystack.app.quantity import BAD_STYLE, QuantityEdit, parse_entry
from plystack.app.safe import guarded, plain_label, plain_tip
from plystack.core.io.design_file import bolt_diameter_problem, connector_problems
from plystack.core.model import units
from plystack.core.model.design import (
    CONNECTOR_TYPES,
    STEEL_RULES,
    TEMPERATURES,
    Connector,
    DesignSpec,
)
from plystack.core.model.errors import Problem
from plystack.core.model.member import (
    CASES,
    LOAD_TYPES,
    SUPPORTS,
    BeamLayout,
    BeamSpec,
    Load,
    bearing_problem,
    validate_layout,
    validate_load,
)

COLUMNS = ("Case", "Type", "Value", "Tributary width", "From", "To", "At")
VALUE_KIND = {"area": "area_load", "line": "line_load", "point": "force"}


class ChoiceDelegate(QStyledItemDelegate):
    """A drop-down editor for a table column with a fixed set of values."""

    def __init__(self, choices: tuple[str, ...], parent: QWidget):
        super().__init__(parent)
        self.choices = choices

    def createEditor(self, parent, option, index):  # type: ignore[no-untyped-def]  # noqa: D102
        box = QComboBox(parent)
        box.addItems(list(self.choices))
        return box

    def setEditorData(self, editor, index):  # type: ignore[no-untyped-def]  # noqa: D102
        editor.setCurrentText(str(index.data() or self.choices[0]))

    def setModelData(self, editor, model, index):  # type: ignore[no-untyped-def]  # noqa: D102
        model.setData(index, editor.currentText())



class MessageLabel(QLabel):
    """The panel's message: plain text, shown only while it says something."""

    def __init__(self) -> None:
        super().__init__()
        self.setTextFormat(Qt.TextFormat.PlainText)
        self.setWordWrap(True)
        self.setContentsMargins(6, 4, 6, 4)
        self.setVisible(False)

    def setText(self, text: str) -> None:
        """Show ``text``; hide the label while it is empty."""
        super().setText(text)
        self.setVisible(bool(text))

#: The spans field's tooltip while its text is accepted.
SPANS_TIP = 'Spans left to right, separated by commas, e.g. "12 ft" or "4 m, 5.5 m"'


def default_beam(system: str) -> BeamSpec:
    """A simple span with no loads but self-weight, for a new project."""
    span = 12 * 0.3048 if system == "US" else 3.6
    return BeamSpec(BeamLayout((span,), "simple"), (), True, None,
                    "ASD" if system == "US" else "EN1990")


class OptionalQuantityEdit(QuantityEdit):
    """A :class:`QuantityEdit` that may be left empty: emptying it emits ``cleared``."""

    cleared = Signal()

    def _commit(self) -> None:
        if not self.text().strip():
            self._mark("")
            self.cleared.emit()
            return
        super()._commit()


#: Connector keys that apply to some types only, with the types they apply to (the file
#: rules of the design object's connector).
CONNECTOR_ONLY = {"diameter": ("screw", "bolt", "nail", "lag-screw"),
                  "spacing_max": ("screw", "bolt", "nail", "lag-screw"),
                  "predrilled": ("nail",)}


class BeamPanel(QWidget):
    """Edits the project's beam and design basis; bad entries are marked in place."""

    def __init__(self, document: Document, analysis: AnalysisModel | None = None):
        super().__init__()
        self.document = document
        self.analysis = analysis
        system = lambda: self.document.project.display_units  # noqa: E731
        self._updating = False
        self.has_beam = QCheckBox("Analyse as a beam (spans, supports, loads)")
        self.spans = QLineEdit()
        self.spans.setToolTip(SPANS_TIP)
        self.supports = QComboBox()
        self.supports.addItems(SUPPORTS)
        nonneg = lambda v: None if v >= 0 else "must be zero or more"  # noqa: E731
        positive = lambda v: None if v > 0 else "must be greater than zero"  # noqa: E731
        self.over_left = QuantityEdit("span", "overhang left", system, nonneg)
        self.over_right = QuantityEdit("span", "overhang right", system, nonneg)
        self.bearing = QuantityEdit("length", "bearing length", system, self._bearing_problem)
        self.self_weight = QCheckBox("Include self-weight (case D)")
        self.combos = QComboBox()
        self.combos.addItems(["ASD", "EN1990"])
        self.basis = QComboBox()
        self.basis.addItems(["US-ASD", "EU-LSD"])
        self.wet = QCheckBox("Wet service")
        self.repetitive = QCheckBox("Repetitive member (C_r)")
        self.braced = QCheckBox("Compression edge braced")
        self.service_class = QComboBox()
        self.service_class.addItems(["1", "2", "3"])
        self.temperature = QComboBox()
        self.temperature.addItems(list(TEMPERATURES))
        self.incised = QCheckBox("Incised lumber (C_i)")
        self.steel_rule = QComboBox()
        self.steel_rule.addItems(list(STEEL_RULES))
        self.live_limit = QLineEdit()
        self.total_limit = QLineEdit()
        for edit in (self.live_limit, self.total_limit):
            edit.setToolTip("Span divided by this number, e.g. 360")
        self.bolt_diameter = QuantityEdit(
            "length", "bolt diameter", system,
            lambda v: bolt_diameter_problem(v, self.document.project.design_or_default().basis))
        self.connector_allowable = QuantityEdit("force", "connector allowable", system, positive)
        self.connector_allowable.setToolTip("Allowable (US) or design (EU) lateral load of one "
                                            "connector, already adjusted")
        self.connector_type = QComboBox()
        self.connector_type.addItems(list(CONNECTOR_TYPES))
        self.connector_type.setToolTip("Fastener of the interfaces between stacked plies "
                                       "(glue: fully composite)")
        self.connector_diameter = OptionalQuantityEdit("length", "connector diameter", system,
                                                       positive)
        self.connector_diameter.setToolTip("Fastener diameter; with it the slip of the "
                                           "fasteners is analysed (EN 1995-1-1 Annex B); "
                                           "empty: fully composite")
        self.connector_spacing = OptionalQuantityEdit("length", "connector spacing", system,
                                                      positive)
        self.connector_spacing.setToolTip("Spacing of the stations along the member (the "
                                          "smallest where it varies); empty: chosen by "
                                          "the program")
        self.connector_spacing_max = OptionalQuantityEdit("length", "connector largest spacing",
                                                          system, positive)
        self.connector_spacing_max.setToolTip("Largest spacing where it varies with the "
                                              "shear force, at most 4 times the spacing; "
                                              "empty: constant spacing")
        self.connector_rows = QSpinBox()
        self.connector_rows.setRange(1, 20)
        self.connector_rows.setKeyboardTracking(False)
        self.connector_rows.setToolTip("Connectors at each station, across the width")
        self.connector_predrilled = QCheckBox("Nails in predrilled holes")
        self.error = MessageLabel()
        self.error.setStyleSheet("color: #b00000")
        self.reactions = QTableWidget(0, 0)
        self._reactions_pending = False  # an analysis came while the panel was hidden
        self.reactions.verticalHeader().setVisible(False)
        self.reactions.setMinimumHeight(140)
        self.reactions.setEditTriggers(QTableWidget.EditTrigger.NoEditTriggers)
        self.loads = QTableWidget(0, len(COLUMNS))
        self.loads.setMinimumHeight(130)
        self.loads.horizontalHeader().setSectionResizeMode(
            QHeaderView.ResizeMode.ResizeToContents)
        self.loads.setHorizontalHeaderLabels(COLUMNS)
        self.loads.verticalHeader().setVisible(False)
        self.loads.setItemDelegateForColumn(0, ChoiceDelegate(CASES, self.loads))
        self.loads.setItemDelegateForColumn(1, ChoiceDelegate(LOAD_TYPES, self.loads))
        add = QPushButton("Add load")
        remove = QPushButton("Remove load")
        form = QFormLayout()
        form.addRow(self.has_beam)
        form.addRow("Spans", self.spans)
        form.addRow("Supports", self.supports)
        form.addRow("Overhang left", self.over_left)
        form.addRow("Overhang right", self.over_right)
        form.addRow("Bearing length", self.bearing)
        form.addRow(self.self_weight)
        form.addRow("Combinations", self.combos)
        form.addRow("Design basis", self.basis)
        form.addRow("Service class", self.service_class)
        form.addRow("Temperature (NDS C_t)", self.temperature)
        form.addRow("Steel plate allowable", self.steel_rule)
        form.addRow("Deflection limit, live L /", self.live_limit)
        form.addRow("Deflection limit, total L /", self.total_limit)
        form.addRow("Bolt diameter (flitch)", self.bolt_diameter)
        form.addRow("Connector allowable (stacked)", self.connector_allowable)
        form.addRow("Connector type", self.connector_type)
        form.addRow("Connector diameter", self.connector_diameter)
        form.addRow("Connector spacing", self.connector_spacing)
        form.addRow("Connector largest spacing", self.connector_spacing_max)
        form.addRow("Connectors per station", self.connector_rows)
        form.addRow(self.connector_predrilled)
        form.addRow(self.wet)
        form.addRow(self.repetitive)
        form.addRow(self.incised)
        form.addRow(self.braced)
        self.form = form
        buttons = QHBoxLayout()
        buttons.addWidget(add)
        buttons.addWidget(remove)
        inner = QWidget()
        layout = QVBoxLayout(inner)
        layout.addLayout(form)
        layout.addWidget(plain_label("Loads (positions from the left end of the member)"))
        layout.addWidget(self.loads, 1)
        layout.addLayout(buttons)
        layout.addWidget(plain_label("Reactions (upward +), per load case and per "
                                     "combination"))
        layout.addWidget(self.reactions, 1)
        scroll = QScrollArea()
        scroll.setWidget(inner)
        scroll.setWidgetResizable(True)
        scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarPolicy.ScrollBarAlwaysOff)
        outer = QVBoxLayout(self)
        outer.setContentsMargins(0, 0, 0, 0)
        outer.addWidget(self.error)  # above the scrolled fields: always in view
        outer.addWidget(scroll)
        if analysis is not None:
            analysis.analysis_changed.connect(self.show_reactions)
        self.has_beam.toggled.connect(self._toggle_beam)
        self.spans.editingFinished.connect(self._set_spans)
        self.supports.activated.connect(lambda _i: self._set_layout(
            supports=self.supports.currentText()))
        self.over_left.accepted.connect(lambda v: self._set_layout(self.over_left,
                                                                   overhang_left=v))
        self.over_right.accepted.connect(lambda v: self._set_layout(self.over_right,
                                                                    overhang_right=v))
        for edit in (self.over_left, self.over_right, self.bearing):
            edit.rejected.connect(self.error.setText)
        self.bearing.accepted.connect(lambda v: self._set_beam("Set bearing length",
                                                               bearing_length=v))
        self.self_weight.toggled.connect(lambda on: self._set_beam("Self-weight",
                                                                   self_weight=on))
        self.combos.activated.connect(lambda _i: self._set_beam(
            "Set combinations", combinations=self.combos.currentText()))
        self.basis.activated.connect(self._set_basis)
        self.service_class.activated.connect(lambda _i: self._set_design(
            service_class=int(self.service_class.currentText())))
        self.wet.toggled.connect(lambda on: self._set_design(wet_service=on))
        self.repetitive.toggled.connect(lambda on: self._set_design(repetitive_member=on))
        self.braced.toggled.connect(lambda on: self._set_design(compression_edge_braced=on))
        self.incised.toggled.connect(lambda on: self._set_design(incised=on))
        self.temperature.activated.connect(lambda _i: self._set_design(
            temperature=self.temperature.currentText()))
        self.steel_rule.activated.connect(lambda _i: self._set_design(
            steel_rule=self.steel_rule.currentText()))
        self.live_limit.editingFinished.connect(lambda: self._set_limit("live"))
        self.total_limit.editingFinished.connect(lambda: self._set_limit("total"))
        self.bolt_diameter.accepted.connect(self._set_bolt)
        self.connector_allowable.accepted.connect(self._set_connector)
        for edit in (self.bolt_diameter, self.connector_allowable):
            edit.rejected.connect(self.error.setText)
        self.connector_type.activated.connect(lambda _i: self._set_connector_type(
            self.connector_type.currentText()))
        for key in ("diameter", "spacing", "spacing_max"):
            edit = getattr(self, f"connector_{key}")
            edit.accepted.connect(lambda v, k=key: self._set_connector_key(k, v))
            edit.cleared.connect(lambda k=key: self._set_connector_key(k, None))
            edit.rejected.connect(self.error.setText)
        self.connector_rows.valueChanged.connect(lambda n: self._set_connector_key("rows", n))
        self.connector_predrilled.toggled.connect(
            lambda on: self._set_connector_key("predrilled", on))
        self.loads.cellChanged.connect(self._cell_changed)
        add.clicked.connect(self.add_load)
        remove.clicked.connect(self.remove_load)
        document.changed.connect(self.refresh)
        document.drag_finished.connect(self._drag_finished)
        self._shown: tuple[object, ...] | None = None
        self.refresh()

    # --- model -> widgets -----------------------------------------------------------------

    def _drag_finished(self) -> None:
        """The drag is over: the fields and the reactions' columns catch up."""
        self.refresh()
        self.reactions.resizeColumnsToContents()

    def refresh(self) -> None:
        """Show the model's values (during a drag only when the beam, the design or the
        units changed: a drag on the section moves plies only).
        """
        p = self.document.project
        shown = (p.beam, p.design, p.display_units)
        if self.document.dragging and self._shown is not None and all(
                a is b for a, b in zip(shown, self._shown, strict=True)):
            return
        self._shown = shown
        self._updating = True
        u = p.display_units
        beam = p.beam
        self.has_beam.setChecked(beam is not None)
        for w in (self.spans, self.supports, self.over_left, self.over_right, self.bearing,
                  self.self_weight, self.combos, self.loads):
            w.setEnabled(beam is not None)
        design = p.design_or_default()
        self.basis.setCurrentText(design.basis)
        self._show_basis_fields(design.us)
        self.service_class.setCurrentText(str(design.service_class))
        self.wet.setChecked(design.wet_service)
        self.repetitive.setChecked(design.repetitive_member)
        self.braced.setChecked(design.compression_edge_braced)
        self.incised.setChecked(design.incised)
        self.temperature.setCurrentText(design.temperature)
        self.steel_rule.setCurrentText(design.steel_rule)
        live, total, _ = design.deflection_limits()
        for which, edit, value in (("live", self.live_limit, live),
                                   ("total", self.total_limit, total)):
            if not edit.hasFocus():  # the model's value: a refused entry's mark goes
                edit.setText(f"{value:g}")
                edit.setStyleSheet("")
                if self.error.text().startswith(f"deflection limit {which}:"):
                    self.error.setText("")
        self.bolt_diameter.set_value(design.bolt.diameter)
        self._show_connector(design.connector)
        if beam is not None:
            lay = beam.layout
            if not self.spans.hasFocus():
                self.spans.setText(", ".join(units.display_string(s, "span", u, 6)
                                             for s in lay.spans))
                self.spans.setStyleSheet("")
                self.spans.setToolTip(SPANS_TIP)
            self.supports.setCurrentText(lay.supports)
            self.over_left.set_value(lay.overhang_left)
            self.over_right.set_value(lay.overhang_right)
            self.bearing.set_value(beam.bearing_length)
            self.self_weight.setChecked(beam.self_weight)
            if isinstance(beam.combinations, str):
                self.combos.setCurrentText(beam.combinations)
            elif beam.combinations is None:
                self.combos.setCurrentText("ASD" if design.us else "EN1990")
            self._fill_loads(beam.loads, u)
        self._updating = False

    def _show_connector(self, conn: Connector) -> None:
        self.connector_allowable.set_value(conn.allowable)
        self.connector_type.setCurrentText(conn.type)
        self.connector_diameter.set_value(conn.diameter)
        self.connector_spacing.set_value(conn.spacing)
        self.connector_spacing_max.set_value(conn.spacing_max)
        self.connector_rows.setValue(conn.rows)
        self.connector_predrilled.setChecked(conn.predrilled)
        self.connector_predrilled.setEnabled(conn.type in CONNECTOR_ONLY["predrilled"])
        for key in ("diameter", "spacing_max"):
            getattr(self, f"connector_{key}").setEnabled(conn.type in CONNECTOR_ONLY[key])

    US_ONLY = ("temperature", "steel_rule", "wet", "repetitive", "incised", "braced")
    EU_ONLY = ("service_class",)

    def _show_basis_fields(self, us: bool) -> None:
        for name in self.US_ONLY:
            self.form.setRowVisible(getattr(self, name), us)
        for name in self.EU_ONLY:
            self.form.setRowVisible(getattr(self, name), not us)

    @guarded("Showing the reactions")
    def show_reactions(self) -> None:
        """Reactions at every support for each load case and each combination; while the
        panel is hidden (its tab not on top) they are filled once it is shown.
        """
        if not self.isVisible():
            self._reactions_pending = True
            return
        self._reactions_pending = False
        a = self.analysis.analysis if self.analysis is not None else None
        if a is None or a.beam is None:
            self.reactions.setRowCount(0)
            self.reactions.setColumnCount(0)
            return
        u = a.project.display_units
        xs = a.beam.model.layout.support_positions()
        rows = [(f"case {name}", sol) for name, sol in a.beam.cases.items()]
        rows += [(c.name, c.solution) for c in a.beam.combinations]
        moments = any(abs(float(m)) > 0 for _, sol in rows for m in sol.reaction_moments)
        headers = [f"R at {units.fmt(x, 'span', u, 4)}" for x in xs]
        if moments:
            headers += [f"M at {units.fmt(x, 'span', u, 4)}" for x in xs]
        self.reactions.setColumnCount(1 + len(headers))
        self.reactions.setHorizontalHeaderLabels(["Case / combination", *headers])
        self.reactions.setRowCount(len(rows))
        for r, (name, sol) in enumerate(rows):
            values = [("force", float(v)) for v in sol.reactions]
            if moments:
                values += [("moment", float(v)) for v in sol.reaction_moments]
            cells = [(name, name)] + [(units.fmt(v, kind, u), v) for kind, v in values]
            for col, (text, value) in enumerate(cells):
                self._put_reaction(r, col, text, value)
        if not self.document.dragging:  # widths hold still during a drag
            self.reactions.resizeColumnsToContents()

    def showEvent(self, event: QShowEvent) -> None:  # noqa: D102 - Qt API
        super().showEvent(event)
        if self._reactions_pending:
            self.show_reactions()

    def _put_reaction(self, row: int, col: int, text: str, value: object) -> None:
        """One cell of the reactions in place (only what changed is set)."""
        item = self.reactions.item(row, col)
        role = Qt.ItemDataRole.UserRole
        if item is None:
            item = QTableWidgetItem(text)
            item.setData(role, value)
            item.setToolTip(plain_tip(text))
            self.reactions.setItem(row, col, item)
            return
        if item.text() != text:
            item.setText(text)
            item.setToolTip(plain_tip(text))
        old = item.data(role)
        if type(old) is not type(value) or old != value:
            item.setData(role, value)

    def _fill_loads(self, loads: tuple[Load, ...], u: str) -> None:
        self.loads.blockSignals(True)
        self.loads.setRowCount(len(loads))
        for r, ld in enumerate(loads):
            cells = [ld.case, ld.type,
                     units.display_string(ld.value, VALUE_KIND[ld.type], u, 6),
                     "" if ld.tributary_width is None else
                     units.display_string(ld.tributary_width, "span", u, 6),
                     "" if ld.start is None else units.display_string(ld.start, "span", u, 6),
                     "" if ld.end is None else units.display_string(ld.end, "span", u, 6),
                     "" if ld.at is None else units.display_string(ld.at, "span", u, 6)]
            for c, text in enumerate(cells):
                item = QTableWidgetItem(text)
                self.loads.setItem(r, c, item)
        self.loads.resizeColumnsToContents()
        self.loads.blockSignals(False)

    # --- widgets -> model -----------------------------------------------------------------

    def _apply_beam(self, beam: BeamSpec | None, text: str) -> None:
        self.error.setText("")
        self.document.apply(replace(self.document.project, beam=beam), text)

    def _toggle_beam(self, on: bool) -> None:
        if self._updating:
            return
        p = self.document.project
        if on and p.beam is None:
            self._apply_beam(default_beam(p.display_units), "Add beam")
        elif not on and p.beam is not None:
            self._apply_beam(None, "Remove beam")

    def _set_beam(self, text: str, **changes: object) -> None:
        beam = self.document.project.beam
        if self._updating or beam is None:
            return
        self._apply_beam(replace(beam, **changes), text)  # type: ignore[arg-type]

    def _set_layout(self, source: QLineEdit | None = None, **changes: object) -> None:
        """Apply a change of the layout; a refused one marks ``source`` (the field it was
        typed into) and says that the results are still those of the layout as it was.
        """
        beam = self.document.project.beam
        if self._updating or beam is None:
            return
        layout = replace(beam.layout, **changes)  # type: ignore[arg-type]
        u = self.document.project.display_units
        problems = validate_layout(layout)
        if not problems:  # the loads are judged on a member that exists
            problems = [q for i, ld in enumerate(beam.loads)
                        for q in validate_load(ld, layout.length, f"beam.loads[{i}]", u)]
            why = (None if beam.bearing_length is None
                   else bearing_problem(beam.bearing_length, layout, u))
            if why is not None:
                problems.append(Problem("beam.bearing_length", why))
        if problems:
            self._refuse("; ".join(str(q) for q in problems), source)
            self.refresh_soon()
            return
        if source is not None:
            source.setStyleSheet("")
            source.setToolTip(SPANS_TIP if source is self.spans else "")
        self._apply_beam(replace(beam, layout=layout), "Change beam layout")

    def _refuse(self, reason: str, source: QLineEdit | None) -> None:
        """Say why a layout edit is not applied, and that the results shown are still
        those of the spans as they were; mark ``source``, the field it was typed into.
        """
        beam = self.document.project.beam
        u = self.document.project.display_units
        was = "" if beam is None else ", ".join(units.fmt(s, "span", u)
                                                for s in beam.layout.spans)
        message = f"{reason}. Not applied: the results shown are for the spans {was}."
        self.error.setText(message)
        if source is not None:
            source.setStyleSheet(BAD_STYLE)
            source.setToolTip(message)

    def _bearing_problem(self, value: float) -> str | None:
        """Why a bearing length typed into the field cannot be (the file's rule)."""
        if not value > 0:
            return "must be greater than zero"
        beam = self.document.project.beam
        return None if beam is None else bearing_problem(value, beam.layout,
                                                         self.document.project.display_units)

    def refresh_soon(self) -> None:
        """Restore the widgets from the model (after a refused edit of a combo box)."""
        beam = self.document.project.beam
        if beam is not None:
            self._updating = True
            self.supports.setCurrentText(beam.layout.supports)
            self._updating = False

    @guarded("Setting the spans")
    def _set_spans(self) -> None:
        beam = self.document.project.beam
        if self._updating or beam is None:
            return
        u = self.document.project.display_units
        spans = []
        for i, part in enumerate(self.spans.text().split(",")):
            try:
                spans.append(parse_entry(part, "span", u, f"beam.spans[{i}]"))
            except units.UnitError as exc:
                self._refuse(str(exc), self.spans)
                return
        self._set_layout(self.spans, spans=tuple(spans))

    def _set_basis(self, _index: int) -> None:
        if self._updating:
            return
        basis = self.basis.currentText()
        p = self.document.project
        design = replace(p.design_or_default(), basis=basis)
        beam = p.beam
        if beam is not None and (beam.combinations is None or isinstance(beam.combinations, str)):
            beam = replace(beam, combinations="ASD" if basis == "US-ASD" else "EN1990")
        self.document.apply(replace(p, design=design, beam=beam), "Set design basis")

    def _set_design(self, **changes: object) -> None:
        if self._updating:
            return
        p = self.document.project
        design: DesignSpec = replace(p.design_or_default(), **changes)  # type: ignore[arg-type]
        self.document.apply(replace(p, design=design), "Change design choices")

    def _set_limit(self, which: str) -> None:
        if self._updating:
            return
        edit = self.live_limit if which == "live" else self.total_limit
        try:
            value = float(edit.text())
        except ValueError:
            value = float("nan")
        if not 1 <= value <= 100000:
            self.error.setText(f"deflection limit {which}: \u201c{edit.text()}\u201d must be a "
                               "number such as 360 (span divided by it)")
            edit.setStyleSheet(BAD_STYLE)
            return
        edit.setStyleSheet("")
        self._set_design(**{f"{which}_limit": value})

    def _set_bolt(self, diameter: float) -> None:
        design = self.document.project.design_or_default()
        self._set_design(bolt=replace(design.bolt, diameter=diameter))

    def _set_connector(self, allowable: float) -> None:
        design = self.document.project.design_or_default()
        self._set_design(connector=replace(design.connector, allowable=allowable))

    def _set_connector_type(self, kind: str) -> None:
        """A new connector type; the keys that do not apply to it (a diameter and a
        varying spacing for glue, predrilling but for nails) are dropped in the same step.
        """
        if self._updating:
            return
        conn = self.document.project.design_or_default().connector
        changes: dict[str, object] = {"type": kind}
        for key, kinds in CONNECTOR_ONLY.items():
            if kind not in kinds:
                changes[key] = False if key == "predrilled" else None
        self._apply_connector(replace(conn, **changes), None)  # type: ignore[arg-type]

    def _set_connector_key(self, key: str, value: object) -> None:
        if self._updating:
            return
        conn = self.document.project.design_or_default().connector
        self._apply_connector(replace(conn, **{key: value}), key)  # type: ignore[arg-type]

    def _apply_connector(self, conn: Connector, key: str | None) -> None:
        """One undoable design edit, or the problems named in place (the project as it
        was) where the connector's keys do not fit together (the file's rules).
        """
        problems: list[Problem] = []
        connector_problems(conn, "design.connector", problems)
        if problems:
            message = "; ".join(str(q) for q in problems)
            self.error.setText(message)
            edit = getattr(self, f"connector_{key}", None) if key else None
            typed = edit.text() if isinstance(edit, QuantityEdit) else ""
            self._updating = True
            self._show_connector(self.document.project.design_or_default().connector)
            self._updating = False
            if isinstance(edit, QuantityEdit):  # keep the entry, marked, to correct it
                edit.setText(typed)
                edit.error_text = message
                edit.setStyleSheet(BAD_STYLE)
                edit.setToolTip(message)
            return
        self.error.setText("")
        self._set_design(connector=conn)

    def _row_load(self, row: int) -> Load:
        u = self.document.project.display_units
        text = [(self.loads.item(row, c).text().strip() if self.loads.item(row, c) else "")
                for c in range(len(COLUMNS))]
        case, typ = text[0], text[1]
        path = f"loads[{row}]"
        if case not in CASES:
            raise units.UnitError(f"{path}.case: \u201c{case}\u201d is not one of "
                                  + ", ".join(CASES))
        if typ not in LOAD_TYPES:
            raise units.UnitError(f"{path}.type: \u201c{typ}\u201d is not one of "
                                  + ", ".join(LOAD_TYPES))
        value = parse_entry(text[2], VALUE_KIND[typ], u, f"{path}.value")

        def opt(k: int, name: str) -> float | None:
            return parse_entry(text[k], "span", u, f"{path}.{name}") if text[k] else None

        return Load(case, typ, value, opt(3, "tributary_width") if typ == "area" else None,
                    opt(4, "from") if typ != "point" else None,
                    opt(5, "to") if typ != "point" else None,
                    opt(6, "at") if typ == "point" else None)

    @guarded("Editing a load")
    def _cell_changed(self, row: int, column: int) -> None:
        beam = self.document.project.beam
        if self._updating or beam is None:
            return
        try:
            load = self._row_load(row)
        except units.UnitError as exc:
            self._mark(row, column, str(exc))
            return
        problems = validate_load(load, beam.layout.length, f"loads[{row}]",
                                 self.document.project.display_units)
        if problems:
            self._mark(row, column, "; ".join(str(q) for q in problems))
            return
        loads = list(beam.loads)
        old = loads[row]
        # not columns: keep them (a varying intensity or a bearing length only while the
        # load keeps its type; the stage always)
        load = replace(load, description=old.description, stage=old.stage,
                       value_end=old.value_end if load.type == old.type else None,
                       bearing_length=old.bearing_length if load.type == "point" else None)
        loads[row] = load
        self._apply_beam(replace(beam, loads=tuple(loads)), "Edit load")

    def _mark(self, row: int, column: int, message: str) -> None:
        self.error.setText(message)
        item = self.loads.item(row, column)
        if item is not None:
            self.loads.blockSignals(True)
            item.setBackground(QColor(255, 217, 217))
            item.setToolTip(plain_tip(message))
            self.loads.blockSignals(False)

    def add_load(self) -> None:
        """Add a uniform live line load of zero over the whole member (to edit)."""
        beam = self.document.project.beam
        if beam is None:
            return
        loads = (*beam.loads, Load("L", "line", 0.0))
        self._apply_beam(replace(beam, loads=loads), "Add load")

    def remove_load(self) -> None:
        """Remove the selected load row."""
        beam = self.document.project.beam
        row = self.loads.currentRow()
        if beam is None or not 0 <= row < len(beam.loads):
            return
        loads = tuple(ld for i, ld in enumerate(beam.loads) if i != row)
        self._apply_beam(replace(beam, loads=loads), "Remove load")
