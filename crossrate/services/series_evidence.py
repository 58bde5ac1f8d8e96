"""The answers of a series fit in plain words: which model the data support, what they say about lambda,
and whether they show an inverted region."""

import math

from .series_models import LAMBDA_BOUNDS_KJ


def _likely(delta_aic: float) -> str:
    # Relative likelihood exp(-Delta AIC / 2), capped for printing.
    rel = math.exp(-min(max(delta_aic, -700.0), 700.0) / 2.0)
    return "less than 1e-100 times" if delta_aic > 460.0 else f"{rel:.2g} times"


def model_comparison(fits, best: str) -> str:
    """One sentence comparing the fitted models by AIC (fits: ModelFit records; best: the favoured key)."""
    fav = next(m for m in fits if m.model == best)
    others = "; ".join(f"{m.title} Delta AIC = {m.delta_aic:.1f}" for m in fits if m.model != best)
    return (f"the data favour the {fav.title} model (Akaike weight {fav.weight:.2f})"
            + (f"; {others}" if others else "") + ".")


def lambda_statement(fav, lam95, tied_titles) -> str:
    """What the data say about lambda (kJ/mol), from the favoured model fav (ModelFit) and the reported
    interval lam95 (low, high; None = open side); tied_titles: other models within Delta AIC < 2."""
    lo, hi = lam95
    source = f"the {fav.title} model"
    if tied_titles:
        source += f", widened to cover the {' and '.join(tied_titles)} model{'s' if len(tied_titles) > 1 else ''}" \
                  " (the data cannot tell them apart)"
    if lo is not None and hi is not None:
        return (f"lambda = {fav.lambda_kJ_per_mol:.1f} kJ/mol ({fav.lambda_kJ_per_mol / 96.485332:.3f} eV); "
                f"95 % [{lo:.1f}, {hi:.1f}] kJ/mol from {source}")
    if lo is None and hi is None:
        return ("lambda is not determined by these data: no 95 % bound within 1-2000 kJ/mol "
                f"(from {source}); add points on the rising branch and past the maximum")
    side = f"lambda > {lo:.1f} kJ/mol" if lo is not None else f"lambda < {hi:.1f} kJ/mol"
    return (f"lambda is not determined by these data, only bounded: {side} (95 %, one-sided, from {source}); "
            "the series does not fall past its maximum")


def inverted_region_evidence(
    *,
    supported: bool,
    delta_aic: float,
    threshold: float,
    n_past: int,
    n_past_below: int,
    min_points: int,
    max_eV: float,
    depths,
    diffusion: str,
    n_dc: int,
    model_title: str = "classical Marcus",
    favoured: str = "classical",
) -> str:
    """Plain-words statement of the inverted-region test (see crossrate.services.series_fit).

    Args:
        supported: the verdict; delta_aic: AIC(no inverted region) - AIC(the model tested); threshold: the
        Delta AIC needed; n_past: points past that model's maximum; n_past_below: those more than 2 SD below
        the plateau; min_points: how many such points are needed; max_eV: -Delta G deg of the maximum, eV;
        depths: how far (log10) those points sit below the plateau; diffusion: 'fitted', 'fixed' or 'off';
        n_dc: points whose activation rate is more than 10 x k_D; model_title: the model tested;
        favoured: the key of the model the data favour.
    """
    likely = _likely(delta_aic)
    comparison = (
        f"the {model_title} curve fits better than a curve that levels off at the plateau by Delta AIC = "
        f"{delta_aic:.1f} (the no-inverted-region model is {likely} as likely; at least {threshold:.1f} is required)"
        if delta_aic >= 0
        else f"a curve that levels off at the plateau fits at least as well (Delta AIC = {delta_aic:.1f})"
    )
    where = f"past the maximum (-Delta G deg > {max_eV:.2f} eV)"
    if supported:
        d = list(depths)
        return (
            f"Yes, an inverted region is supported: {n_past} points lie {where}, and {n_past_below} of them sit "
            f"{min(d):.1f} to {max(d):.1f} log10 units below the plateau; {comparison}."
        )
    if favoured == "no_inverted" and n_past_below >= min_points:
        why = "No: the curve with no inverted region is the model the data favour"
    elif n_past == 0:
        why = f"No: no point lies {where}, so the data cannot show an inverted region"
    elif n_past_below < min_points:
        why = (
            f"No: {n_past} point{'s' if n_past != 1 else ''} lie{'' if n_past != 1 else 's'} {where}, but "
            f"{'only ' + str(n_past_below) if n_past_below else 'none'} sit{'s' if n_past_below == 1 else ''} "
            f"clearly below the plateau (at least {min_points} needed)"
        )
        if diffusion != "off":
            why += "; the diffusion plateau can hide an inverted region, as it does for most bimolecular series"
    else:
        why = f"No: points lie {where} below the plateau, but the evidence is too weak"
    extra = f"; {n_dc} point{'s are' if n_dc != 1 else ' is'} diffusion-controlled" if n_dc else ""
    return f"{why}; {comparison}{extra}."


def fit_warnings(given, chi2, dof, prob, theta, identified, keys, n, p):
    """Warnings of a series fit: scatter beyond the stated SDs, parameters at the edge of their search range
    (prob: the favoured model's Problem, theta its solution), an open lambda interval, a semiclassical model
    left out (keys: the models fitted; n points, p parameters of the classical model)."""
    out = []
    if given and chi2 / max(dof, 1) > 4.0:
        out.append(f"reduced chi-square {chi2 / max(dof, 1):.1f}: the scatter is larger than the stated SDs; the "
                   "errors are likely underestimated")
    lo_b, hi_b = prob.bounds()
    names = list(prob.model.names) + (["log10 k_D"] if prob.diffusion == "fitted" else [])
    for k, name in enumerate(names):
        if name == "phi":
            continue  # phi = 0 (no quantized mode) is a legitimate answer, not a failure
        if min(theta[k] - lo_b[k], hi_b[k] - theta[k]) < 1e-6 * max(1.0, abs(theta[k])):
            what = ("no diffusion plateau is seen; consider --no-diffusion or --k-diff" if name == "log10 k_D"
                    else "not determined")
            out.append(f"{name} ended at the edge of its search range ({theta[k]:.4g}): {what}")
    if not identified:
        out.append(f"the lambda interval is open within {LAMBDA_BOUNDS_KJ[0]:g}-{LAMBDA_BOUNDS_KJ[1]:g} kJ/mol: "
                   "the data do not determine lambda")
    if "semiclassical" not in keys:
        out.append(f"{n} points are too few for the semiclassical model (at least {p + 2} needed); it was not fitted")
    return out
