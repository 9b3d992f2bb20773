"""Plots: strain and stress over the depth, shear, moment and deflection along the span.

Lines are created once and updated in place; labels are redrawn; ``draw_idle`` lets Qt
coalesce repaints.
"""

from __future__ import annotations

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.figure import Figure

from core.analysis import Analysis
from core.beam import diagram
from core.units import sig, to_display, unit_label


class ProfilePlot(FigureCanvasQTAgg):
    """Strain and stress profiles over the height of the section, side by side."""

    def __init__(self) -> None:
        self.figure = Figure(figsize=(5.5, 3.6), layout="constrained")
        super().__init__(self.figure)
        self.ax_strain, self.ax_stress = self.figure.subplots(1, 2, sharey=True)
        (self.strain_line,) = self.ax_strain.plot([], [], color="#333333", lw=1.6)
        self.stress_lines: list = []  # type: ignore[type-arg]
        self.labels: list = []  # type: ignore[type-arg]
        self.last: dict[str, np.ndarray] = {}

    def update_from(self, a: Analysis | None, combo_name: str | None = None) -> None:
        """Redraw for the analysis at the governing (or named) combination's moment."""
        for t in self.labels:
            t.remove()
        self.labels = []
        if a is None:
            self.draw_idle()
            return
        u = a.project.display_units
        s = a.section
        moment, title = _moment_for(a, combo_name)
        y0, y1 = float(s.y_bottom.min()), float(s.y_top.max())
        ys = np.array([y0, y1])
        L = unit_label("length", u)
        S = unit_label("stress", u)
        strain = s.strain(moment, ys)
        self.strain_line.set_data(strain * 1e6, to_display(1.0, "length", u) * ys)
        self.ax_strain.set_xlabel("strain (\u00b5\u03b5, tension +)")
        self.ax_strain.set_ylabel(f"height ({L})")
        self.ax_strain.set_title("Strain", fontsize=9)
        self.ax_stress.set_title(f"Stress at M = {sig(to_display(moment, 'moment', u), 4)} "
                                 f"{unit_label('moment', u)} ({title})", fontsize=9)
        self.ax_stress.set_xlabel(f"stress ({S}, tension +)")
        while len(self.stress_lines) < len(s.plies):
            (line,) = self.ax_stress.plot([], [], lw=1.8)
            self.stress_lines.append(line)
        top, bot = s.ply_extreme_stresses(moment)
        k = to_display(1.0, "length", u)
        ks = to_display(1.0, "stress", u)
        seen: set[tuple[float, float]] = set()
        for i, line in enumerate(self.stress_lines):
            if i >= len(s.plies) or s.area[i] <= 0:
                line.set_data([], [])
                continue
            kind = s.materials[i].kind
            line.set_color({"timber": "#9a6b2f", "steel": "#3d4654"}.get(kind, "#777777"))
            line.set_data([bot[i] * ks, top[i] * ks], [s.y_bottom[i] * k, s.y_top[i] * k])
            for value, y in ((bot[i], s.y_bottom[i]), (top[i], s.y_top[i])):
                key = (round(float(value), 3), round(float(y), 9))
                if key in seen:
                    continue
                seen.add(key)
                self.labels.append(self.ax_stress.annotate(
                    sig(float(value) * ks, 3), (float(value) * ks, float(y) * k), fontsize=7,
                    xytext=(3, 0), textcoords="offset points", va="center"))
        na = s.neutral_axis_y * k
        for ax in (self.ax_strain, self.ax_stress):
            self.labels.append(ax.axhline(na, color="#c02020", ls="-.", lw=0.9))
            self.labels.append(ax.axvline(0.0, color="#999999", lw=0.6))
            ax.relim()
            ax.autoscale_view()
        self.labels.append(self.ax_strain.annotate(
            f"NA {sig(na, 4)} {L}", (0, na), fontsize=7, color="#c02020",
            xytext=(3, 3), textcoords="offset points"))
        self.last = {"moment": np.array([moment]), "top": top, "bottom": bot}
        self.draw_idle()


def _moment_for(a: Analysis, combo_name: str | None) -> tuple[float, str]:
    if a.beam is None:
        return 0.0, "no beam"
    combos = a.beam.combinations
    chosen = next((c for c in combos if c.name == combo_name), None)
    if chosen is None:
        chosen = max(combos, key=lambda c: abs(c.M_governing))
    return chosen.M_governing, chosen.name


class DiagramPlot(FigureCanvasQTAgg):
    """Shear, moment and deflection along the member, maxima labelled."""

    def __init__(self) -> None:
        self.figure = Figure(figsize=(7, 4.2), layout="constrained")
        super().__init__(self.figure)
        self.axes = self.figure.subplots(3, 1, sharex=True)
        self.lines = [ax.plot([], [], lw=1.5, color=c)[0]
                      for ax, c in zip(self.axes, ("#2a6f97", "#9b2226", "#3a5a40"), strict=True)]
        self.fills: list = []  # type: ignore[type-arg]
        self.labels: list = []  # type: ignore[type-arg]
        self.last: dict[str, float] = {}

    def update_from(self, a: Analysis | None, combo_name: str | None = None) -> None:
        """Redraw for the governing (or named) combination."""
        for t in self.labels + self.fills:
            t.remove()
        self.labels, self.fills = [], []
        if a is None or a.beam is None:
            for line in self.lines:
                line.set_data([], [])
            self.draw_idle()
            return
        u = a.project.display_units
        combos = a.beam.combinations
        chosen = next((c for c in combos if c.name == combo_name), None) or max(
            combos, key=lambda c: abs(c.M_governing))
        d = diagram(a.beam.model, chosen.solution, a.section.EI)
        kx = to_display(1.0, "span", u)
        series = (("shear", d.V, "force"), ("moment", d.M, "moment"),
                  ("deflection (down +)", d.deflection, "deflection"))
        for ax, line, (name, values, kind) in zip(self.axes, self.lines, series, strict=True):
            kv = to_display(1.0, kind, u)
            x, v = d.x * kx, values * kv
            line.set_data(x, v)
            self.fills.append(ax.fill_between(x, 0, v, color=line.get_color(), alpha=0.12))
            ax.set_ylabel(f"{name}\n({unit_label(kind, u)})", fontsize=8)
            k = int(np.argmax(np.abs(v)))
            self.labels.append(ax.annotate(f"{sig(float(v[k]), 4)} at {sig(float(x[k]), 3)}",
                                           (float(x[k]), float(v[k])), fontsize=7,
                                           xytext=(4, 4), textcoords="offset points"))
            self.labels.append(ax.axhline(0, color="#888888", lw=0.6))
            ax.relim()
            ax.autoscale_view()
            self.last[kind] = float(v[k]) / kv
        for xs in a.beam.model.layout.support_positions():
            self.labels.append(self.axes[1].axvline(xs * kx, color="#aaaaaa", lw=0.6, ls=":"))
        self.axes[0].set_title(f"{chosen.name}", fontsize=9)
        self.axes[2].set_xlabel(f"x from the left end ({unit_label('span', u)})")
        self.draw_idle()
