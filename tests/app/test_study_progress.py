"""The sweep dialog's progress dialog: it hears the sweep, and Cancel stops it with the
rows evaluated so far (the same rows as the start of a full sweep).
"""

from __future__ import annotations

from plystack.app import dialogs
from plystack.app.alternatives import SweepDialog
from plystack.core.model import units
from plystack.core.study import compare
from plystack.core.study.compare import sweep

VALUES = ", ".join(f"{0.1 + 0.01 * i:.2f} in" for i in range(40))


def _dialog(window, qtbot) -> SweepDialog:
    d = SweepDialog(window.document, window)
    qtbot.addWidget(d)
    d.ply.setCurrentText("flitch plate")
    d.dimension.setCurrentText("width")
    d.values.setText(VALUES)
    return d


def test_sweep_dialog_reports_progress_and_finishes(window, qtbot, monkeypatch) -> None:
    seen: list[tuple[int, int | None]] = []
    original = dialogs.StudyProgress.report

    def spy(self, done, total):
        seen.append((done, total))
        return original(self, done, total)

    monkeypatch.setattr(dialogs.StudyProgress, "report", spy)
    d = _dialog(window, qtbot)
    d.run_sweep()
    assert seen[-1] == (40, 40)
    assert len(d.rows) == 40 and d.table.rowCount() == 40
    assert "Stopped" not in d.message.text()


def test_cancel_stops_the_sweep_with_the_rows_done(window, qtbot, monkeypatch) -> None:
    monkeypatch.setattr(dialogs.QProgressDialog, "wasCanceled", lambda self: True)
    d = _dialog(window, qtbot)
    d.run_sweep()
    batch = compare.SWEEP_BATCH
    assert len(d.rows) == batch and d.table.rowCount() == batch
    assert d.message.text().startswith(f"Stopped: {batch} of 40 values evaluated.")
    vals = [units.parse(t.strip(), "length", "v") for t in VALUES.split(",")]
    full = sweep(window.document.project, "flitch plate", "width", vals)
    assert [r.governing_ratio for r in d.rows] == [r.governing_ratio for r in full[:batch]]
