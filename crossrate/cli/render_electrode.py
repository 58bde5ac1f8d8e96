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
