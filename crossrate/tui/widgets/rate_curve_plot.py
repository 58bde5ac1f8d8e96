"""The driving-force curve: log10 k versus -Delta G deg' with regions, the pair, and a measured value."""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

from rich.text import Text
from textual.widget import Widget

if TYPE_CHECKING:
    from ...services.curves import DrivingForceCurve
from ..units import energy_factor, power_of_ten
from .braille_canvas import BrailleCanvas

AXIS = 6  # width of the y-axis label column
SHORT = {"endergonic": "uphill", "normal": "normal", "activationless": "top", "inverted": "inverted"}


def _ticks(lo: float, hi: float, max_ticks: int) -> list[float]:
    span = hi - lo
    steps = [m * 10.0**e for e in range(-3, 5) for m in (1, 2, 2.5, 5)]
    step = next((s for s in steps if span / s <= max_ticks), steps[-1])
    first = math.ceil(lo / step) * step
    return [first + k * step for k in range(int((hi - first) / step) + 1)]


def wrap_items(items: list[str], width: int, max_lines: int) -> list[str]:
    """Legend items joined by two spaces into at most max_lines lines of width; an item never split (items
    that do not fit are left out, whole)."""
    lines: list[str] = [""]
    for it in items:
        joined = f"{lines[-1]}  {it}" if lines[-1] else it
        if len(joined) <= width:
            lines[-1] = joined
        elif len(lines) < max_lines and len(it) <= width:
            lines.append(it)
    return lines


def decade_axis(bottom: int, top: int, rows: int) -> tuple[float, float, dict[int, int]]:
    """The y axis of the rate curve: (y_lo, y_hi, {row: decade}) for a canvas of `rows` equal bands (log10 k
    per band constant). Ticks are whole decades on evenly spaced rows (every `per` rows, `step` decades
    apart), each at the centre of its row, so a point is read off within half a row; the finest scale that
    shows bottom..top is chosen, with a blank row between labels when the rows allow it."""
    best = None
    for step in (1, 2, 3, 5, 10, 20, 50):
        t_top = math.ceil(top / step) * step
        for per in (1, 2, 3, 4, 5, 6):
            d = step / per  # decades per row
            # every row down to the lowest holds bottom too, and at least two ticks are shown
            if t_top - (rows - 1) * d > bottom or rows <= per:
                continue
            key = (d, per == 1, step)
            if best is None or key < best[0]:
                best = (key, step, per, t_top)
    if best is None:  # very few rows for the span: one band of several decades per row
        step = max(1, math.ceil((top - bottom) / max(1, rows - 1)))
        per, t_top = 1, math.ceil(top / step) * step
    else:
        _key, step, per, t_top = best
    d = step / per
    y_hi = t_top + d / 2
    y_lo = y_hi - rows * d
    ticks = {r: t_top - (r // per) * step for r in range(0, rows, per)}
    return y_lo, y_hi, ticks


def curve_lines(curve: DrivingForceCurve, width: int, height: int, unit: str, measured: float | None,
                note: str = "") -> Text:
    """The picture as text, width x height cells."""
    f = energy_factor(unit)
    xs = [x * f for x in curve.minus_dG0_prime_kJ]
    act, obs = list(curve.log10_k_act), list(curve.log10_k_obs)
    if curve.semiclassical_log10_k_obs is not None:
        act = act + list(curve.semiclassical_log10_k_obs)  # the axis range covers both models' curves
    top = math.ceil(max(max(act), max(obs)) + 0.5)
    extras = [curve.pair_log10_k_obs] + ([measured] if measured is not None else [])
    # Show the curve down to 14 decades below its top, and always the pair and the measured value.
    bottom = max(math.floor(min(act)), top - 14)
    bottom = min(bottom, math.floor(min(extras)) - 1)
    cols, rows = max(10, width - AXIS - 1), max(4, height - 6)
    y_lo, y_hi, y_ticks = decade_axis(bottom, top, rows)
    cv = BrailleCanvas(cols, rows, xs[0], xs[-1], y_lo, y_hi, y_bands=True)
    for reg in curve.regions[1:]:
        cv.vline(reg.low_kJ * f, "dim", every=2)
    if curve.log10_k_diff is not None:
        cv.hline(curve.log10_k_diff, "dim", every=4)
    sc = curve.semiclassical_log10_k_obs
    if sc is not None:
        # Both models: the classical curve dimmed, the semiclassical one (the prediction's) in full, and a
        # dotted mark where each curve tops out (past it: that model's inverted region).
        cv.line(xs, obs, "cyan", every=3)
        cv.line(xs, list(sc), "magenta")
        cv.vline(curve.lambda_kJ * f, "cyan", every=3)
        cv.vline(curve.semiclassical_top_kJ * f, "magenta", every=3)
    else:
        cv.line(xs, act, "yellow", every=2)
        cv.line(xs, obs, "cyan")
    # Region names on a line of their own above the plot, so they never hide the top of the curve.
    names = [" "] * cols
    for reg in curve.regions:
        c0, _ = cv.cell_of(reg.low_kJ * f, top)
        c1, _ = cv.cell_of(reg.high_kJ * f, top)
        name = reg.name if c1 - c0 > len(reg.name) + 1 else SHORT[reg.name]
        if c1 - c0 > len(name):
            start = c0 + max(0, (c1 - c0 - len(name)) // 2)
            names[start : start + len(name)] = list(name)
    pair_cell = cv.mark(curve.pair_x_kJ * f, curve.pair_log10_k_obs, "●", "bold")
    if measured is not None:
        c, r = cv.cell_of(curve.pair_x_kJ * f, measured)
        # Measured close to predicted: both marks stay visible, the x just right of the dot.
        cv.text(c + 1 if (c, r) == pair_cell else c, r, "x", "bold reverse")
    body = cv.to_lines()

    out = Text(no_wrap=True, overflow="crop")
    out.append(note or f"k / M⁻¹ s⁻¹ against -ΔG°' ({unit});  λ12 = {curve.lambda_kJ * f:.3g} {unit}", style="bold")
    out.append("\n")
    # Indents as separate plain segments: SVG renderers that collapse leading spaces keep the columns.
    out.append(" " * (AXIS + 1))
    out.append("".join(names) + "\n", style="italic")
    for r, line in enumerate(body):
        label = power_of_ten(y_ticks[r]) if r in y_ticks else ""
        out.append(f"{label:>{AXIS - 1}} ┤" if label else " " * (AXIS - 1) + " │", style="dim")
        out.append_text(line)
        out.append("\n")
    axis = [" "] * cols
    labels = [" "] * cols
    for t in _ticks(xs[0], xs[-1], max(2, cols // 10)):
        c, _ = cv.cell_of(t, bottom)
        axis[c] = "┬"
        s = f"{round(t, 6):g}"
        start = max(0, min(cols - len(s), c - len(s) // 2))
        if all(ch == " " for ch in labels[max(0, start - 1) : start + len(s) + 1]):
            labels[start : start + len(s)] = list(s)
    out.append(" " * AXIS)
    out.append("└" + "".join(axis)[: cols - 1] + "\n", style="dim")
    out.append(" " * (AXIS + 1))
    out.append("".join(labels) + "\n", style="dim")
    if curve.semiclassical_log10_k_obs is not None:
        items = ["── semiclassical k_obs", "·· classical k_obs", "┆ each model's top (inverted past it)",
                 "● this pair"]
    else:
        items = ["── k_obs (diffusion-capped)", "··· k_act", "● this pair"]
    items += ["x measured"] if measured is not None else []
    items += ["- - k_D (diffusion limit)"] if curve.log10_k_diff is not None else []
    out.append("\n".join(wrap_items(items, width, 2)))
    return out


class RateCurvePlot(Widget):
    """Draws a DrivingForceCurve to fit its size; shows a hint when there is none."""

    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self._curve: DrivingForceCurve | None = None
        self._unit = "kJ/mol"
        self._measured: float | None = None
        self._note = ""

    def show(self, curve: DrivingForceCurve | None, unit: str, measured_log10: float | None = None,
             note: str = "") -> None:
        self._curve, self._unit, self._measured, self._note = curve, unit, measured_log10, note
        self.refresh()

    def render(self) -> Text:
        if self._curve is None:
            return Text("No pair yet: set an oxidant (o) and a reductant (r) in the couples table.")
        return curve_lines(self._curve, self.size.width, self.size.height, self._unit, self._measured, self._note)
