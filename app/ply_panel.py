"""Properties of the selected ply: name, material (searchable), position and size."""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtCore import Qt
from PySide6.QtWidgets import (
    QComboBox,
    QCompleter,
    QFormLayout,
    QLineEdit,
    QPushButton,
    QVBoxLayout,
    QWidget,
)

from plystack.app.document import Document
from plystack.app.ply_table import PlyTable
from plystack.app.quantity import QuantityEdit
from plystack.app.safe import guarded, plain_label


class PlyPanel(QWidget):
    """Edits one ply; bad entries are marked in place and change nothing."""

    def __init__(self, document: Document):
        super().__init__()
        self.document = document
        self.index: int | None = None
        system = lambda: self.document.project.display_units  # noqa: E731
        self.table = PlyTable(document)
        self.title = plain_label("Select a ply, or drag on the section to draw one.")
        self.name = QLineEdit()
        self.material = QComboBox()
        self.material.setEditable(True)
        self.material.setInsertPolicy(QComboBox.InsertPolicy.NoInsert)
        self.material.setSizeAdjustPolicy(
            QComboBox.SizeAdjustPolicy.AdjustToMinimumContentsLengthWithIcon)
        self.material.setMinimumContentsLength(8)
        self.material.view().setTextElideMode(Qt.TextElideMode.ElideNone)
        completer = QCompleter(self)
        completer.setFilterMode(Qt.MatchFlag.MatchContains)
        completer.setCaseSensitivity(Qt.CaseSensitivity.CaseInsensitive)
        self.material.setCompleter(completer)
        positive = lambda v: None if v > 0 else "must be greater than zero"  # noqa: E731
        self.fields = {
            "x": QuantityEdit("length", "x", system),
            "y": QuantityEdit("length", "y", system),
            "width": QuantityEdit("length", "width", system, positive),
            "height": QuantityEdit("length", "height", system, positive),
        }
        self.error = plain_label("")
        self.error.setStyleSheet("color: #b00000")
        self.table.error.connect(self.error.setText)
        self.materials_button = QPushButton("Materials\u2026")
        form = QFormLayout()
        form.addRow("Name", self.name)
        form.addRow("Material", self.material)
        for key, edit in self.fields.items():
            form.addRow(key.capitalize(), edit)
            edit.accepted.connect(lambda v, k=key: self._set_dim(k, v))
            edit.rejected.connect(self.error.setText)
        layout = QVBoxLayout(self)
        layout.addWidget(self.table, 1)
        layout.addWidget(self.title)
        layout.addLayout(form)
        layout.addWidget(self.error)
        layout.addWidget(self.materials_button)
        self.name.editingFinished.connect(self._set_name)
        self.material.activated.connect(self._set_material)
        self.material.lineEdit().editingFinished.connect(self._set_material)
        document.changed.connect(self.refresh)
        self.refresh()

    def set_index(self, index: int) -> None:
        """Show ply ``index`` (-1 for none)."""
        self.index = None if index < 0 else index
        self.error.setText("")
        self.table.select_row(self.index)
        self.refresh()

    def _materials(self) -> list[tuple[str, str]]:
        mats = self.document.project.all_materials()
        return sorted(((mid, f"{mid} \u2014 {m.name}") for mid, m in mats.items()),
                      key=lambda t: t[0])

    def refresh(self) -> None:
        """Show the model's values."""
        plies = self.document.project.plies
        ok = self.index is not None and self.index < len(plies)
        for w in (self.name, self.material, *self.fields.values()):
            w.setEnabled(ok)
        items = self._materials()
        self.material.blockSignals(True)
        if self.material.count() != len(items):
            self.material.clear()
            for mid, label in items:
                self.material.addItem(label, mid)
            view = self.material.view()
            view.setMinimumWidth(view.sizeHintForColumn(0) + 24)
        if not ok or self.index is None:
            self.title.setText("Select a ply, or drag on the section to draw one.")
            self.material.blockSignals(False)
            self.name.setText("")
            self.material.setCurrentIndex(-1)
            for edit in self.fields.values():
                edit.set_value(None)
            return
        p = plies[self.index]
        self.title.setText(f"Ply {self.index + 1} of {len(plies)} (later plies win where "
                           "they overlap)")
        self.name.setText(p.name)
        k = self.material.findData(p.material)
        self.material.setCurrentIndex(k)
        self.material.blockSignals(False)
        for key, edit in self.fields.items():
            if not edit.hasFocus() or not edit.error_text:
                edit.set_value(getattr(p, key))

    def _replace(self, text: str, **changes: object) -> None:
        if self.index is None:
            return
        plies = list(self.document.project.plies)
        if self.index >= len(plies):
            return
        plies[self.index] = replace(plies[self.index], **changes)  # type: ignore[arg-type]
        self.error.setText("")
        self.document.apply(self.document.project.with_plies(tuple(plies)), text)

    @guarded("Setting a dimension")
    def _set_dim(self, key: str, value: float) -> None:
        self._replace(f"Set {key}", **{key: value})

    @guarded("Renaming the ply")
    def _set_name(self) -> None:
        text = self.name.text().strip()
        if not text:
            self.error.setText("name: must not be empty")
            return
        if any(q.name == text for i, q in enumerate(self.document.project.plies)
               if i != self.index):
            self.error.setText(f"name: \u201c{text}\u201d is the name of another ply")
            return
        self._rename(text)

    def _rename(self, name: str) -> None:
        """Rename the ply; the design's overrides and the notches and holes that name it
        follow the new name (one step).
        """
        project = self.document.project
        if self.index is None or self.index >= len(project.plies):
            return
        old = project.plies[self.index].name
        plies = list(project.plies)
        plies[self.index] = replace(plies[self.index], name=name)
        renamed = project.with_plies(tuple(plies))
        design = project.design
        if design is not None and old in design.overrides and old != name:
            # the renamed ply's overrides win over a stale entry of the new name
            overrides = {name if k == old else k: v for k, v in design.overrides.items()
                         if k != name}
            renamed = replace(renamed, design=replace(design, overrides=overrides))
        beam = project.beam
        if beam is not None and old != name:
            def follow(items):  # type: ignore[no-untyped-def]
                return tuple(replace(o, plies=tuple(name if n == old else n for n in o.plies))
                             for o in items)

            renamed = replace(renamed, beam=replace(beam, notches=follow(beam.notches),
                                                    holes=follow(beam.holes)))
        self.error.setText("")
        self.document.apply(renamed, "Rename ply")

    @guarded("Setting the material")
    def _set_material(self, *_args: object) -> None:
        idx = self.material.currentIndex()
        mid = self.material.itemData(idx) if idx >= 0 else None
        typed = self.material.currentText().split(" \u2014 ")[0].strip()
        mats = self.document.project.all_materials()
        if typed in mats:
            mid = typed
        if mid is None or mid not in mats:
            self.error.setText(f"material: \u201c{typed}\u201d is not a known material")
            return
        self._replace("Set material", material=mid)
