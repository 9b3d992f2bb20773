"""Plots: strain and stress over the depth, shear, moment and deflection along the span.

The stress over the depth gets one panel per kind of material (timber, steel, other),
each with its own scale, so a timber ply at a few hundred psi is as readable as a steel
plate at thousands; a legend names the material of every line, and only each panel's
extreme tension and compression are labelled (no labels on top of one another).

Speed: the axes, ticks and labels are drawn once and cached as a background; an edit
only changes the data artists (updated in place with ``set_data``) and blits them over
the cached background. The limits are a fifth of the data's range beyond the data on
each side. During a drag (``dragging=True``) they hold still while the data stay inside
them and fill at least a quarter of them, limits a drag moves get half the data's range
on each side, so a drag rarely moves them, and a redraw for new limits alone skips the
layout pass (constrained layout costs more than the rest of the draw). Any other update
(an edit that is not a drag, the first update after the drag) sets the limits from the
data and lays the figure out where anything moved, so what shows after a drag is what a
fresh window shows for the same project.
The labels of the data (values at the extremes, the neutral axis, the moment) are
matplotlib artists placed and laid out by matplotlib but painted by Qt over the figure
(``painted_by_qt``), at the point matplotlib would draw them, in the same font file:
rendering a changed text with FreeType on every step was most of a blit.
Nothing is computed or drawn while the plot is hidden (before the window is shown, or in
a tab not on top): the latest update is kept and made once when the plot appears.

Values that are not finite are never given to matplotlib's limits (they would raise
"Axis limits cannot be NaN or Inf"): such a plot shows what is finite and says so.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import Any

import numpy as np
from matplotlib.backends.backend_qtagg import FigureCanvasQTAgg
from matplotlib.colors import to_rgba
from matplotlib.figure import Figure
from matplotlib.font_manager import findfont
from matplotlib.lines import Line2D
from matplotlib.patches import Polygon
from matplotlib.text import Annotation, Text
from matplotlib.ticker import MaxNLocator
from PySide6.QtCore import QPointF, QRectF
from PySide6.QtGui import QColor, QFont, QFontDatabase, QFontMetricsF, QImage, QPainter

from plystack.app.safe import reporter
from plystack.core.actions.extremes import diagram
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
#: Headroom of limits that a drag moves: half the data's range on each side, so the
#: next steps of the drag stay inside them.
DRAG_HEADROOM = 0.5
#: During a drag, new limits when the data fill less than this fraction of the current ones.
SHRINK_BELOW = 0.25


def _needs_new_limits(current: tuple[float, float], lo: float, hi: float,
                      dragging: bool = True) -> bool:
    """True when [lo, hi] needs other limits than ``current``: during a drag when it
    leaves them or fills less than a quarter of them; otherwise whenever they are not
    the padded range of the data (``_padded``), as a fresh plot of the same data has them.
    """
    a, b = current
    if not dragging:
        return (a, b) != _padded(lo, hi)
    span = b - a
    if lo < a or hi > b or span <= 0:
        return True
    return (hi - lo) < SHRINK_BELOW * span


def _limits(lo: float, hi: float, dragging: bool) -> tuple[float, float]:
    """New limits for the data [lo, hi]: wider during a drag."""
    return _padded(lo, hi, DRAG_HEADROOM if dragging else HEADROOM)


def _padded(lo: float, hi: float, headroom: float = HEADROOM) -> tuple[float, float]:
    if hi - lo <= 0:
        pad = max(abs(hi), 1.0) * 0.1
        return lo - pad, hi + pad
    pad = (hi - lo) * headroom
    out = (lo - pad, hi + pad)
    return out if all(math.isfinite(x) for x in out) else (-1.0, 1.0)


_QT_FAMILIES: dict[str, str] = {}


def _qt_family(path: str) -> str:
    """The Qt family of the font file matplotlib draws with (added to Qt once)."""
    if path not in _QT_FAMILIES:
        families = QFontDatabase.applicationFontFamilies(QFontDatabase.addApplicationFont(path))
        _QT_FAMILIES[path] = families[0] if families else ""
    return _QT_FAMILIES[path]


def painted_by_qt(a: Any) -> bool:
    """True for the texts Qt paints over the figure: plain texts and annotations of a
    data point offset in points, unrotated, without a box or an arrow (the labels of the
    data); any other artist is drawn by matplotlib.
    """
    if not isinstance(a, Text) or a.get_rotation() != 0 or a.get_bbox_patch() is not None:
        return False
    if isinstance(a, Annotation):
        return (a.xycoords == "data" and a.anncoords == "offset points"
                and a.arrow_patch is None and a.axes is not None)
    return True


def text_anchor(a: Text, figure: Figure,
                memo: dict[Any, Any] | None = None) -> tuple[float, float] | None:
    """Where matplotlib puts the text's alignment point, in display pixels (y up); None
    where matplotlib would not draw it (an annotation of a point outside its axes).
    ``memo``: kept by the caller over one paint, holds each axes' outline (its patch's
    path and frozen transform: the test ``Axes.contains_point`` makes, made once).
    """
    if isinstance(a, Annotation):
        base = a.axes.transData.transform(a.xy)
        clip = a.get_annotation_clip()
        if (clip or clip is None) and not _inside(a.axes, base, memo):
            return None
        dx, dy = a.get_position()
        k = figure.dpi / 72.0
        return float(base[0] + dx * k), float(base[1] + dy * k)
    x, y = a.get_transform().transform(a.get_position())
    return float(x), float(y)


def _inside(ax: Any, point: Any, memo: dict[Any, Any] | None) -> bool:
    """``ax.contains_point(point)``: the axes patch's path holds the point, 1 pixel of
    radius (``Patch.contains_point``), with the path and transform from ``memo``.
    """
    if memo is None:
        return bool(ax.contains_point(point))
    key = ("outline", ax)
    if key not in memo:
        memo[key] = (ax.patch.get_path(), ax.patch.get_transform().frozen())
    path, transform = memo[key]
    return bool(path.contains_point(point, transform, 1.0))


def paint_text(painter: QPainter, a: Text, figure: Figure, ratio: float,
               memo: dict[Any, Any] | None = None) -> None:
    """Paint a text artist as matplotlib places it (font file, size, colour, alignment),
    with Qt: a label that changes on every step of a drag costs Qt's cached glyphs
    instead of a new FreeType layout and rendering. ``memo``: kept by the caller over one
    paint (the axes' outlines, the fonts and their metrics, each made once).
    """
    text = a.get_text()
    if not text or not a.get_visible():
        return
    at = text_anchor(a, figure, memo)
    if at is None or not all(math.isfinite(v) for v in at):
        return
    font, metrics = _font(painter, a, figure, ratio, memo)
    painter.setFont(font)
    w = metrics.horizontalAdvance(text)
    x = at[0] / ratio
    y = (figure.bbox.height - at[1]) / ratio  # Qt's y runs down
    ha, va = a.get_horizontalalignment(), a.get_verticalalignment()
    x -= {"right": w, "center": w / 2}.get(ha, 0.0)
    ascent, descent = metrics.ascent(), metrics.descent()
    baseline = {"top": y + ascent, "bottom": y - descent,
                "center": y + (ascent - descent) / 2}.get(va, y)
    r, g, b, alpha = to_rgba(a.get_color(), a.get_alpha())
    painter.setPen(QColor.fromRgbF(r, g, b, alpha))
    painter.drawText(QPointF(x, baseline), text)


def _font(painter: QPainter, a: Text, figure: Figure, ratio: float,
          memo: dict[Any, Any] | None) -> tuple[QFont, QFontMetricsF]:
    """The Qt font of the text's font file at its size in logical pixels, and its metrics
    (from ``memo`` where the same file and size were asked for in this paint).
    """
    path = findfont(a.get_fontproperties())
    px = a.get_fontsize() * figure.dpi / 72.0 / ratio  # logical pixels
    size = px * 72.0 / max(painter.device().logicalDpiY(), 1)
    key = ("font", path, size)
    if memo is not None and key in memo:
        return memo[key]  # type: ignore[no-any-return]
    font = QFont(_qt_family(path))
    font.setPointSizeF(size)
    made = (font, QFontMetricsF(font))
    if memo is not None:
        memo[key] = made
    return made


class BlitCanvas(FigureCanvasQTAgg):
    """A matplotlib canvas that redraws only its data artists when it can.

    The data artists are animated: every full draw (an edit that moves the limits, a
    resize, a screenshot) caches the background and then draws them on top, so they
    are never lost; other edits restore the background and blit. While hidden it only
    keeps the latest update (``_pending``) and makes it when shown.
    """

    def __init__(self, figure: Figure):
        super().__init__(figure)
        self._background: Any = None
        self._stale = False
        self._layout_due = False  # a full draw kept the layout (during a drag)
        self._pending: tuple[Any, ...] | None = None
        self._last: dict[str, Any] = {}
        self.dynamic: list[Any] = []
        self.full_draws = 0
        self.layout_passes = 0
        self.mpl_connect("draw_event", self._on_draw)

    @property
    def last(self) -> dict[str, Any]:
        """The values of the latest update (made now if the plot is hidden)."""
        self._make_pending()
        return self._last

    @last.setter
    def last(self, value: dict[str, Any]) -> None:
        self._last = value

    def update_from(self, a: Analysis | None, combo_name: str | None = None,
                    dragging: bool = False) -> None:
        """Show the analysis at the governing (or named) combination; while hidden, only
        keep it for when the plot is shown. ``dragging``: the update is a step of a drag.
        """
        self._pending = (a, combo_name, dragging)
        if self.isVisible():
            self._make_pending()
        else:
            self._stale = True

    def _make_pending(self) -> None:
        if self._pending is not None:
            args, self._pending = self._pending, None
            self._update(*args)

    def _update(self, a: Analysis | None, combo_name: str | None, dragging: bool) -> None:
        raise NotImplementedError

    def resizeEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        self.figure.set_layout_engine("constrained")
        self._background = None
        super().resizeEvent(event)

    def showEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        super().showEvent(event)
        if self._stale:
            self._make_pending()
            self._stale = False
            self._background = None
            self._layout_due = False
            self.figure.set_layout_engine("constrained")
            self.draw_idle()

    def _draw_laid_out(self) -> None:
        self.figure.set_layout_engine("constrained")
        self.draw()
        self.figure.set_layout_engine("none")
        self._layout_due = False
        self.layout_passes += 1

    def _on_draw(self, _event: Any) -> None:
        self._background = self.copy_from_bbox(self.figure.bbox)
        self._draw_dynamic()

    def _draw_dynamic(self) -> None:
        for a in self.dynamic:
            if painted_by_qt(a):
                continue  # painted by Qt over the figure (paintEvent)
            if a.axes is not None:
                a.axes.draw_artist(a)
            elif a.figure is not None:
                self.figure.draw_artist(a)

    def blit(self, bbox: Any = None) -> None:
        """Show the region ``bbox`` (display pixels; None: the whole figure) of the
        rendered figure at the next paint, together with the window's other repaints
        (matplotlib's own blit repaints at once, a paint and a flush of its own).
        """
        if bbox is None:
            bbox = self.figure.bbox
        ratio = self.device_pixel_ratio
        left, bottom, width, height = (v / ratio for v in bbox.bounds)
        top = self.height() - (bottom + height)
        self.update(math.floor(left), math.floor(top), math.ceil(width) + 1,
                    math.ceil(height) + 1)

    def paintEvent(self, event: Any) -> None:  # noqa: D102 - Qt API
        self._draw_idle()  # a draw that is pending
        if not hasattr(self, "renderer"):
            return
        painter = QPainter(self)
        try:
            self._paint_figure(painter, event.rect())
            self._draw_rect_callback(painter)
            memo: dict[Any, Any] = {}  # outlines and fonts, for this paint only
            for a in self.dynamic:
                if painted_by_qt(a):
                    paint_text(painter, a, self.figure, self.device_pixel_ratio, memo)
        except Exception as exc:
            reporter().report("Drawing the plot", exc)
        finally:
            painter.end()

    def _paint_figure(self, painter: QPainter, rect: Any) -> None:
        """Copy the rendered figure's pixels under ``rect`` (logical pixels) to the widget,
        straight from the renderer's buffer. A figure on an opaque background has only
        opaque pixels, so they are copied as they are (no blending with the widget's
        background); any other is blended over the erased widget, as matplotlib does.
        """
        buf = self.buffer_rgba()
        h, w = buf.shape[0], buf.shape[1]
        opaque = to_rgba(self.figure.get_facecolor())[3] == 1.0
        image = QImage(buf, w, h, 4 * w, QImage.Format.Format_RGBX8888 if opaque
                       else QImage.Format.Format_RGBA8888)
        if not opaque:
            painter.eraseRect(rect)
        ratio = self.device_pixel_ratio
        source = QRectF(rect.x() * ratio, rect.y() * ratio, rect.width() * ratio,
                        rect.height() * ratio)
        painter.drawImage(QRectF(rect), image, source)

    def refresh(self, full: bool, layout: bool = True) -> None:
        """Draw: in full (axes and background) or by blitting the data artists.

        ``layout``: False during a drag; a full draw then keeps the current layout, and
        the next full draw with ``layout`` (the first update after the drag) lays it out.
        """
        for a in self.dynamic:
            a.set_animated(True)
        if not self.isVisible():
            self._stale = True
            return
        if layout and self._layout_due:
            full = True
        if full or self._background is None:
            if layout or self._background is None:
                self._draw_laid_out()
            else:
                self.figure.set_layout_engine("none")  # the layout holds still
                self.draw()
                self._layout_due = True
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
            # narrow panels: few enough values along x that five-digit stresses do not run
            # into each other
            ax.xaxis.set_major_locator(MaxNLocator(nbins=4))
            ax.set_autoscale_on(False)
        self.stress_lines: list[Any] = []
        self._line_specs: list[tuple[str, str]] = []  # (kind, line style) of each
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

    def _update(self, a: Analysis | None, combo_name: str | None, dragging: bool) -> None:
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
        specs = [(kind_of[i], style[(kind_of[i], mats[i])]) for i in plies]
        if specs != self._line_specs:  # other lines: made again (else moved in place)
            for line in self.stress_lines:
                line.remove()
            self.stress_lines = []
            for kind, ls in specs:
                line = Line2D([], [], lw=1.8, color=KIND_COLOURS[kind], ls=ls)
                self.ax_stress[kind].add_line(line)  # no autoscaling: see _set_limits
                self.stress_lines.append(line)
            self._line_specs = specs
        for line, i in zip(self.stress_lines, plies, strict=True):
            line.set_data([bot[i] * ks, top[i] * ks], [s.y_bottom[i] * k, s.y_top[i] * k])
        used = self._label_extremes(plies, kind_of, top, bot, s, k, ks)
        na = s.neutral_axis_y * k
        for line in self.na_lines:
            line.set_ydata([na, na])
        self.na_label.set_text(f"NA {sig(na, 4)} {unit_label('length', u)}")
        self.na_label.xy = (0, na if math.isfinite(na) else 0.0)
        self.moment_text.set_text(f"M = {sig(to_display(moment, 'moment', u), 4)} "
                                  f"{unit_label('moment', u)}")
        limits, labels = self._set_limits(strain, top, bot, plies, kind_of, (y0, y1), u, title,
                                          ks, dragging)
        layout |= labels
        self.dynamic = [self.strain_line, *self.stress_lines, *self.na_lines, *used,
                        self.na_label, self.moment_text]
        self.last = {"moment": moment, "top": top, "bottom": bot}
        self.refresh(layout or limits, layout or not dragging)

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

    def _set_limits(self, strain, top, bot, plies, kind_of, ys, u, title, ks, dragging):  # type: ignore[no-untyped-def]
        """New limits where the data need them; returns (limits changed, labels changed)."""
        full = False
        ranges = [(self.ax_strain, _finite_range(strain))]
        for kind, ax in self.ax_stress.items():
            idx = [i for i in plies if kind_of[i] == kind]
            ranges.append((ax, _finite_range(np.concatenate([top[idx], bot[idx]]) * ks)))
        for ax, rng in ranges:
            if rng is not None and _needs_new_limits(ax.get_xlim(), *rng, dragging):
                ax.set_xlim(*_limits(*rng, dragging))
                full = True
        yr = _finite_range(np.array(ys))
        if yr is not None and all(math.isfinite(v) for v in ys) and _needs_new_limits(
                self.ax_strain.get_ylim(), min(ys), max(ys), dragging):
            self.ax_strain.set_ylim(*_limits(min(ys), max(ys), dragging))
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

    def _update(self, a: Analysis | None, combo_name: str | None, dragging: bool) -> None:
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
        if xr is not None and float(np.nanmax(x)) > float(np.nanmin(x)):
            x_lo, x_hi = float(np.nanmin(x)), float(np.nanmax(x))
            current = self.axes[0].get_xlim()
            if (current != (x_lo, x_hi) if not dragging else (
                    _needs_new_limits(current, x_lo, x_hi)
                    or abs(current[1] - x_hi) > 1e-9 * max(abs(x_hi), 1.0))):
                self.axes[0].set_xlim(x_lo, x_hi)
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
            if rng is not None and _needs_new_limits(ax.get_ylim(), *rng, dragging):
                ax.set_ylim(*_limits(*rng, dragging))
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
        self.refresh(full or layout, layout or not dragging)
