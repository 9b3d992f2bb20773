"""The materials dialog: the library grouped by basis and product with every source, and
existing timber added as an assumed grade with a condition factor (project's own design).
"""

from __future__ import annotations

from PySide6.QtCore import Qt
from PySide6.QtTest import QTest
from PySide6.QtWidgets import QMessageBox, QPushButton

from plystack.app.dialogs import MaterialsDialog
from plystack.core.io.library import load_library
from plystack.core.model.materials import basis_of


def rows(dlg):
    out = []
    for r in range(dlg.table.rowCount()):
        cells = [dlg.table.item(r, c) for c in range(5)]
        out.append([c.text() if c is not None else None for c in cells])
    return out


def test_library_is_grouped_by_basis_and_product_with_sources(qtbot):
    lib = load_library()
    dlg = MaterialsDialog(lib, "US")
    qtbot.addWidget(dlg)
    table = rows(dlg)
    heads = [r[0] for r in table if r[1] is None]
    assert heads[0].startswith("US \u2014 sawn timber")
    assert any(h.startswith("EU \u2014 glued laminated timber") for h in heads)
    assert any(h.startswith("EU \u2014 steel") for h in heads)
    listed = {r[0]: r for r in table if r[1] is not None}
    assert set(listed) == set(lib)
    for mid, r in listed.items():
        assert r[4] == lib[mid].source
    group = None
    for r in table:
        if r[1] is None:
            group = r[0]
        else:
            m = lib[r[0]]
            assert group is not None and group.startswith(basis_of(m))


def add_button(dlg):
    return next(b for b in dlg.findChildren(QPushButton) if b.text() == "Add to project")


def test_existing_timber_is_added_from_an_assumed_grade(qtbot, monkeypatch):
    monkeypatch.setattr(QMessageBox, "information", lambda *a, **k: None)
    lib = load_library()
    dlg = MaterialsDialog(lib, "US")
    qtbot.addWidget(dlg)
    dlg.new_id.setText("old-joist")
    dlg.record.setText('{"existing": {"assumed": "DFL-No2", "condition_factor": 0.8}}')
    QTest.mouseClick(add_button(dlg), Qt.MouseButton.LeftButton)
    m = dlg.added
    assert m is not None and m.existing is not None
    assert m.values["Fb"] == lib["DFL-No2"].values["Fb"] * 0.8
    assert "verify" in m.source


def test_a_bad_existing_record_names_the_field(qtbot):
    dlg = MaterialsDialog(load_library(), "US")
    qtbot.addWidget(dlg)
    dlg.new_id.setText("old-joist")
    dlg.record.setText('{"existing": {"assumed": "A36"}}')
    QTest.mouseClick(add_button(dlg), Qt.MouseButton.LeftButton)
    assert dlg.added is None
    assert "materials.old-joist.existing.assumed" in dlg.message.text()
