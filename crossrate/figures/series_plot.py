"""A fitted driving-force series: data, the classical, semiclassical and no-inverted-region fits and the regions."""

import numpy as np

from ..core.constants import EV, GAS_CONSTANT, KJ
from .backend import pyplot, save_figure

REGION_COLOURS = {"normal": "#e8f1f8", "activationless": "#f3f3dc", "inverted": "#f8e8e6"}


def plot_series(fit, path, title: str | None = None, replace: bool = False):
    """Draw a SeriesFit (crossrate.services.series_fit) to path (.svg or .png); returns the Path.

    x: -Delta G deg in eV; y: log10 k (the series' unit). Every fitted model's curve, the favoured one drawn
    thick. Shaded: the normal region, the activationless band around the favoured model's maximum and the
    inverted region.
    """
    plt = pyplot()
    xs = np.array([-p.dG0_kJ_per_mol * KJ / EV for p in fit.points])
    ys = np.array([p.log10_k_obs for p in fit.points])
    es = np.array([1.96 * p.log10_sd for p in fit.points])
    lam = fit.minus_dG0_at_max_eV
    span = max(xs.max(), 1.6 * lam) - min(xs.min(), 0.0)
    x0 = min(xs.min(), 0.0) - 0.1 * span
    x1 = max(xs.max(), 1.6 * lam) + 0.1 * span
    grid = np.linspace(x0, x1, 400)
    fig, ax = plt.subplots(figsize=(6.5, 4.5))
    rt = GAS_CONSTANT * fit.temperature_K / EV  # RT in eV, for the width of the activationless band
    band = 2.0 * np.sqrt(lam * rt)
    ax.axvspan(x0, max(x0, lam - band), color=REGION_COLOURS["normal"], lw=0)
    ax.axvspan(lam - band, lam + band, color=REGION_COLOURS["activationless"], lw=0)
    ax.axvspan(lam + band, x1, color=REGION_COLOURS["inverted"], lw=0)
    top = fit.log10_k_plateau
    ax.text(max(x0, lam - band) - 0.02 * span, top + 0.3, "normal", ha="right", fontsize=8, color="#2b6f9e")
    ax.text(lam + band + 0.02 * span, top + 0.3, "inverted", ha="left", fontsize=8, color="#b0342c")
    styles = {"classical": ("#1f4e79", "-"), "semiclassical": ("#8a3b9e", "-."), "no_inverted": ("#7f7f7f", "--")}
    for m in fit.models:
        colour, ls = styles[m.model]
        favoured = m.model == fit.model
        ax.plot(grid, fit.curve_log10_k(-grid * EV, model=m.model), color=colour, ls=ls,
                lw=1.8 if favoured else 1.0, label=m.title + (" (favoured)" if favoured else ""))
    if fit.log10_k_diff is not None:
        ax.axhline(fit.log10_k_diff, color="#999999", lw=0.8, ls=":", label="k$_D$")
    ax.axvline(lam, color="#444444", lw=0.8)
    ax.errorbar(xs, ys, yerr=es, fmt="o", color="#222222", ms=5, capsize=2, lw=0.8, label="measured")
    ax.set_ylim(min(ys.min() - 0.5, top - 4.0), max(top, ys.max()) + 1.0)
    ax.set_xlim(x0, x1)
    ax.set_xlabel(r"$-\Delta G^\circ$ / eV")
    ax.set_ylabel("log10 k / " + fit.rate_unit.replace("M^-1", "M$^{-1}$").replace("s^-1", "s$^{-1}$"))
    verdict = "inverted region supported" if fit.inverted_region_supported else "inverted region not supported"
    lam_text = (f"lambda = {fit.lambda_eV:.2f} eV ({fit.lambda_kJ_per_mol:.0f} kJ/mol)" if fit.lambda_identified
                else "lambda not determined")
    ax.set_title(title or f"{lam_text}, {fit.model}; {verdict}", fontsize=10)
    ax.legend(fontsize=7, loc="best", framealpha=0.9)
    return save_figure(fig, path, replace)
