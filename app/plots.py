"""Plots: strain and stress over the depth, shear, moment and deflection along the span.

Speed: the axes, ticks and labels are drawn once and cached as a background; an edit
only changes the data artists (created once, updated in place with ``set_data``) and
blits them over the cached background. The axes are redrawn in full only when the data
leave the current limits or shrink well inside them, or the widget is resized.
"""

from __future__ import annotations

from typing import Any

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.figure import Figure
from matplotlib.patches import Polygon

from plystack.core.actions.beam import diagram
from plystack.core.model.units import sig, to_display, unit_label
from plystack.core.pipeline import Analysis


def _needs_new_limits(current: tuple[float, float], lo: float, hi: float) -> bool:
    """True when [lo, hi] leaves the current limits or fills less than 70 % of them."""
    a, b = current
    span = b - a
    if lo < a or hi > b or span <= 0:
        return True
    return (hi - lo) < 0.7 * span


def _padded(lo: float, hi: float) -> tuple[float, float]:
    if hi - lo <= 0:
        pad = max(abs(hi), 1.0) * 0.1
        return lo - pad, hi + pad
    pad = (hi - lo) * 0.12
    return lo - pad, hi + pad


class BlitCanvas(FigureCanvasQTAgg):
    """A matplotlib canvas that redraws only its data artists when it can.

    The data artists are animated: every full draw (an edit that moves the limits, a
    resize, a screenshot) caches the background and then draws them on top, so they
    are never lost; other edits restore the background and blit.
    """

    def __init__(self, figure: Figure):
        super().__init__(figure)
        self._background: Any = None
        self.dynamic: list[Any] = []
        self.full_draws = 0
        self.mpl_connect("draw_event", self._on_draw)

    def resizeEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        self.figure.set_layout_engine("constrained")
        self._background = None
        super().resizeEvent(event)

    def _on_draw(self, _event: Any) -> None:
        self._background = self.copy_from_bbox(self.figure.bbox)
        self._draw_dynamic()

    def _draw_dynamic(self) -> None:
        for a in self.dynamic:
            if a.axes is not None:
                a.axes.draw_artist(a)

    def refresh(self, full: bool) -> None:
        """Draw: in full (axes and background) or by blitting the data artists."""
        for a in self.dynamic:
            a.set_animated(True)
        if full or self._background is None:
            self.figure.set_layout_engine("constrained")
            self.draw()
            self.figure.set_layout_engine("none")
            self.full_draws += 1
            return
        self.restore_region(self._background)
        self._draw_dynamic()
        self.blit(self.figure.bbox)


class ProfilePlot(BlitCanvas):
    """Strain and stress profiles over the height of the section, side by side."""

    def __init__(self) -> None:
        figure = Figure(figsize=(5.5, 3.6), layout="constrained")
        super().__init__(figure)
        self.ax_strain, self.ax_stress = figure.subplots(1, 2, sharey=True)
        (self.strain_line,) = self.ax_strain.plot([], [], color="#333333", lw=1.6)
        self.na_lines = [ax.axhline(0, color="#c02020", ls="-.", lw=0.9)
                         for ax in (self.ax_strain, self.ax_stress)]
        for ax in (self.ax_strain, self.ax_stress):
            ax.axvline(0.0, color="#999999", lw=0.6)
        self.stress_lines: list[Any] = []
        self.labels: list[Any] = []
        self.last: dict[str, Any] = {}
        self._key: tuple[Any, ...] = ()
        self.na_label = self.ax_strain.annotate("", (0, 0), fontsize=7, color="#c02020",
                                                xytext=(3, 3), textcoords="offset points")
        self.moment_text = self.ax_stress.text(0.02, 0.98, "", transform=self.ax_stress.transAxes,
                                               fontsize=8, va="top")

    def update_from(self, a: Analysis | None, combo_name: str | None = None) -> None:
        """Update for the analysis at the governing (or named) combination's moment."""
        for t in self.labels:
            t.set_text("")
        used = 0
        if a is None:
            self.strain_line.set_data([], [])
            for line in self.stress_lines:
                line.set_data([], [])
            self.dynamic = [self.strain_line, *self.stress_lines]
            self.refresh(False)
            return
        u = a.project.display_units
        s = a.section
        moment, title = _moment_for(a, combo_name)
        k = to_display(1.0, "length", u)
        ks = to_display(1.0, "stress", u)
        y0, y1 = float(s.y_bottom.min()) * k, float(s.y_top.max()) * k
        strain = s.strain(moment, np.array([y0 / k, y1 / k])) * 1e6
        self.strain_line.set_data(strain, [y0, y1])
        while len(self.stress_lines) < len(s.plies):
            (line,) = self.ax_stress.plot([], [], lw=1.8)
            self.stress_lines.append(line)
        top, bot = s.ply_extreme_stresses(moment)
        seen: set[tuple[float, float]] = set()
        for i, line in enumerate(self.stress_lines):
            if i >= len(s.plies) or s.area[i] <= 0:
                line.set_data([], [])
                continue
            line.set_color({"timber": "#9a6b2f", "steel": "#3d4654"}.get(
                s.materials[i].kind, "#777777"))
            line.set_data([bot[i] * ks, top[i] * ks], [s.y_bottom[i] * k, s.y_top[i] * k])
            for value, y in ((bot[i], s.y_bottom[i]), (top[i], s.y_top[i])):
                key = (round(float(value), 3), round(float(y), 9))
                if key in seen:
                    continue
                seen.add(key)
                if used == len(self.labels):
                    self.labels.append(self.ax_stress.annotate(
                        "", (0, 0), fontsize=7, xytext=(3, 0), textcoords="offset points",
                        va="center"))
                self.labels[used].set_text(sig(float(value) * ks, 3))
                self.labels[used].xy = (float(value) * ks, float(y) * k)
                used += 1
        na = s.neutral_axis_y * k
        for line in self.na_lines:
            line.set_ydata([na, na])
        self.na_label.set_text(f"NA {sig(na, 4)} {unit_label('length', u)}")
        self.na_label.xy = (0, na)
        full = self._set_limits(strain, np.concatenate([top, bot]) * ks, (y0, y1), u, moment,
                                title)
        self.dynamic = [self.strain_line, *self.stress_lines, *self.na_lines,
                        *self.labels[:used], self.na_label, self.moment_text]
        self.last = {"moment": moment, "top": top, "bottom": bot}
        self.refresh(full)

    def _set_limits(self, strain: np.ndarray, stress: np.ndarray, ys: tuple[float, float],
                    u: str, moment: float, title: str) -> bool:
        full = False
        for ax, values in ((self.ax_strain, strain), (self.ax_stress, stress)):
            lo, hi = float(min(values.min(), 0.0)), float(max(values.max(), 0.0))
            if _needs_new_limits(ax.get_xlim(), lo, hi):
                ax.set_xlim(*_padded(lo, hi))
                full = True
        if _needs_new_limits(self.ax_strain.get_ylim(), *ys):
            self.ax_strain.set_ylim(*_padded(*ys))
            full = True
        self.moment_text.set_text(f"M = {sig(to_display(moment, 'moment', u), 4)} "
                                  f"{unit_label('moment', u)}")
        key = (u, title)
        if key != self._key:
            self._key = key
            self.ax_strain.set_xlabel("strain (\u00b5\u03b5, tension +)")
            self.ax_strain.set_ylabel(f"height ({unit_label('length', u)})")
            self.ax_strain.set_title("Strain", fontsize=9)
            self.ax_stress.set_title(f"Stress ({title})", fontsize=9)
            self.ax_stress.set_xlabel(f"stress ({unit_label('stress', u)}, tension +)")
            full = True
        return full


def _moment_for(a: Analysis, combo_name: str | None) -> tuple[float, str]:
    if a.beam is None:
        return 0.0, "no beam"
    combos = a.beam.combinations
    chosen = next((c for c in combos if c.name == combo_name), None)
    if chosen is None:
        chosen = max(combos, key=lambda c: abs(c.M_governing))
    return chosen.M_governing, chosen.name


class DiagramPlot(BlitCanvas):
    """Shear, moment and deflection along the member, maxima labelled."""

    def __init__(self) -> None:
        figure = Figure(figsize=(7, 4.2), layout="constrained")
        super().__init__(figure)
        self.axes = figure.subplots(3, 1, sharex=True)
        self.lines = [ax.plot([], [], lw=1.5, color=c)[0]
                      for ax, c in zip(self.axes, ("#2a6f97", "#9b2226", "#3a5a40"), strict=True)]
        for ax in self.axes:
            ax.axhline(0, color="#888888", lw=0.6)
        self.fills = [ax.add_patch(Polygon(np.zeros((1, 2)), closed=True, alpha=0.12,
                                           color=line.get_color(), lw=0))
                      for ax, line in zip(self.axes, self.lines, strict=True)]
        self.labels = [ax.annotate("", (0, 0), fontsize=7, xytext=(4, 4),
                                   textcoords="offset points") for ax in self.axes]
        self.last: dict[str, float] = {}
        self._key: tuple[Any, ...] = ()

    def update_from(self, a: Analysis | None, combo_name: str | None = None) -> None:
        """Update for the governing (or named) combination."""
        if a is None or a.beam is None:
            for line, fill, label in zip(self.lines, self.fills, self.labels, strict=True):
                line.set_data([], [])
                fill.set_xy(np.zeros((1, 2)))
                label.set_text("")
            self.dynamic = [*self.lines, *self.fills, *self.labels]
            self.refresh(False)
            return
        u = a.project.display_units
        combos = a.beam.combinations
        chosen = next((c for c in combos if c.name == combo_name), None) or max(
            combos, key=lambda c: abs(c.M_governing))
        d = diagram(a.beam.model, chosen.solution, a.section.EI)
        kx = to_display(1.0, "span", u)
        series = (("shear", d.V, "force"), ("moment", d.M, "moment"),
                  ("deflection (down +)", d.deflection, "deflection"))
        full = False
        x = d.x * kx
        if _needs_new_limits(self.axes[0].get_xlim(), float(x.min()), float(x.max())) or (
                abs(self.axes[0].get_xlim()[1] - x.max()) > 1e-9 * max(abs(x.max()), 1.0)):
            self.axes[0].set_xlim(float(x.min()), float(x.max()))
            full = True
        for ax, line, fill, label, (_name, values, kind) in zip(
                self.axes, self.lines, self.fills, self.labels, series, strict=True):
            kv = to_display(1.0, kind, u)
            v = values * kv
            line.set_data(x, v)
            fill.set_xy(np.column_stack([np.concatenate([x, x[::-1]]),
                                         np.concatenate([v, np.zeros_like(v)])]))
            k = int(np.argmax(np.abs(v)))
            label.set_text(f"{sig(float(v[k]), 4)} at {sig(float(x[k]), 3)}")
            label.xy = (float(x[k]), float(v[k]))
            lo, hi = float(min(v.min(), 0.0)), float(max(v.max(), 0.0))
            if _needs_new_limits(ax.get_ylim(), lo, hi):
                ax.set_ylim(*_padded(lo, hi))
                full = True
            self.last[kind] = float(v[k]) / kv
        key = (u, chosen.name, tuple(a.beam.model.layout.support_positions()))
        if key != self._key:
            self._key = key
            for ax, (name, _, kind) in zip(self.axes, series, strict=True):
                ax.set_ylabel(f"{name}\n({unit_label(kind, u)})", fontsize=8)
            for ln in getattr(self, "_supports", []):
                ln.remove()
            self._supports = [self.axes[1].axvline(xs * kx, color="#aaaaaa", lw=0.6, ls=":")
                              for xs in a.beam.model.layout.support_positions()]
            self.axes[0].set_title(chosen.name, fontsize=9)
            self.axes[2].set_xlabel(f"x from the left end ({unit_label('span', u)})")
            full = True
        self.dynamic = [*self.lines, *self.fills, *self.labels]
        self.refresh(full)
