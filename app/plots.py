"""Plots: strain and stress over the depth, shear, moment and deflection along the span.

The stress over the depth gets one panel per kind of material (timber, steel, other),
each with its own scale, so a timber ply at a few hundred psi is as readable as a steel
plate at thousands; a legend names the material of every line, and only each panel's
extreme tension and compression are labelled (no labels on top of one another).

Speed: the axes, ticks and labels are drawn once and cached as a background; an edit
only changes the data artists (updated in place with ``set_data``) and blits them over
the cached background. The axes are redrawn in full only when the data leave the
current limits or shrink well inside them, the widget is resized, or the panels change.
The limits keep headroom (a fifth of the range beyond the data on each side, new limits
only when the data leave them or fill less than half of them), so a drag rarely moves
them; and a redraw for new limits alone skips the layout pass (constrained layout costs
more than the rest of the draw): the layout follows once the edits pause.
Nothing is drawn while the plot is hidden (before the window is shown, or in a tab not
on top): it is drawn once when it appears.

Values that are not finite are never given to matplotlib's limits (they would raise
"Axis limits cannot be NaN or Inf"): such a plot shows what is finite and says so.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Any

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.figure import Figure
from matplotlib.lines import Line2D
from matplotlib.patches import Polygon
from PySide6.QtCore import QTimer

from plystack.core.actions.beam import diagram
from plystack.core.model.units import sig, to_display, unit_label
from plystack.core.pipeline import Analysis

KIND_COLOURS = {"timber": "#9a6b2f", "steel": "#3d4654", "other": "#777777"}
#: Line styles that tell materials of one kind apart in the legend.
STYLES = ("-", "--", "-.", ":")


def tex_safe(text: str) -> str:
    """Text shown literally by matplotlib (a ``$`` would start mathtext)."""
    return text.replace("$", r"\$")


def _finite_range(values: np.ndarray) -> tuple[float, float] | None:
    v = np.asarray(values, dtype=float)
    v = v[np.isfinite(v)]
    if v.size == 0:
        return None
    return float(min(v.min(), 0.0)), float(max(v.max(), 0.0))


#: Headroom of new limits beyond the data on each side, a fraction of the data's range.
HEADROOM = 0.2
#: New limits when the data fill less than this fraction of the current ones.
SHRINK_BELOW = 0.5
#: Pause after the last limits-only redraw before the layout pass, ms.
LAYOUT_DELAY_MS = 300


def _needs_new_limits(current: tuple[float, float], lo: float, hi: float) -> bool:
    """True when [lo, hi] leaves the current limits or fills less than half of them."""
    a, b = current
    span = b - a
    if lo < a or hi > b or span <= 0:
        return True
    return (hi - lo) < SHRINK_BELOW * span


def _padded(lo: float, hi: float) -> tuple[float, float]:
    if hi - lo <= 0:
        pad = max(abs(hi), 1.0) * 0.1
        return lo - pad, hi + pad
    pad = (hi - lo) * HEADROOM
    out = (lo - pad, hi + pad)
    return out if all(math.isfinite(x) for x in out) else (-1.0, 1.0)


class BlitCanvas(FigureCanvasQTAgg):
    """A matplotlib canvas that redraws only its data artists when it can.

    The data artists are animated: every full draw (an edit that moves the limits, a
    resize, a screenshot) caches the background and then draws them on top, so they
    are never lost; other edits restore the background and blit. While hidden it only
    remembers that it must draw when shown.
    """

    def __init__(self, figure: Figure):
        super().__init__(figure)
        self._background: Any = None
        self._stale = False
        self.dynamic: list[Any] = []
        self.full_draws = 0
        self.layout_passes = 0
        self._layout_timer = QTimer(self)
        self._layout_timer.setSingleShot(True)
        self._layout_timer.setInterval(LAYOUT_DELAY_MS)
        self._layout_timer.timeout.connect(self._layout_pass)
        self.mpl_connect("draw_event", self._on_draw)

    def resizeEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        self.figure.set_layout_engine("constrained")
        self._background = None
        super().resizeEvent(event)

    def showEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        super().showEvent(event)
        if self._stale:
            self._stale = False
            self._background = None
            self.figure.set_layout_engine("constrained")
            self.draw_idle()

    def _draw_laid_out(self) -> None:
        self.figure.set_layout_engine("constrained")
        self.draw()
        self.figure.set_layout_engine("none")
        self.layout_passes += 1

    def _layout_pass(self) -> None:
        """The layout pass left out of limits-only redraws (ticks may have grown)."""
        if self.isVisible():
            self._draw_laid_out()
        else:
            self._stale = True

    def _on_draw(self, _event: Any) -> None:
        self._background = self.copy_from_bbox(self.figure.bbox)
        self._draw_dynamic()

    def _draw_dynamic(self) -> None:
        for a in self.dynamic:
            if a.axes is not None:
                a.axes.draw_artist(a)
            elif a.figure is not None:
                self.figure.draw_artist(a)

    def refresh(self, full: bool, layout: bool = True) -> None:
        """Draw: in full (axes and background) or by blitting the data artists.

        ``layout``: False where only the limits changed; the full draw then keeps the
        current layout and the layout pass follows once the edits pause.
        """
        for a in self.dynamic:
            a.set_animated(True)
        if not self.isVisible():
            self._stale = True
            return
        if full or self._background is None:
            if layout or self._background is None:
                self._layout_timer.stop()
                self._draw_laid_out()
            else:
                self.draw()
                self._layout_timer.start()
            self.full_draws += 1
            return
        self.restore_region(self._background)
        self._draw_dynamic()
        self.blit(self.figure.bbox)


class ProfilePlot(BlitCanvas):
    """Strain over the height of the section, and stress with one panel per material kind."""

    def __init__(self) -> None:
        figure = Figure(figsize=(5.5, 3.6), layout="constrained")
        super().__init__(figure)
        self.kinds: tuple[str, ...] = ()
        self.last: dict[str, Any] = {}
        self._key: tuple[Any, ...] = ()
        self._build(("timber", "steel"), ())

    def _build(self, kinds: tuple[str, ...], legend: tuple[tuple[str, str, str], ...]) -> None:
        """New axes: strain, then one stress panel per kind; ``legend``: (kind, material,
        style) of every line.
        """
        self.figure.clear()
        self.kinds = kinds
        axes = self.figure.subplots(1, 1 + max(len(kinds), 1), sharey=True, squeeze=False)[0]
        self.ax_strain = axes[0]
        self.ax_stress = {k: ax for k, ax in zip(kinds, axes[1:], strict=False)}
        (self.strain_line,) = self.ax_strain.plot([], [], color="#333333", lw=1.6)
        self.na_lines = [ax.axhline(0, color="#c02020", ls="-.", lw=0.9) for ax in axes]
        for ax in axes:
            ax.axvline(0.0, color="#999999", lw=0.6)
            ax.tick_params(labelsize=7)
            ax.set_autoscale_on(False)
        self.stress_lines: list[Any] = []
        self.extreme_labels = {k: [ax.annotate("", (0, 0), fontsize=7, xytext=(3, 0),
                                               textcoords="offset points", va="center")
                                   for _ in range(2)] for k, ax in self.ax_stress.items()}
        for kind, ax in self.ax_stress.items():
            handles = [Line2D([], [], color=KIND_COLOURS.get(kind, "#777777"), ls=style,
                              lw=1.8, label=tex_safe(mid))
                       for k, mid, style in legend if k == kind]
            if handles:
                ax.legend(handles=handles, fontsize=7, loc="upper center", framealpha=0.8,
                          bbox_to_anchor=(0.5, -0.16), ncol=min(len(handles), 2),
                          handlelength=2.4)
        self.na_label = self.ax_strain.annotate("", (0, 0), fontsize=7, color="#c02020",
                                                xytext=(3, 3), textcoords="offset points")
        self.moment_text = self.figure.text(0.99, 0.99, "", fontsize=8, va="top", ha="right")
        self._key = ()

    def _clear(self) -> None:
        self.strain_line.set_data([], [])
        for line in self.stress_lines:
            line.set_data([], [])
        for labels in self.extreme_labels.values():
            for t in labels:
                t.set_text("")
        self.dynamic = [self.strain_line, *self.stress_lines]
        self.refresh(False)

    def update_from(self, a: Analysis | None, combo_name: str | None = None) -> None:
        """Update for the analysis at the governing (or named) combination's moment."""
        if a is None:
            self._clear()
            return
        u = a.project.display_units
        s = a.section
        moment, title = _moment_for(a, combo_name)
        k = to_display(1.0, "length", u)
        ks = to_display(1.0, "stress", u)
        plies = [i for i in range(len(s.plies)) if s.area[i] > 0]
        mats = [s.plies[i].material for i in range(len(s.plies))]  # a segment's own
        kind_of = [s.materials[i].kind if s.materials[i].kind in KIND_COLOURS else "other"
                   for i in range(len(s.plies))]
        kinds = tuple(kd for kd in KIND_COLOURS if any(kind_of[i] == kd for i in plies))
        legend: list[tuple[str, str, str]] = []
        for kd in kinds:
            ids = sorted({mats[i] for i in plies if kind_of[i] == kd})
            legend += [(kd, mid, STYLES[j % len(STYLES)]) for j, mid in enumerate(ids)]
        layout = False
        if kinds != self.kinds or tuple(legend) != getattr(self, "_legend", None):
            self._legend = tuple(legend)
            self._build(kinds, tuple(legend))
            layout = True
        style = {(kd, mid): st for kd, mid, st in legend}
        y0, y1 = float(s.y_bottom.min()) * k, float(s.y_top.max()) * k
        strain = s.strain(moment, np.array([y0 / k, y1 / k])) * 1e6
        self.strain_line.set_data(strain, [y0, y1])
        top, bot = s.ply_extreme_stresses(moment)
        for line in self.stress_lines:
            line.remove()
        self.stress_lines = []
        for i in plies:
            ax = self.ax_stress[kind_of[i]]
            line = Line2D([bot[i] * ks, top[i] * ks], [s.y_bottom[i] * k, s.y_top[i] * k],
                          lw=1.8, color=KIND_COLOURS[kind_of[i]],
                          ls=style[(kind_of[i], mats[i])])
            ax.add_line(line)  # no autoscaling: the limits are ours (see _set_limits)
            self.stress_lines.append(line)
        used = self._label_extremes(plies, kind_of, top, bot, s, k, ks)
        na = s.neutral_axis_y * k
        for line in self.na_lines:
            line.set_ydata([na, na])
        self.na_label.set_text(f"NA {sig(na, 4)} {unit_label('length', u)}")
        self.na_label.xy = (0, na if math.isfinite(na) else 0.0)
        self.moment_text.set_text(f"M = {sig(to_display(moment, 'moment', u), 4)} "
                                  f"{unit_label('moment', u)}")
        limits, labels = self._set_limits(strain, top, bot, plies, kind_of, (y0, y1), u, title,
                                          ks)
        layout |= labels
        self.dynamic = [self.strain_line, *self.stress_lines, *self.na_lines, *used,
                        self.na_label, self.moment_text]
        self.last = {"moment": moment, "top": top, "bottom": bot}
        self.refresh(layout or limits, layout)

    def _label_extremes(self, plies, kind_of, top, bot, s, k, ks):  # type: ignore[no-untyped-def]
        """Label the largest tension and compression of each panel; returns the labels."""
        used = []
        for kind, labels in self.extreme_labels.items():
            points = [(float(v), float(y)) for i in plies if kind_of[i] == kind
                      for v, y in ((bot[i], s.y_bottom[i]), (top[i], s.y_top[i]))
                      if math.isfinite(float(v))]
            for t in labels:
                t.set_text("")
            if not points:
                continue
            picks = [max(points), min(points)]
            if picks[0] == picks[1]:
                picks = picks[:1]
            for label, (v, y) in zip(labels, picks, strict=False):
                label.set_text(sig(v * ks, 3))
                label.xy = (v * ks, y * k)
                # the largest value sits at the right of its panel: label it inwards
                inward_left = v == picks[0][0] and v > 0
                label.set_ha("right" if inward_left else "left")
                label.set_position((-4, 0) if inward_left else (4, 0))
                used.append(label)
        return used

    def _set_limits(self, strain, top, bot, plies, kind_of, ys, u, title, ks):  # type: ignore[no-untyped-def]
        """New limits where the data need them; returns (limits changed, labels changed)."""
        full = False
        ranges = [(self.ax_strain, _finite_range(strain))]
        for kind, ax in self.ax_stress.items():
            idx = [i for i in plies if kind_of[i] == kind]
            ranges.append((ax, _finite_range(np.concatenate([top[idx], bot[idx]]) * ks)))
        for ax, rng in ranges:
            if rng is not None and _needs_new_limits(ax.get_xlim(), *rng):
                ax.set_xlim(*_padded(*rng))
                full = True
        yr = _finite_range(np.array(ys))
        if yr is not None and all(math.isfinite(v) for v in ys) and _needs_new_limits(
                self.ax_strain.get_ylim(), min(ys), max(ys)):
            self.ax_strain.set_ylim(*_padded(min(ys), max(ys)))
            full = True
        key = (u, title)
        if key != self._key:
            self._key = key
            self.ax_strain.set_xlabel("strain (\u00b5\u03b5, tension +)", fontsize=8)
            self.ax_strain.set_ylabel(f"height ({unit_label('length', u)})", fontsize=8)
            self.ax_strain.set_title("Strain", fontsize=9)
            for kind, ax in self.ax_stress.items():
                ax.set_title(f"Stress, {kind}", fontsize=9)
                ax.set_xlabel(f"{unit_label('stress', u)}, tension +", fontsize=8)
            self.figure.suptitle(tex_safe(f"at the moment of {title}"), fontsize=8, x=0.02,
                                 ha="left")
            return full, True
        return full, False


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
            ax.set_autoscale_on(False)  # the limits are ours (set in update_from)
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
        d = diagram(a.beam.model, chosen.solution, a.beam.solution_EI)
        if not chosen.combination.for_serviceability(a.beam.basis):
            # deflection only ever from an ASD or SLS combination, never a factored one
            sls = [c for c in a.beam.serviceability()]
            if sls:
                worst = max(sls, key=lambda c: c.extremes.deflection_max_abs)
                d_sls = diagram(a.beam.model, worst.solution, a.beam.solution_EI)
                d = replace(d, deflection=np.interp(d.x, d_sls.x, d_sls.deflection))
        kx = to_display(1.0, "span", u)
        series = (("shear", d.V, "force"), ("moment", d.M, "moment"),
                  ("deflection (down +)", d.deflection, "deflection"))
        full = layout = False
        x = d.x * kx
        xr = _finite_range(x)
        if xr is not None and float(np.nanmax(x)) > float(np.nanmin(x)) and (
                _needs_new_limits(self.axes[0].get_xlim(), float(np.nanmin(x)),
                                  float(np.nanmax(x)))
                or abs(self.axes[0].get_xlim()[1] - np.nanmax(x))
                > 1e-9 * max(abs(np.nanmax(x)), 1.0)):
            self.axes[0].set_xlim(float(np.nanmin(x)), float(np.nanmax(x)))
            full = True
        for ax, line, fill, label, (_name, values, kind) in zip(
                self.axes, self.lines, self.fills, self.labels, series, strict=True):
            kv = to_display(1.0, kind, u)
            v = values * kv
            line.set_data(x, v)
            fill.set_xy(np.column_stack([np.concatenate([x, x[::-1]]),
                                         np.concatenate([v, np.zeros_like(v)])]))
            finite = np.isfinite(v) & np.isfinite(x)
            if not finite.any():
                label.set_text("not finite: see the results")
                label.xy = (0.0, 0.0)
                self.last[kind] = math.nan
                continue
            k = int(np.argmax(np.where(finite, np.abs(v), -1.0)))
            label.set_text(f"{sig(float(v[k]), 4)} at {sig(float(x[k]), 3)}")
            label.xy = (float(x[k]), float(v[k]))
            # the label of a maximum near the right end points left, so it stays inside
            right = xr is not None and x[k] > xr[0] + 0.7 * (xr[1] - xr[0])
            label.set_ha("right" if right else "left")
            label.set_position((-4, 4) if right else (4, 4))
            rng = _finite_range(v)
            if rng is not None and _needs_new_limits(ax.get_ylim(), *rng):
                ax.set_ylim(*_padded(*rng))
                full = True
            self.last[kind] = float(v[k]) / kv
        key = (u, chosen.name, tuple(a.beam.model.layout.support_positions()))
        if key != self._key:
            self._key = key
            for ax, (name, _, kind) in zip(self.axes, series, strict=True):
                ax.set_ylabel(f"{name}\n({unit_label(kind, u)})", fontsize=8)
                ax.tick_params(labelsize=7)
            for ln in getattr(self, "_supports", []):
                ln.remove()
            self._supports = [self.axes[1].axvline(xs * kx, color="#aaaaaa", lw=0.6, ls=":")
                              for xs in a.beam.model.layout.support_positions()]
            self.axes[0].set_title(tex_safe(chosen.name), fontsize=9)
            self.axes[2].set_xlabel(f"x from the left end ({unit_label('span', u)})")
            layout = True
        self.dynamic = [*self.lines, *self.fills, *self.labels]
        self.refresh(full or layout, layout)
