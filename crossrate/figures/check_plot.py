"""Measured against predicted cross rates, log-log, with the 1:1 line and the factor-of-10 band."""

import numpy as np

from .backend import pyplot, save_figure

VERDICT_STYLE = {
    "within_interval": ("o", "#2b6f9e", "inside the combined 95 % interval"),
    "within_10x": ("s", "#c98a1a", "within a factor of 10"),
    "beyond_10x": ("^", "#b0342c", "beyond a factor of 10"),
}


def plot_check(report, path, title: str | None = None, replace: bool = False):
    """Draw a CheckReport (crossrate.services.measured_check) to path (.svg or .png); returns the Path.

    Axes: log10 k_predicted (x, with its 95 % interval as error bars) and log10 k_measured (y, with its
    +-1.96 SD), both in M^-1 s^-1.
    """
    plt = pyplot()
    rows = report.rows
    x = np.array([r.log10_k_pred for r in rows])
    y = np.array([r.log10_k_measured for r in rows])
    lo = min(x.min(), y.min()) - 1.0
    hi = max(x.max(), y.max()) + 1.0
    fig, ax = plt.subplots(figsize=(5.5, 5.0))
    line = np.array([lo, hi])
    ax.fill_between(line, line - 1.0, line + 1.0, color="#d9d9d9", alpha=0.6, lw=0, label="factor of 10")
    ax.plot(line, line, color="#444444", lw=1.0, label="measured = predicted")
    for verdict, (marker, colour, text) in VERDICT_STYLE.items():
        sel = [i for i, r in enumerate(rows) if r.verdict == verdict]
        if not sel:
            continue
        xe = np.array([[x[i] - rows[i].log10_k_pred_95[0] for i in sel], [rows[i].log10_k_pred_95[1] - x[i] for i in sel]])
        ye = np.array([1.96 * rows[i].k_measured_log10_sd for i in sel])
        ax.errorbar(x[sel], y[sel], xerr=np.clip(xe, 0, None), yerr=ye, fmt=marker, color=colour, ms=6,
                    capsize=2, lw=0.8, label=text)
    for r, xi, yi in zip(rows, x, y, strict=True):
        if r.verdict == "beyond_10x":
            ax.annotate(f"{r.oxidant} + {r.reductant}", (xi, yi), textcoords="offset points", xytext=(4, 4),
                        fontsize=7)
    ax.set_xlim(lo, hi)
    ax.set_ylim(lo, hi)
    ax.set_aspect("equal")
    ax.set_xlabel("log10 k predicted / M$^{-1}$ s$^{-1}$")
    ax.set_ylabel("log10 k measured / M$^{-1}$ s$^{-1}$")
    s = report.summary
    ax.set_title(title or f"{s.n} cross reactions: median |log10 ratio| {s.median_abs_log10_ratio:.2f}", fontsize=10)
    ax.legend(fontsize=7, loc="upper left")
    ax.grid(True, lw=0.3, alpha=0.5)
    return save_figure(fig, path, replace)
