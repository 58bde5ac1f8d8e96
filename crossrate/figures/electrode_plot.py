"""Figures of a couple at an electrode: log10 k against overpotential, and simulated voltammograms."""

from .backend import pyplot, save_figure


def plot_rates(curves, path, title: str | None = None):
    """Draw RateCurves (crossrate.services.electrode_kinetics) to path (.svg or .png); returns the Path.

    x: overpotential E - E0' in V; y: log10 k in cm/s; Butler-Volmer dashed, Marcus-Hush-Chidsey solid, with
    the MHC plateau marked."""
    plt = pyplot()
    fig, ax = plt.subplots(figsize=(6.5, 4.5))
    eta = curves.eta_V
    ax.plot(eta, curves.log10_k_red_bv, color="#1f4e79", lw=1.0, ls="--", label="k$_{red}$ Butler-Volmer")
    ax.plot(eta, curves.log10_k_ox_bv, color="#b0342c", lw=1.0, ls="--", label="k$_{ox}$ Butler-Volmer")
    if curves.log10_k_red_mhc is not None:
        ax.plot(eta, curves.log10_k_red_mhc, color="#1f4e79", lw=1.8, label="k$_{red}$ Marcus-Hush-Chidsey")
        ax.plot(eta, curves.log10_k_ox_mhc, color="#b0342c", lw=1.8, label="k$_{ox}$ Marcus-Hush-Chidsey")
        ax.axhline(curves.log10_plateau_mhc, color="#777777", lw=0.8, ls=":", label="MHC plateau")
    ax.axvline(0.0, color="#444444", lw=0.6)
    ax.set_xlabel("overpotential E - E0' / V")
    ax.set_ylabel("log$_{10}$ k / (cm s$^{-1}$)")
    ax.set_title(title or f"electrode rate constants, k0 = 10^{curves.log10_k0:.2f} cm/s")
    ax.legend(fontsize=8, loc="upper center")
    return save_figure(fig, path)


def plot_cv(series, path, title: str | None = None):
    """Draw a ScanRateSeries (crossrate.services.voltammogram): the voltammograms (current normalized by
    v^1/2, anodic positive, against E - E0') and Delta Ep against scan rate with the reversible limit."""
    plt = pyplot()
    fig, (ax, bx) = plt.subplots(1, 2, figsize=(10.5, 4.3))
    cmap = plt.get_cmap("viridis")
    n = len(series.traces)
    for k, t in enumerate(series.traces):
        ax.plot(t.E_V, t.current_uA / t.scan_rate_V_s**0.5, color=cmap(k / max(1, n - 1)), lw=1.2,
                label=f"{t.scan_rate_V_s:g} V/s")
    ax.axhline(0.0, color="#999999", lw=0.6)
    ax.set_xlabel("E - E0' / V")
    ax.set_ylabel("i / v$^{1/2}$ / (µA (V/s)$^{-1/2}$)")
    ax.legend(fontsize=8)
    rates = [t.scan_rate_V_s for t in series.traces]
    bx.semilogx(rates, [t.dEp_mV for t in series.traces], "o-", color="#1f4e79")
    bx.axvline(series.reversible_scan_rate_V_s, color="#b0342c", lw=0.9, ls="--", label="reversible below")
    bx.set_xlabel("scan rate / (V s$^{-1}$)")
    bx.set_ylabel("ΔEp / mV")
    bx.legend(fontsize=8)
    fig.suptitle(title or f"simulated cyclic voltammetry, k0 = 10^{series.setup.log10_k0:.2f} cm/s")
    return save_figure(fig, path)
