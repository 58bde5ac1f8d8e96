"""The electrode view: predicted k0 of the highlighted couple with its interval, k(eta) under Butler-Volmer
and Marcus-Hush-Chidsey kinetics on a braille canvas, and Delta Ep against scan rate. Numbers come from
crossrate.services.electrode_view; this widget only draws them."""

from __future__ import annotations

import math
from typing import TYPE_CHECKING

from rich.text import Text
from textual.widget import Widget

if TYPE_CHECKING:
    from ...services.electrode_view import ElectrodeView
from ..units import power_of_ten
from .braille_canvas import BrailleCanvas

AXIS = 6
CAUTION = ("Estimates, not a safety assessment; follow your lab's safety rules and local regulations for "
           "electrochemical work.")
HINT = "Highlight a couple in the couples view (1): its k0, k(η) and ΔEp against scan rate appear here."


def _k(lg: float) -> str:
    return f"{10.0**lg:.3g}"


def electrode_lines(v: ElectrodeView, width: int, height: int) -> Text:
    """The view as text, width x height cells."""
    out = Text(no_wrap=True, overflow="crop")
    r = v.rate
    out.append(f"k0 of {r.couple} ({r.name}) at an electrode\n", style="bold")
    lo, hi = r.log10_k0_95
    out.append(f"k0 = {_k(r.log10_k0)} cm/s   95 % [{_k(lo)}, {_k(hi)}] cm/s\n", style="bold green")
    _wrapped(out, f"from k_self {_k(r.log10_k_self)} M⁻¹ s⁻¹ (k0/Z_el = (k_self/Z)^½, Marcus 1965), "
                  f"Z_el {r.Z_el_cm_s:.3g} cm/s", width, "")
    c = v.curves
    mhc = c.log10_k_red_mhc is not None
    lam = f"λ_el {c.lambda_el_kJ_per_mol:.0f} kJ/mol" if mhc else "no λ: Butler-Volmer only"
    out.append(f"log10 k / cm s⁻¹ against η = E − E0′ (V);  {lam}\n", style="dim")
    top = math.ceil(max(c.log10_plateau_mhc if mhc else c.log10_k0 + 3.0, c.log10_k0) + 1.0)
    bottom = math.floor(c.log10_k0 - 6.0)
    cols, rows = max(10, width - AXIS - 1), max(4, height - 13)
    cv = BrailleCanvas(cols, rows, float(c.eta_V[0]), float(c.eta_V[-1]), bottom, top)

    def clip(ys):
        return [min(max(float(y), bottom), top) for y in ys]

    cv.vline(0.0, "dim", every=3)
    cv.line(c.eta_V, clip(c.log10_k_red_bv), "dim", every=2)
    cv.line(c.eta_V, clip(c.log10_k_ox_bv), "dim", every=2)
    if mhc:
        cv.line(c.eta_V, clip(c.log10_k_red_mhc), "cyan")
        cv.line(c.eta_V, clip(c.log10_k_ox_mhc), "yellow")
    body = cv.to_lines()
    ticks = {cv.cell_of(0.0, y)[1]: y for y in range(bottom, top + 1, max(1, (top - bottom) // max(2, rows // 2)))}
    for row, line in enumerate(body):
        label = power_of_ten(ticks[row]) if row in ticks else ""
        out.append(f"{label:>{AXIS - 1}} ┤" if label else " " * (AXIS - 1) + " │", style="dim")
        out.append_text(line)
        out.append("\n")
    ends = f"{c.eta_V[0]:+.1f}".ljust(cols // 2) + "0".ljust(cols - cols // 2 - 4) + f"{c.eta_V[-1]:+.1f}"
    out.append(" " * (AXIS + 1) + ends + "\n", style="dim")
    legend = "··· Butler-Volmer (α ½)" + ("   ── Marcus-Hush-Chidsey k_red, k_ox: they level off, the metal "
                                          "hides the inverted region" if mhc else "")
    _wrapped(out, legend, width, "dim")
    s = v.series
    out.append("ΔEp against scan rate (simulated CV, 1 mM, D from Stokes-Einstein):\n", style="bold")
    out.append("  v / V s⁻¹ " + "".join(f"{t.scan_rate_V_s:>8g}" for t in s.traces) + "\n")
    out.append("  ΔEp / mV  " + "".join(f"{t.dEp_mV:>8.1f}" for t in s.traces) + "\n")
    out.append(f"  looks reversible below about {s.reversible_scan_rate_V_s:.3g} V/s (Matsuda-Ayabe)\n")
    _wrapped(out, CAUTION, width, "dim", last=True)
    return out


def _wrapped(out: Text, text: str, width: int, style: str, last: bool = False) -> None:
    import textwrap

    lines = textwrap.wrap(text, max(20, width)) or [""]
    out.append("\n".join(lines) + ("" if last else "\n"), style=style)


class ElectrodePanel(Widget):
    """Draws an ElectrodeView to fit its size; a hint or the reason when there is none."""

    def __init__(self, **kwargs):
        super().__init__(**kwargs)
        self._view: ElectrodeView | None = None
        self._message = HINT

    def show(self, view: ElectrodeView | None, message: str = "") -> None:
        self._view = view
        self._message = message or (view.problem if view is not None and view.problem else HINT)
        self.refresh()

    @property
    def view(self) -> ElectrodeView | None:
        return self._view

    def render(self) -> Text:
        v = self._view
        if v is None or v.rate is None:
            return Text(self._message)
        return electrode_lines(v, self.size.width, self.size.height)
