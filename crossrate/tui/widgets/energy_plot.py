"""The energy curves: reactant and product free-energy parabolas, with λ, ΔG°' and ΔG‡ read off."""

from __future__ import annotations

from typing import TYPE_CHECKING

from rich.text import Text
from textual.widget import Widget

if TYPE_CHECKING:
    from ...services.curves import EnergySurfaces
from ..units import energy_factor
from .braille_canvas import BrailleCanvas
from .rate_curve_plot import _ticks, wrap_items

AXIS = 7


def energy_lines(s: EnergySurfaces, width: int, height: int, unit: str, note: str = "") -> Text:
    f = energy_factor(unit)
    lam, dG, g_star = s.lambda_kJ * f, s.dG0_prime_kJ * f, s.G_cross * f
    y0 = min(0.0, dG) - 0.15 * lam
    y1 = max(lam, g_star, dG + lam) * 1.15
    cols, rows = max(10, width - AXIS - 1), max(4, height - 5)
    cv = BrailleCanvas(cols, rows, float(s.x[0]), float(s.x[-1]), y0, y1)
    xs = list(s.x)
    # Guides from which λ, ΔG°' and the barrier are read: the reactant-minimum level, and verticals at the
    # product geometry (0 up to λ) and at the crossing (0 up to G*).
    cv.line((0.0, 1.0), (0.0, 0.0), "dim", every=3)
    cv.line((1.0, 1.0), (min(0.0, dG), max(lam, dG)), "dim", every=3)
    cv.line((s.x_cross, s.x_cross), (0.0, g_star), "dim", every=3)
    cv.line(xs, [g * f for g in s.G_react], "cyan")
    cv.line(xs, [g * f for g in s.G_prod], "magenta", every=2)
    c, r = cv.mark(s.x_cross, g_star, "◆")
    cv.text(c + 1, r, " ΔG‡")
    c, r = cv.mark(1.0, lam, "+")
    cv.text(c + 1, r, " λ")
    c, r = cv.mark(1.0, dG, "+")
    cv.text(c + 1, r, " ΔG°'")
    cv.mark(0.0, 0.0, "R")
    body = cv.to_lines()
    y_ticks = {cv.cell_of(0.0, y)[1]: y for y in _ticks(y0, y1, max(2, rows // 3))}
    out = Text(no_wrap=True, overflow="crop")
    side = "normal side" if s.x_cross >= 0 else "inverted: crossing behind reactant minimum"
    out.append(note or f"G ({unit}) along the reaction coordinate;  {side}", style="bold")
    out.append("\n")
    for k, line in enumerate(body):
        label = f"{round(y_ticks[k], 6):g}" if k in y_ticks else ""
        out.append(f"{label:>{AXIS - 1}}┤" if label else " " * (AXIS - 1) + "│", style="dim")
        out.append_text(line)
        out.append("\n")
    axis = [" "] * cols
    for x in (0.0, 1.0):
        c, _ = cv.cell_of(x, y0)
        axis[c] = "┬"
    out.append(" " * (AXIS - 1))  # plain indent: see rate_curve_plot
    out.append("└" + "".join(axis) + "\n", style="dim")
    labels = [" "] * cols
    for x, name in ((0.0, "reactants"), (1.0, "products")):
        c, _ = cv.cell_of(x, y0)
        start = max(0, min(cols - len(name), c - len(name) // 2))
        labels[start : start + len(name)] = list(name)
    out.append(" " * AXIS)
    out.append("".join(labels) + "\n", style="dim")
    nums = [f"λ {lam:.3g}", f"ΔG°' {dG:+.3g}",
            f"ΔG‡ {s.dG_act_kJ * f:.3g} = w12 {s.w12_kJ * f:.2g} + barrier {g_star:.3g} {unit}"]
    legend = ["── reactants", "··· products", "R reactant minimum", "◆ crossing"]
    out.append("\n".join(wrap_items(nums + legend, width, 2)))
    return out


class EnergyPlot(Widget):
    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self._s: EnergySurfaces | None = None
        self._unit = "kJ/mol"
        self._note = ""

    def show(self, surfaces: EnergySurfaces | None, unit: str, note: str = "") -> None:
        self._s, self._unit, self._note = surfaces, unit, note
        self.refresh()

    def render(self) -> Text:
        if self._s is None:
            return Text("No pair yet: set an oxidant (o) and a reductant (r) in the couples table.")
        return energy_lines(self._s, self.size.width, self.size.height, self._unit, self._note)
