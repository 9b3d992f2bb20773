"""The main window's Tools menu and ply edits (a mixin of the main window)."""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtWidgets import QMessageBox

from plystack.core.model.caution import CAUTION
from plystack.core.model.errors import ProjectError
from plystack.core.model.units import fmt


class ToolActions:
    """Auto-size, longest span, and the Edit menu's ply edits."""

    def auto_size_selected(self) -> None:
        """Smallest stock thickness of the selected ply that passes (plate thicknesses
        for steel, timber thicknesses for timber).
        """
        from plystack.app.dialogs import StudyProgress
        from plystack.core.study.compare import Stopped, auto_size, width_options, with_dimension

        i = self.canvas.selected  # type: ignore[attr-defined]
        p = self.document.project  # type: ignore[attr-defined]
        if i is None:
            self.inform("Auto-size", "Select a ply first.")  # type: ignore[attr-defined]
            return
        try:
            options = width_options(p, p.plies[i].name)
        except ProjectError as exc:  # glulam, LVL: no stock list of the program's
            self.warn("Auto-size", "\n".join(str(q) for q in exc.problems))  # type: ignore[attr-defined]
            return
        progress = StudyProgress(self, "Auto-size", "Trying stock thicknesses\u2026")  # type: ignore[arg-type]
        try:
            try:
                r = auto_size(p, p.plies[i].name, "width", options, progress.report)
            finally:
                progress.close()
        except ProjectError as exc:
            self.warn("Auto-size", "\n".join(str(q) for q in exc.problems))  # type: ignore[attr-defined]
            return
        except Stopped:
            return  # cancelled: nothing to offer
        u = p.display_units
        if r.chosen is None:
            self.inform("Auto-size", r.message)  # type: ignore[attr-defined]
            return
        text = (f"{p.plies[i].name}: {fmt(r.chosen.value, 'length', u)} passes "
                f"({r.chosen.governing_id}, ratio {r.chosen.governing_ratio:.3f}).")
        if r.next_smaller is not None:
            text += (f"\nNext smaller, {fmt(r.next_smaller.value, 'length', u)}, fails: "
                     f"{r.next_smaller.governing_id} ratio {r.next_smaller.governing_ratio:.3f}.")
        b = QMessageBox.StandardButton
        answer = self.ask("Auto-size", text + "\n\nUse this thickness?\n\n" + CAUTION,  # type: ignore[attr-defined]
                          b.Yes | b.No, b.No)
        if answer == b.Yes:
            self.document.apply(p.with_plies(with_dimension(  # type: ignore[attr-defined]
                p.plies, p.plies[i].name, "width", r.chosen.value)), "Auto-size ply")

    def show_longest_span(self) -> None:
        """Tools > Longest span."""
        from plystack.app.dialogs import StudyProgress
        from plystack.core.study.compare import Stopped, longest_span

        p = self.document.project  # type: ignore[attr-defined]
        progress = StudyProgress(self, "Longest span", "Trying spans\u2026")  # type: ignore[arg-type]
        try:
            try:
                r = longest_span(p, progress=progress.report)
            finally:
                progress.close()
        except ProjectError as exc:
            self.warn("Longest span", "\n".join(str(q) for q in exc.problems))  # type: ignore[attr-defined]
            return
        except Stopped:
            return  # cancelled
        u = p.display_units
        self.inform("Longest span",  # type: ignore[attr-defined]
                    f"Longest span that passes every check: {fmt(r.span, 'span', u)} (to "
                    f"{fmt(r.tolerance, 'length', u, 3)}); governing {r.governing_id}, ratio "
                    f"{r.governing_ratio:.3f}.\n\n{CAUTION}")

    # --- ply edits ----------------------------------------------------------------------

    def _plies(self) -> list:  # type: ignore[type-arg]
        return list(self.document.project.plies)  # type: ignore[attr-defined]

    def _apply_plies(self, plies: list, text: str) -> None:  # type: ignore[type-arg]
        doc = self.document  # type: ignore[attr-defined]
        doc.apply(doc.project.with_plies(tuple(plies)), text)

    def delete_ply(self) -> None:
        """Remove the selected ply."""
        i = self.canvas.selected  # type: ignore[attr-defined]
        if i is None:
            return
        plies = self._plies()
        del plies[i]
        self.canvas.select(None)  # type: ignore[attr-defined]
        self._apply_plies(plies, "Delete ply")

    def duplicate_ply(self) -> None:
        """Copy the selected ply beside itself (to the right), with a fresh name."""
        i = self.canvas.selected  # type: ignore[attr-defined]
        if i is None:
            return
        plies = self._plies()
        p = plies[i]
        names = {q.name for q in plies}
        name, k = f"{p.name} copy", 2
        while name in names:
            name, k = f"{p.name} copy {k}", k + 1
        plies.append(replace(p, name=name, x=p.x + p.width))
        self._apply_plies(plies, "Duplicate ply")
        self.canvas.select(len(plies) - 1)  # type: ignore[attr-defined]

    def mirror_ply(self) -> None:
        """Mirror the selected ply about the section's vertical centre line."""
        i = self.canvas.selected  # type: ignore[attr-defined]
        if i is None:
            return
        plies = self._plies()
        x0 = min(p.x for p in plies)
        x1 = max(p.x + p.width for p in plies)
        p = plies[i]
        plies[i] = replace(p, x=x0 + x1 - p.x - p.width)
        self._apply_plies(plies, "Mirror ply")

    def restack(self, step: int) -> None:
        """Move the selected ply up or down the stacking order."""
        i = self.canvas.selected  # type: ignore[attr-defined]
        if i is None:
            return
        plies = self._plies()
        j = i + step
        if not 0 <= j < len(plies):
            return
        plies[i], plies[j] = plies[j], plies[i]
        self._apply_plies(plies, "Bring forward" if step > 0 else "Send back")
        self.canvas.select(j)  # type: ignore[attr-defined]
