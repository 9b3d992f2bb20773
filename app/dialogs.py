"""Dialogs: a new section from a template, the materials browser and editor, the sheet,
and the progress of a long study (sweep, auto-size, longest span) with Cancel.
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QApplication,
    QComboBox,
    QDialog,
    QDialogButtonBox,
    QFormLayout,
    QHBoxLayout,
    QLineEdit,
    QProgressDialog,
    QPushButton,
    QTreeWidget,
    QTreeWidgetItem,
    QVBoxLayout,
    QWidget,
)

from plystack.app.safe import plain_label, plain_tip
from plystack.core.model import units
from plystack.core.model.constants import INCH
from plystack.core.model.materials import KINDS, PRODUCTS, Material, material_from_record
from plystack.core.section.templates import (
    LUMBER_SI,
    LUMBER_US,
    PLATES_SI,
    PLATES_US,
    TEMPLATES,
    TemplateChoice,
    build,
)

#: Milliseconds a study runs before its progress dialog appears (a short one never shows).
PROGRESS_DELAY_MS = 400


class StudyProgress:
    """A modal progress dialog with Cancel for a study of core.study.compare; its
    :meth:`report` is the study's progress callback (False once Cancel is pressed, so
    the study stops after the candidates in hand).
    """

    def __init__(self, parent: QWidget | None, title: str, text: str):
        self.dialog = QProgressDialog(text, "Cancel", 0, 0, parent)
        self.dialog.setWindowTitle(title)
        self.dialog.setWindowModality(Qt.WindowModality.WindowModal)
        self.dialog.setMinimumDuration(PROGRESS_DELAY_MS)
        self.dialog.setAutoClose(False)
        self.dialog.setAutoReset(False)
        self.dialog.setValue(0)
        self.reports = 0

    def report(self, done: int, total: int | None) -> bool:
        """Show ``done`` of ``total`` (a busy bar where the total is not known) and tell
        whether to go on.
        """
        self.reports += 1
        if total is not None:
            self.dialog.setMaximum(max(total, 1))
            self.dialog.setValue(min(done, total))
        else:
            self.dialog.setLabelText(f"{self.dialog.labelText().split(' (')[0]} "
                                     f"({done} tried)")
        QApplication.processEvents()  # paints the dialog and hears Cancel
        return not self.dialog.wasCanceled()

    def close(self) -> None:
        """Hide and release the dialog."""
        self.dialog.close()
        self.dialog.deleteLater()


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


#: Fields of a material record per (basis, kind): key, label, display kind.
_COMMON = (("E", "E (stiffness, mean)", "modulus"), ("density", "Density", "density"))
FIELDS = {
    ("US", "timber"): _COMMON + (
        ("Emin", "Emin", "modulus"), ("Fb", "Fb", "stress"), ("Ft", "Ft", "stress"),
        ("Fv", "Fv", "stress"), ("Fc", "Fc", "stress"), ("Fc_perp", "Fc\u22a5", "stress"),
        ("G", "G (specific gravity)", "")),
    ("EU", "timber"): _COMMON + (
        ("E0_05", "E0,05", "modulus"), ("fm_k", "fm,k", "stress"), ("ft0_k", "ft,0,k", "stress"),
        ("fv_k", "fv,k", "stress"), ("fc0_k", "fc,0,k", "stress"),
        ("fc90_k", "fc,90,k", "stress"), ("rho_k", "\u03c1k", "density"),
        ("s", "s (LVL size effect exponent)", "")),
    ("US", "steel"): _COMMON + (("Fy", "Fy", "stress"), ("Fu", "Fu", "stress")),
    ("EU", "steel"): _COMMON + (("Fy", "fy", "stress"), ("Fu", "fu", "stress")),
}
EU_KEYS = frozenset(("fm_k", "ft0_k", "fv_k", "fc0_k", "fc90_k", "E0_05", "rho_k"))


def material_basis(m: Material) -> str:
    """"EU" for a material with Eurocode values (or an EN source), else "US"."""
    if EU_KEYS & set(m.values) or m.source.startswith("EN"):
        return "EU"
    return "US"


def _fields(basis: str, kind: str) -> tuple[tuple[str, str, str], ...]:
    return FIELDS.get((basis, kind if kind == "timber" else "steel"), FIELDS[(basis, "steel")])


class MaterialsDialog(QDialog):
    """Browse the materials grouped by basis and product, see one as a form with its
    values in the display units and its source, and add a new one from the form.
    """

    def __init__(self, materials: dict[str, Material], system: str, parent=None,  # type: ignore[no-untyped-def]
                 basis: str = "US-ASD"):
        super().__init__(parent)
        self.setWindowTitle("Materials")
        self.resize(860, 560)
        self.added: Material | None = None
        self.system = system
        self.materials = materials
        self.tree = QTreeWidget()
        self.tree.setHeaderLabels(["Material", "Name"])
        self.tree.setTextElideMode(Qt.TextElideMode.ElideNone)
        groups: dict[str, QTreeWidgetItem] = {}
        for mid, m in sorted(materials.items()):
            group = f"{material_basis(m)} \u2014 {m.product if m.kind != 'steel' else 'steel'}"
            if group not in groups:
                groups[group] = QTreeWidgetItem([group, ""])
            child = QTreeWidgetItem([mid, m.name])
            child.setData(0, Qt.ItemDataRole.UserRole, mid)
            child.setToolTip(1, plain_tip(m.name))
            groups[group].addChild(child)
        for name in sorted(groups):
            self.tree.addTopLevelItem(groups[name])
            groups[name].setExpanded(True)
        self.tree.resizeColumnToContents(0)
        self.tree.currentItemChanged.connect(lambda cur, _prev: self._show(cur))
        self.id_edit = QLineEdit()
        self.name_edit = QLineEdit()
        self.kind = QComboBox()
        self.kind.addItems(list(KINDS))
        self.product = QComboBox()
        self.product.addItems(list(PRODUCTS))
        self.basis = QComboBox()
        self.basis.addItems(["US", "EU"])
        self.basis.setCurrentText("EU" if basis == "EU-LSD" else "US")
        self.source = QLineEdit("user")
        self.values_form = QFormLayout()
        self.edits: dict[str, QLineEdit] = {}
        head = QFormLayout()
        head.addRow("Id", self.id_edit)
        head.addRow("Name", self.name_edit)
        head.addRow("Kind", self.kind)
        head.addRow("Product", self.product)
        head.addRow("Basis of the values", self.basis)
        head.addRow("Source", self.source)
        self.message = plain_label("")
        self.message.setStyleSheet("color: #b00000;")
        new = QPushButton("New material")
        new.clicked.connect(self._new)
        self.add_button = QPushButton("Add to project")
        self.add_button.clicked.connect(self._add)
        right = QVBoxLayout()
        right.addLayout(head)
        right.addWidget(plain_label(f"Values (a bare number is in {system} units)"))
        right.addLayout(self.values_form)
        right.addWidget(self.message)
        right.addStretch(1)
        row = QHBoxLayout()
        row.addWidget(new)
        row.addWidget(self.add_button)
        right.addLayout(row)
        body = QHBoxLayout()
        body.addWidget(self.tree, 1)
        body.addLayout(right, 1)
        layout = QVBoxLayout(self)
        layout.addLayout(body, 1)
        close = QDialogButtonBox(QDialogButtonBox.StandardButton.Close)
        close.rejected.connect(self.reject)
        layout.addWidget(close)
        self.kind.currentTextChanged.connect(lambda _t: self._rebuild_fields())
        self.basis.currentTextChanged.connect(lambda _t: self._rebuild_fields())
        self._new()

    def _rebuild_fields(self, values: dict[str, str] | None = None) -> None:
        while self.values_form.rowCount():
            self.values_form.removeRow(0)
        self.edits = {}
        for key, label, kind in _fields(self.basis.currentText(), self.kind.currentText()):
            edit = QLineEdit((values or {}).get(key, ""))
            if kind:
                edit.setPlaceholderText(units.unit_label(kind, self.system))
            self.edits[key] = edit
            unit = f" ({units.unit_label(kind, self.system)})" if kind else ""
            self.values_form.addRow(f"{label}{unit}", edit)

    def _show(self, item: QTreeWidgetItem | None) -> None:
        mid = item.data(0, Qt.ItemDataRole.UserRole) if item is not None else None
        if mid not in self.materials:
            return
        m = self.materials[mid]
        self.id_edit.setText(mid)
        self.name_edit.setText(m.name)
        self.kind.blockSignals(True)
        self.basis.blockSignals(True)
        self.kind.setCurrentText(m.kind)
        self.product.setCurrentText(m.product)
        self.basis.setCurrentText(material_basis(m))
        self.kind.blockSignals(False)
        self.basis.blockSignals(False)
        self.source.setText(m.source)
        shown = {"E": units.display_string(m.E, "modulus", self.system, 6),
                 "density": units.display_string(m.density, "density", self.system, 5)}
        for key, _label, kind in _fields(material_basis(m), m.kind):
            v = m.value(key)
            if v is not None and key not in shown:
                shown[key] = (units.display_string(v, kind, self.system, 6) if kind
                              else f"{v:g}")
        self._rebuild_fields(shown)
        self.message.setText("")

    def _new(self) -> None:
        self.tree.setCurrentItem(None)
        k = 1
        while f"user-{k}" in self.materials:
            k += 1
        self.id_edit.setText(f"user-{k}")
        self.name_edit.setText("My material")
        self.source.setText("user")
        self._rebuild_fields()

    def record(self) -> dict[str, object]:
        """The record of the form (quantities with their units, as a file holds them)."""
        rec: dict[str, object] = {"kind": self.kind.currentText(),
                                  "name": self.name_edit.text().strip(),
                                  "source": self.source.text().strip() or "user"}
        if self.kind.currentText() != "steel":
            rec["product"] = self.product.currentText()
        for key, _label, kind in _fields(self.basis.currentText(), self.kind.currentText()):
            text = self.edits[key].text().strip()
            if not text:
                continue
            if not kind:
                try:
                    rec[key] = float(text)
                except ValueError:
                    rec[key] = text
                continue
            if text[-1].isdigit() or text.endswith("."):
                text = f"{text} {units.unit_label(kind, self.system).replace('^', '**')}"
            rec[key] = text
        return rec

    def _add(self) -> None:
        mid = self.id_edit.text().strip()
        if not mid:
            self.message.setText("id: must not be empty")
            return
        if mid in self.materials:
            self.message.setText(f"id: \u201c{mid}\u201d is taken; give the new material "
                                 "its own id")
            return
        m, problems = material_from_record(mid, self.record(), f"materials.{mid}")
        if problems or m is None:
            self.message.setText("\n".join(str(p) for p in problems))
            return
        self.added = m
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
        self.preview = plain_label("")
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
