"""The answer to "does my series show an inverted region?" in plain words, with its evidence."""

import math


def inverted_region_evidence(
    *,
    supported: bool,
    delta_aic: float,
    threshold: float,
    n_past: int,
    n_past_below: int,
    min_points: int,
    lambda_eV: float,
    depths,
    diffusion: str,
    n_dc: int,
) -> str:
    """Plain-words statement of the inverted-region test (see crossrate.services.series_fit).

    Args:
        supported: the verdict; delta_aic: AIC(no inverted region) - AIC(Marcus); threshold: the Delta AIC
        needed; n_past: points past the fitted maximum (-Delta G deg > lambda); n_past_below: those more than
        2 SD below the plateau; min_points: how many such points are needed; lambda_eV: fitted lambda, eV;
        depths: how far (log10) those points sit below the plateau; diffusion: 'fitted', 'fixed' or 'off';
        n_dc: points whose activation rate is more than 10 x k_D (diffusion-controlled).
    """
    # Relative likelihood of the no-inverted-region model, exp(-Delta AIC / 2), capped for printing.
    rel = math.exp(-min(max(delta_aic, -700.0), 700.0) / 2.0)
    likely = "less than 1e-100 times" if delta_aic > 460.0 else f"{rel:.2g} times"
    comparison = (
        f"the Marcus curve fits better than a curve that levels off at the plateau by Delta AIC = {delta_aic:.1f} "
        f"(the no-inverted-region model is {likely} as likely; at least {threshold:.1f} is required)"
        if delta_aic >= 0
        else f"a curve that levels off at the plateau fits at least as well (Delta AIC = {delta_aic:.1f})"
    )
    where = f"past the maximum (-Delta G deg > lambda = {lambda_eV:.2f} eV)"
    if supported:
        d = list(depths)
        return (
            f"Yes, an inverted region is supported: {n_past} points lie {where}, and {n_past_below} of them sit "
            f"{min(d):.1f} to {max(d):.1f} log10 units below the plateau; {comparison}."
        )
    if n_past == 0:
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
