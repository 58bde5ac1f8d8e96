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
