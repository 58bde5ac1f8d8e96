"""The pair bar: oxidant, reductant and the headline result, always visible at the top."""

from __future__ import annotations

from typing import TYPE_CHECKING

from rich.text import Text
from textual.widgets import Static

from ...library.provenance import mark_of
from ..units import rate_text

if TYPE_CHECKING:  # the services are imported after the first paint
    from ...services.results import Prediction


class PairBar(Static):
    """Two lines: the pair, then k_obs with interval and regime (or the current problem)."""

    def show(self, ox: str | None, red: str | None, p: Prediction | None, problem: str = "", stale: str = "",
             kinds: tuple[str, str] = ("", "")) -> None:
        """stale: why the conditions form gives no new prediction (p is then the last good one); kinds: the
        provenance word of the oxidant and the reductant ('invented' and 'unverified' are shown)."""
        t = Text()
        t.append("oxidant ", style="dim")
        t.append(ox or "(o)", style="bold")
        _append_kind(t, kinds[0] if ox else "")
        t.append("  +  reductant ", style="dim")
        t.append(red or "(r)", style="bold")
        _append_kind(t, kinds[1] if red else "")
        if p is not None and not problem:
            c = p.conditions
            t.append(f"   {c.temperature_K:g} K, {c.ionic_strength_M:g} M, {c.medium}", style="dim")
        t.append("\n")
        if problem:
            t.append("! " + problem, style="bold")
        elif p is None:
            t.append("set a pair: o = oxidant, r = reductant, x = swap", style="dim")
        else:
            t.append(f"k_obs {rate_text(p.log10_k_obs)} M⁻¹ s⁻¹", style="bold")
            if p.log10_k_obs_95 is not None:
                lo, hi = p.log10_k_obs_95
                t.append(f"  95 % {rate_text(lo)}..{rate_text(hi)}")
            t.append(f"  {p.regime}" + (", diffusion-controlled" if p.diffusion_controlled else ""))
            if stale:
                t.append(f"\n! {stale}; k_obs above is for the last good conditions", style="bold")
        self.update(t)


def _append_kind(t: Text, kind: str) -> None:
    """' (! invented)' or ' (? unverified)' after an id; nothing for a verified couple."""
    mark = mark_of(kind)
    if mark:
        t.append(f" ({mark} {kind})", style="bold" if kind == "invented" else "")
