"""Plain-text forms of the electrode results (k0, k(eta), voltammograms, checks); no science here."""

import math

from .render_common import wrap_text


def _pow10(lg: float) -> str:
    return f"{10.0**lg:.3g}"


def k0_lines(r) -> list[str]:
    """The predicted k0 of a couple and how it was obtained (r: services.electrode_rate.ElectrodeRate)."""
    lo, hi = r.log10_k0_95
    lines = [
        f"k0 of {r.couple} ({r.name}) at an electrode",
        f"  {r.medium}, {r.temperature_K:g} K, I = {r.ionic_strength_M:g} M",
        "",
        f"  k0            {_pow10(r.log10_k0):>10} cm/s   95 % [{_pow10(lo)}, {_pow10(hi)}] cm/s",
        f"  log10 k0      {r.log10_k0:10.2f}        +/- {r.log10_k0_sd:.2f} (SD)",
        f"  k_self        {_pow10(r.log10_k_self):>10} M^-1 s^-1  (log10 SD {r.log10_k_self_sd:.2f})",
        f"  w_self        {r.w_self_kJ_per_mol:10.2f} kJ/mol",
        f"  Z_sol         {r.Z_sol:10.3g} M^-1 s^-1",
        f"  Z_el          {r.Z_el_cm_s:10.3g} cm/s   {r.Z_el_source}",
    ]
    if math.isfinite(r.lambda_el_kJ_per_mol):
        lines.append(f"  lambda_el     {r.lambda_el_kJ_per_mol:10.1f} kJ/mol  (half of lambda_self "
                     f"{r.lambda_self_kJ_per_mol:.1f})")
    lines.append("")
    lines += wrap_text(f"relation: {r.relation}", subsequent="  ")
    for note in r.notes:
        lines += wrap_text(f"note: {note}", subsequent="  ")
    return lines


def rates_lines(c, prediction=None) -> list[str]:
    """Table of log10 k_red and log10 k_ox against overpotential (c: services.electrode_kinetics.RateCurves)."""
    out = []
    if prediction is not None:
        out += wrap_text(f"k0 of {prediction.couple}: {_pow10(c.log10_k0)} cm/s (predicted from k_self)")
    else:
        out.append(f"k0 = {_pow10(c.log10_k0)} cm/s (given)")
    mhc = c.log10_k_red_mhc is not None
    head = f"alpha = {c.alpha:g}"
    if mhc:
        head += f"; lambda_el = {c.lambda_el_kJ_per_mol:.1f} kJ/mol"
    out += [head + f"; {c.temperature_K:g} K; log10 of k in cm/s", ""]
    cols = ["eta / V", "BV red", "BV ox"] + (["MHC red", "MHC ox"] if mhc else [])
    out.append("".join(f"{h:>10}" for h in cols))
    out.append("-" * (10 * len(cols)))
    for k, eta in enumerate(c.eta_V.tolist()):
        vals = [c.log10_k_red_bv[k], c.log10_k_ox_bv[k]]
        if mhc:
            vals += [c.log10_k_red_mhc[k], c.log10_k_ox_mhc[k]]
        out.append(f"{eta:>10.3f}" + "".join(f"{float(v):>10.2f}" for v in vals))
    out.append("")
    if mhc:
        from ..services.electrode_kinetics import INVERTED_REGION_TEXT

        out += wrap_text(f"MHC plateau: log10 k = {c.log10_plateau_mhc:.2f}. {INVERTED_REGION_TEXT}.",
                         subsequent="")
    else:
        out += wrap_text("no reorganization energy: Butler-Volmer only (give --lambda-el KJ_MOL for "
                         "Marcus-Hush-Chidsey)", subsequent="")
    return out


def text_plot(x, y, width: int = 64, height: int = 15, marks: str = "*") -> list[str]:
    """A character plot of y against x (x increasing to the right), with the y range on the left."""
    import numpy as np

    x, y = np.asarray(x, dtype=float), np.asarray(y, dtype=float)
    x0, x1, y0, y1 = x.min(), x.max(), y.min(), y.max()
    if y1 <= y0:
        y1 = y0 + 1.0
    grid = [[" "] * width for _ in range(height)]
    cols = np.clip(((x - x0) / (x1 - x0) * (width - 1)).round().astype(int), 0, width - 1)
    rows = np.clip(((y1 - y) / (y1 - y0) * (height - 1)).round().astype(int), 0, height - 1)
    zero = int(round(y1 / (y1 - y0) * (height - 1))) if y0 < 0 < y1 else None
    if zero is not None:
        grid[zero] = ["-"] * width
    for r, c in zip(rows.tolist(), cols.tolist(), strict=True):
        grid[r][c] = marks
    label = [f"{y1:9.3g} |"] + [" " * 9 + " |"] * (height - 2) + [f"{y0:9.3g} |"]
    out = [lab + "".join(row) for lab, row in zip(label, grid, strict=True)]
    out.append(" " * 10 + "+" + "-" * width)
    out.append(" " * 11 + f"{x0:<10.3g}" + " " * (width - 20) + f"{x1:>10.3g}")
    return out


def cv_lines(series, prediction=None) -> list[str]:
    """Delta Ep against scan rate, the reversible limit, and a character plot of the first voltammogram
    (series: services.voltammogram.ScanRateSeries)."""
    s = series.setup
    out = []
    if prediction is not None:
        out += wrap_text(f"{prediction.couple}: k0 = {_pow10(s.log10_k0)} cm/s (predicted from k_self, 95 % "
                         f"[{_pow10(prediction.log10_k0_95[0])}, {_pow10(prediction.log10_k0_95[1])}])")
    else:
        out.append(f"k0 = {_pow10(s.log10_k0)} cm/s (given)")
    kin = ("Butler-Volmer, alpha = " + f"{s.alpha:g}") if s.kinetics == "bv" else (
        f"Marcus-Hush-Chidsey, lambda_el = {s.lambda_el_kJ_per_mol:.1f} kJ/mol")
    out += wrap_text(f"{kin}; D_ox = {s.D_ox_cm2_s:.3g}, D_red = {s.D_red_cm2_s:.3g} cm^2/s; "
                     f"{s.temperature_K:g} K; A = {s.area_cm2:g} cm^2, C = {s.conc_mM:g} mM, Ru = {s.Ru_ohm:g} ohm")
    out.append("")
    head = ("v / V s^-1", "psi", "dEp / mV", "Epc / V", "Epa / V", "ipc / uA", "ipa / uA")
    out.append("".join(f"{h:>11}" for h in head))
    out.append("-" * (11 * len(head)))
    for t in series.traces:
        out.append(f"{t.scan_rate_V_s:>11.3g}{t.psi:>11.3g}{t.dEp_mV:>11.1f}{t.Ep_c_V:>11.3f}{t.Ep_a_V:>11.3f}"
                   f"{t.ip_c_uA:>11.3g}{t.ip_a_uA:>11.3g}")
    out.append("")
    out += wrap_text(
        f"looks reversible (Delta Ep near 59 mV) below about {series.reversible_scan_rate_V_s:.3g} V/s "
        "(Matsuda-Ayabe: k0/(D f v)^1/2 = 15); potentials vs E0', currents anodic-positive", subsequent="")
    t = series.traces[0]
    out += ["", f"voltammogram at {t.scan_rate_V_s:g} V/s (current / uA against E - E0' / V):"]
    out += text_plot(t.E_V, t.current_uA)
    return out


def check_lines(r, setup=None) -> list[str]:
    """A measured k0 or peak separations against the prediction (r: services.electrode_check.ElectrodeCheck)."""
    p = r.prediction
    lo, hi = p.log10_k0_95
    out = [f"k0 of {r.couple}: measured against predicted ({r.source})", "",
           f"  predicted  {_pow10(p.log10_k0):>10} cm/s   95 % [{_pow10(lo)}, {_pow10(hi)}]"]
    if r.rows:
        if setup is not None:
            out += wrap_text(f"working curve: alpha = {setup.alpha:g}, D_ox = {setup.D_ox_cm2_s:.3g}, "
                             f"D_red = {setup.D_red_cm2_s:.3g} cm^2/s, {setup.temperature_K:g} K", indent="  ",
                             subsequent="    ")
        out += ["", f"{'line':>6}{'v / V s^-1':>12}{'dEp / mV':>10}{'psi':>9}{'k0 / cm s^-1':>15}"]
        for row in r.rows:
            if row.bound == "lower":
                k0 = f">= {_pow10(row.log10_k0)}"
                psi = ">= 20"
            else:
                k0 = f"{_pow10(row.log10_k0)}"
                psi = f"{row.psi:.3g}"
            out.append(f"{row.line:>6}{row.scan_rate_V_s:>12.3g}{row.dEp_mV:>10.1f}{psi:>9}{k0:>15}")
        out.append("")
    if r.log10_k0_measured is not None:
        m, s = r.log10_k0_measured, r.log10_k0_measured_sd
        out.append(f"  measured   {_pow10(m):>10} cm/s   95 % [{_pow10(m - 1.96 * s)}, {_pow10(m + 1.96 * s)}]"
                   f"  log10 ratio {r.log10_ratio:+.2f}")
    else:
        out.append(f"  measured   >= {_pow10(r.log10_k0_lower_bound)} cm/s (lower bound)")
    if r.slope_log10_k0_vs_log10_v is not None:
        out.append(f"  slope of log10 k0 against log10 v: {r.slope_log10_k0_vs_log10_v:+.2f} (0 expected)")
    out.append("")
    out += wrap_text(f"verdict: {r.verdict} - {r.verdict_text}", subsequent="  ")
    if r.likely_causes:
        out.append("likely causes worth checking:")
        for k, cause in enumerate(r.likely_causes[:4], start=1):
            out += wrap_text(f"{k}. {cause}", indent="  ", subsequent="     ")
    return out
