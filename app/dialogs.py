"""Dialogs: a new section from a template, and the materials browser."""

from __future__ import annotations

from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QLabel,
    QLineEdit,
    QMessageBox,
    QPushButton,
    QTableWidget,
    QTableWidgetItem,
    QVBoxLayout,
)

from plystack.core.model import units
from plystack.core.model.constants import INCH
from plystack.core.model.materials import (
    Material,
    existing_from_record,
    grouped,
    material_from_record,
)
from plystack.core.section.templates import (
    LUMBER_SI,
    LUMBER_US,
    PLATES_SI,
    PLATES_US,
    TEMPLATES,
    TemplateChoice,
    build,
)


class NewSectionDialog(QDialog):
    """Pick a template, a lumber size, a plate thickness and the materials."""

    def __init__(self, system: str, materials: dict[str, Material], parent=None):  # type: ignore[no-untyped-def]
        super().__init__(parent)
        self.setWindowTitle("New section")
        self.system = system
        self.template = QComboBox()
        self.template.addItems(list(TEMPLATES))
        self.units = QComboBox()
        self.units.addItems(["US", "SI"])
        self.units.setCurrentText(system)
        self.lumber = QComboBox()
        self.plate = QComboBox()
        self.timber = QComboBox()
        self.steel = QComboBox()
        for mid, m in sorted(materials.items()):
            (self.timber if m.kind == "timber" else self.steel).addItem(f"{mid} \u2014 {m.name}",
                                                                        mid)
        self.units.currentTextChanged.connect(self._fill_sizes)
        self._fill_sizes(system)
        form = QFormLayout(self)
        form.addRow("Template", self.template)
        form.addRow("Units", self.units)
        form.addRow("Lumber", self.lumber)
        form.addRow("Plate", self.plate)
        form.addRow("Timber material", self.timber)
        form.addRow("Plate material", self.steel)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Ok
                                   | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        form.addRow(buttons)

    def _fill_sizes(self, system: str) -> None:
        self.lumber.clear()
        self.plate.clear()
        for name, dims in (LUMBER_US if system == "US" else LUMBER_SI).items():
            self.lumber.addItem(name, dims)
        for name, t in (PLATES_US if system == "US" else PLATES_SI).items():
            self.plate.addItem(name, t)
        self.lumber.setCurrentText("2x10" if system == "US" else "45x220")
        self.plate.setCurrentText("3/8 in" if system == "US" else "10 mm")
        want_t, want_s = ("DFL-No2", "A36") if system == "US" else ("C24", "S275")
        for combo, want in ((self.timber, want_t), (self.steel, want_s)):
            k = combo.findData(want)
            if k >= 0:
                combo.setCurrentIndex(k)

    def plies(self):  # type: ignore[no-untyped-def]
        """The chosen template's plies."""
        thickness, depth = self.lumber.currentData()
        inset = 0.25 * INCH if self.units.currentText() == "US" else 0.006
        choice = TemplateChoice(thickness, depth, self.plate.currentData(),
                                self.timber.currentData(), self.steel.currentData(), inset)
        return build(self.template.currentText(), choice)


class MaterialsDialog(QDialog):
    """Browse the library grouped by design basis and product (with sources) and add a
    project material: a record of values, or existing timber of unknown grade taken as
    an assumed grade (``{"existing": {"assumed": "DFL-No2", "condition_factor": 0.9}}``).
    """

    def __init__(self, materials: dict[str, Material], system: str, parent=None):  # type: ignore[no-untyped-def]
        super().__init__(parent)
        self.setWindowTitle("Materials")
        self.resize(900, 500)
        self.added: Material | None = None
        self.system = system
        self.materials = materials
        groups = grouped(materials)
        table = QTableWidget(len(materials) + len(groups), 5)
        table.setHorizontalHeaderLabels(["Id", "Name", "Kind", "E", "Source"])
        r = 0
        for basis, product, members in groups:
            head = QTableWidgetItem(f"{basis} \u2014 {product} ({len(members)})")
            font = head.font()
            font.setBold(True)
            head.setFont(font)
            table.setItem(r, 0, head)
            table.setSpan(r, 0, 1, 5)
            r += 1
            for m in members:
                for c, text in enumerate((m.id, m.name, m.kind,
                                          units.fmt(m.E, "modulus", system), m.source)):
                    table.setItem(r, c, QTableWidgetItem(text))
                r += 1
        table.resizeColumnsToContents()
        self.table = table
        self.new_id = QLineEdit()
        self.record = QLineEdit('{"kind": "timber", "name": "My grade", "E": "1400000 psi", '
                                '"density": "30 pcf", "Fb": "850 psi", "Fv": "150 psi", '
                                '"G": 0.43, "source": "user"}')
        add = QPushButton("Add to project")
        add.clicked.connect(self._add)
        self.message = QLabel("")
        self.message.setWordWrap(True)
        layout = QVBoxLayout(self)
        layout.addWidget(table, 1)
        form = QFormLayout()
        form.addRow("New material id", self.new_id)
        form.addRow("Record (JSON, trade symbols as keys)", self.record)
        layout.addLayout(form)
        layout.addWidget(add)
        layout.addWidget(self.message)
        close = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        close.rejected.connect(self.reject)
        layout.addWidget(close)

    def _add(self) -> None:
        import json

        mid = self.new_id.text().strip()
        if not mid:
            self.message.setText("id: must not be empty")
            return
        try:
            rec = json.loads(self.record.text())
        except json.JSONDecodeError as exc:
            self.message.setText(f"record: not valid JSON ({exc.msg})")
            return
        if isinstance(rec, dict) and "existing" in rec:
            m, problems = existing_from_record(mid, rec, self.materials, f"materials.{mid}")
        else:
            m, problems = material_from_record(mid, rec, f"materials.{mid}")
        if problems or m is None:
            self.message.setText("\n".join(str(p) for p in problems))
            return
        self.added = m
        QMessageBox.information(self, "Materials", f"Added \u201c{mid}\u201d to the project.")
        self.accept()


class SheetDialog(QDialog):
    """Export the calculation sheet: paper size, alternative, page count preview."""

    def __init__(self, project, parent=None):  # type: ignore[no-untyped-def]
        super().__init__(parent)
        self.setWindowTitle("Export calculation sheet")
        self.project = project
        self.paper = QComboBox()
        self.paper.addItems(["letter", "a4"])
        self.paper.setCurrentText("letter" if project.display_units == "US" else "a4")
        self.alternative = QComboBox()
        self.alternative.addItem("current design", None)
        for alt in project.alternatives:
            self.alternative.addItem(alt.name, alt.name)
        self.preview = QLabel("")
        self.preview.setWordWrap(True)
        self.pages = 0
        self.data = b""
        form = QFormLayout(self)
        form.addRow("Paper", self.paper)
        form.addRow("Design", self.alternative)
        form.addRow("Preview", self.preview)
        buttons = QDialogButtonBox(QDialogButtonBox.StandardButton.Save
                                   | QDialogButtonBox.StandardButton.Cancel)
        buttons.accepted.connect(self.accept)
        buttons.rejected.connect(self.reject)
        self.save_button = buttons.button(QDialogButtonBox.StandardButton.Save)
        form.addRow(buttons)
        self.paper.currentTextChanged.connect(lambda _t: self.render())
        self.alternative.currentIndexChanged.connect(lambda _i: self.render())
        self.render()

    def render(self) -> None:
        """Build the sheet in memory and show its page count (or why it cannot be made)."""
        import io

        from plystack.core.model.errors import ProjectError
        from plystack.core.report.sheet import build_sheet

        buf = io.BytesIO()
        try:
            self.pages = build_sheet(self.project, buf, self.paper.currentText(),
                                     self.alternative.currentData())
        except ProjectError as exc:
            self.pages, self.data = 0, b""
            self.preview.setText("Cannot export: " + "; ".join(str(p) for p in exc.problems))
            self.save_button.setEnabled(False)
            return
        self.data = buf.getvalue()
        self.preview.setText(f"{self.pages} pages, {self.paper.currentText()} paper")
        self.save_button.setEnabled(True)
