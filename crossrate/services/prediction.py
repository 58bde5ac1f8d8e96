"""Predicting cross-reaction rate constants from the couple library: one pair in full, or many at once."""

from typing import NamedTuple

import numpy as np

from ..core.constants import EV, GAS_CONSTANT, KJ
from ..core.cross_rate import CrossRateArrays, cross_rate
from ..core.regime import ACTIVATIONLESS_BAND_RT, DIFFUSION_CONTROL_RATIO, regime_name
from ..core.solvents import get_solvent
from ..errors import ConditionsError, ScienceError
from ..library.couple import Couple
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set, require_id, require_number
from .carried_potentials import basis_text, other_medium_message, potential_warnings, potentials_at
from .conditions import Conditions
from .flat_model import flat_model_note, flatness
from .prediction_warnings import pair_warnings
from .results import CarriedPotential, Prediction, UsedConditions, WorkTerms
from .self_exchange import DEFAULT_K_SELF_LOG10_SD, self_exchange_at
from .uncertainty import (
    DEFAULT_E_SD_V,
    DEFAULT_K_DIFF_LOG10_SD,
    InputSpread,
    gradient,
    linear_sd,
    monte_carlo,
)
from .validity_warnings import validity_warnings

LN10 = float(np.log(10.0))
#: Seed of the Monte Carlo interval when none is given (the CLI's default too), so a prediction is reproducible.
DEFAULT_SEED = 20261201

REGIME_EXPLANATIONS = {
    "endergonic": "uphill (Delta G deg' > 0): the rate is limited by the unfavourable equilibrium",
    "normal": "normal region (0 < -Delta G deg' < lambda): more driving force makes the reaction faster",
    "activationless": (
        f"activationless (-Delta G deg' near lambda: intrinsic barrier at most {ACTIVATIONLESS_BAND_RT:g} RT): "
        "near the fastest rate this lambda allows"
    ),
    "inverted": "inverted region (-Delta G deg' > lambda): more driving force makes the reaction slower",
}


# A NamedTuple, not a frozen dataclass: an internal record on the path of every prediction, and Python 3.11
# compiles a dataclass's six methods at import (about 1 ms a class of a cold command; see DEVELOPERS.md).
class ResolvedConditions(NamedTuple):
    """Conditions resolved for one pair: T (K), I (mol/L), medium key and its values, ln Z, the cap."""

    temperature_K: float
    ionic_strength_M: float
    medium: str
    eps_r: float
    viscosity_Pa_s: float
    refractive_index: float
    ln_Z: float
    Z: float
    diffusion: bool
    warnings: tuple[str, ...]
    #: Activity-coefficient equation carrying formal potentials in ionic strength (Conditions.activity_model).
    activity_model: str = "extended Debye-Hueckel"


def resolve_conditions(ox: Couple, red: Couple, cond: Conditions) -> ResolvedConditions:
    """Fill in ionic strength and medium from the couples where the user gave none; refuse mixed media."""
    notes = []
    if ox.medium != red.medium:
        if not cond.allow_mixed_media:
            raise ConditionsError(
                f"couples measured in different media ({ox.id}: {ox.medium}, {red.id}: {red.medium}); "
                "choose a medium and allow mixing explicitly (--medium M --allow-mixed-media)"
            )
        notes.append(
            f"mixed media: {ox.id} was measured in {ox.medium}, {red.id} in {red.medium}; "
            "self-exchange data carried to the chosen medium (outer-sphere lambda rescaled by the Pekar factors)"
        )
    medium = cond.medium or ox.medium
    try:
        solvent = get_solvent(medium)
    except KeyError as exc:
        raise ConditionsError(str(exc.args[0])) from None
    if cond.ionic_strength_M is not None:
        I = float(cond.ionic_strength_M)
    elif abs(ox.ionic_strength - red.ionic_strength) <= 1e-9:
        I = float(ox.ionic_strength)
    else:
        raise ConditionsError(
            f"the couples were measured at different ionic strengths ({ox.id}: {ox.ionic_strength:g} M, "
            f"{red.id}: {red.ionic_strength:g} M); give the ionic strength of the cross reaction (--ionic-strength M)"
        )
    T = float(cond.temperature_K)
    if not solvent.temperature_dependent and abs(T - 298.15) > 5.0:
        notes.append(f"{solvent.name}: permittivity and viscosity held at their 25 degC values at T = {T:g} K")
    return ResolvedConditions(
        temperature_K=T,
        ionic_strength_M=I,
        medium=medium,
        eps_r=float(solvent.permittivity(T)),
        viscosity_Pa_s=float(solvent.viscosity_Pa_s(T)),
        refractive_index=solvent.n_D,
        ln_Z=float(np.log(cond.Z)),
        Z=float(cond.Z),
        diffusion=cond.diffusion,
        warnings=tuple(notes),
        activity_model=cond.activity_model,
    )


def _require_same_scale(cs: CoupleSet, ox: Couple, red: Couple):
    E1, root1 = cs.E_on_root(ox)
    E2, root2 = cs.E_on_root(red)
    if root1 != root2:
        raise ConditionsError(
            f"potentials on scales that cannot be related: {ox.id} on {ox.E_scale!r} (root {root1!r}), "
            f"{red.id} on {red.E_scale!r} (root {root2!r}); define an offset between the scales in the library"
        )
    return E1, E2


def carry_potentials(cs: CoupleSet, ox: Couple, red: Couple, rc: ResolvedConditions, cond: Conditions):
    """PotentialsAt of (oxidant, reductant) at the resolved conditions; ConditionsError when a potential was
    measured in another medium and the conditions do not allow using it as measured."""
    idx = cs.index_of([ox.id, red.id])
    pa = potentials_at(cs, idx, rc.temperature_K, rc.ionic_strength_M, rc.eps_r, medium=rc.medium,
                       activity_model=rc.activity_model)
    if not cond.allow_E_other_medium:
        for c, other in zip((ox, red), pa.other_medium.tolist(), strict=True):
            if other:
                raise ConditionsError(other_medium_message(c, rc.medium))
    return pa


def potential_records(ox: Couple, red: Couple, pa, rc: ResolvedConditions) -> tuple[CarriedPotential, ...]:
    """The CarriedPotential records of the oxidant and the reductant."""
    out = []
    for k, c in enumerate((ox, red)):
        dI, dT = float(pa.dE_ionic_V[k]), float(pa.dE_temperature_V[k])
        out.append(CarriedPotential(
            couple=c.id,
            E_scale=c.E_scale,
            E_given_V=c.E,
            E_at_conditions_V=c.E + dI + dT,
            ionic_correction_V=dI,
            temperature_correction_V=dT,
            E_sd_V=float(pa.E_sd_V[k]),
            carried=not bool(pa.other_medium[k]),
            basis=basis_text(c, pa, k, rc.temperature_K, rc.ionic_strength_M, rc.medium, rc.activity_model),
        ))
    return tuple(out)


def _pair_model(cs, i_ox, i_red, E1, E2, rc: ResolvedConditions, quantum=None):
    """(evaluate(dE1, dE2, dlnk11, dlnk22) -> CrossRateArrays, SelfExchangeAt of both couples); quantum: a
    rate_model.QuantumModel for the semiclassical model (None: classical)."""
    a = cs.arrays
    se = self_exchange_at(
        cs, [i_ox, i_red], rc.temperature_K, rc.ionic_strength_M, rc.eps_r, rc.ln_Z, medium=rc.medium
    )

    # kappa_el of both couples: lambda_ii is read from k_ii / (kappa_el Z), and k12 carries kappa12.
    ln_kap = np.log(np.asarray(se.kappa_el, dtype=float))

    def evaluate(dE1=0.0, dE2=0.0, dlnk11=0.0, dlnk22=0.0, dlnkD=0.0) -> CrossRateArrays:
        out = classical(dE1, dE2, dlnk11, dlnk22, dlnkD)
        return out if quantum is None else quantum.apply(out, rc.temperature_K, rc.diffusion)

    def classical(dE1, dE2, dlnk11, dlnk22, dlnkD) -> CrossRateArrays:
        return cross_rate(
            E1 + np.asarray(dE1),
            E2 + np.asarray(dE2),
            a.z_ox[i_ox],
            a.z_red[i_ox],
            a.z_ox[i_red],
            a.z_red[i_red],
            a.radius_m[i_ox],
            a.radius_m[i_red],
            se.ln_k[0] + np.asarray(dlnk11),
            se.ln_k[1] + np.asarray(dlnk22),
            rc.temperature_K,
            rc.ionic_strength_M,
            rc.eps_r,
            rc.viscosity_Pa_s,
            rc.ln_Z,
            diffusion=rc.diffusion,
            ln_kappa11=float(ln_kap[0]),
            ln_kappa22=float(ln_kap[1]),
            d_ln_k_diff=dlnkD,
        )

    return evaluate, se


def predict(
    couple_set: CoupleSet,
    oxidant: str,
    reductant: str,
    conditions: Conditions | None = None,
    samples: int = 20000,
    seed: int | None = DEFAULT_SEED,
) -> Prediction:
    """Predict k12 for Ox1 + Red2 -> Red1 + Ox2 (Marcus cross relation, work terms, diffusion cap).

    Args:
        couple_set: the loaded couples.
        oxidant: id of couple 1, whose oxidized form takes the electron.
        reductant: id of couple 2, whose reduced form gives it.
        conditions: target conditions (default: 298.15 K, the couples' own I and medium, Z = 1e11 M^-1 s^-1).
        samples: Monte Carlo draws for the 95 % interval (0 skips it, otherwise at least 2); seed: RNG seed
            (default DEFAULT_SEED, the CLI's, so the same call gives the same interval; None draws a fresh one).

    Returns:
        Prediction (kJ/mol, log10 M^-1 s^-1). Raises UnknownCoupleError, ConditionsError or ScienceError.
    """
    require_couple_set(couple_set)
    require_id(oxidant, "oxidant")
    require_id(reductant, "reductant")
    require_conditions(conditions)
    if samples is not None:
        require_number(samples, "samples")
    cond = conditions or Conditions()
    if samples is None:
        samples = 0
    if int(samples) != samples or samples < 0 or samples == 1:
        # One draw has no spread: its "percentiles" would be the draw itself, not an interval.
        raise ConditionsError(f"samples {samples!r}: expected 0 (no interval) or at least 2 Monte Carlo draws")
    ox, red = couple_set[oxidant], couple_set[reductant]
    rc = resolve_conditions(ox, red, cond)
    _require_same_scale(couple_set, ox, red)
    pa = carry_potentials(couple_set, ox, red, rc, cond)
    E1, E2 = (float(e) for e in pa.E_root_V)
    i_ox, i_red = (int(i) for i in couple_set.index_of([oxidant, reductant]))
    quantum = None
    if cond.rate_model == "semiclassical":
        from .rate_model import quantum_model

        quantum = quantum_model(couple_set, (i_ox, i_red), cond.hbar_omega_cm1)
    evaluate, se = _pair_model(couple_set, i_ox, i_red, E1, E2, rc, quantum)
    for r in se.reason:
        if r:
            raise ScienceError(r + "; add one to the library or estimate lambda with `crossrate lambda`")

    res = evaluate()
    a = couple_set.arrays
    spread = InputSpread(
        E1_V=float(pa.E_sd_V[0]),
        E2_V=float(pa.E_sd_V[1]),
        ln_k11=float(se.ln_k_sd[0]),
        ln_k22=float(se.ln_k_sd[1]),
        ln_k_diff=DEFAULT_K_DIFF_LOG10_SD * LN10 if rc.diffusion else 0.0,
    )

    def model(d1, d2, d3, d4, d5):
        return evaluate(d1, d2, d3, d4, d5).ln_k_obs

    grad = gradient(model)
    sd_lin = linear_sd(model, spread, grad=grad)
    if samples and samples > 0:
        lo, hi, sd_mc = monte_carlo(model, spread, int(samples), seed)
        interval = (lo, hi)
    else:
        interval, sd_mc = None, None

    defaulted = []
    for c, i, k in ((ox, i_ox, 0), (red, i_red, 1)):
        if not np.isfinite(a.E_sd_V[i]):
            defaulted.append(f"E of {c.id} (default SD {DEFAULT_E_SD_V * 1000:g} mV)")
        if se.defaulted_sd[k]:
            defaulted.append(f"k_self of {c.id} (default SD {DEFAULT_K_SELF_LOG10_SD:g} in log10)")
    estimated = tuple(
        se.description(k) or f"k_self of {c.id} from its reorganization energy"
        for c, k in ((ox, 0), (red, 1))
        if se.estimated[k] or se.description(k)
    )
    regime = regime_name(res.regime)
    warnings = (
        rc.warnings
        + potential_warnings((ox, red), pa, rc.temperature_K, rc.ionic_strength_M, rc.medium, rc.activity_model)
        + pair_warnings(ox, red, rc, res, estimated, defaulted)
        + validity_warnings(ox, red, rc, float(np.asarray(res.ln_W12)))
    )
    flat = flat_model_note(
        flatness(grad, spread.as_array(), rc.temperature_K),
        float(np.exp(res.ln_k_obs - res.ln_k_diff)) if rc.diffusion else None,
        float(res.dG0_prime / res.lambda12), spread.ln_k_diff / LN10,
    )
    warnings += (flat,) if flat else ()
    semiclassical = None
    if quantum is not None:
        from .rate_model import semiclassical_summary

        semiclassical, more = semiclassical_summary(quantum, res, rc.temperature_K, (ox.id, red.id),
                                                    cond.hbar_omega_cm1 is not None)
        warnings = tuple(warnings) + tuple(more)

    def f(x):
        return float(np.asarray(x))

    return Prediction(
        oxidant=ox.id,
        reductant=red.id,
        conditions=UsedConditions(
            temperature_K=rc.temperature_K,
            ionic_strength_M=rc.ionic_strength_M,
            medium=rc.medium,
            Z=rc.Z,
            relative_permittivity=rc.eps_r,
            viscosity_mPa_s=rc.viscosity_Pa_s * 1e3,
            refractive_index=rc.refractive_index,
            diffusion=rc.diffusion,
        ),
        dG0_kJ_per_mol=f(res.dG0) / KJ,
        dG0_eV=f(res.dG0) / EV,
        dG0_prime_kJ_per_mol=f(res.dG0_prime) / KJ,
        dG0_prime_eV=f(res.dG0_prime) / EV,
        log10_K12=f(res.ln_K12) / LN10,
        lambda11_kJ_per_mol=f(res.lambda11) / KJ,
        lambda22_kJ_per_mol=f(res.lambda22) / KJ,
        lambda_kJ_per_mol=f(res.lambda12) / KJ,
        dG_act_kJ_per_mol=f(res.dG_act) / KJ,
        work_kJ_per_mol=WorkTerms(f(res.w11) / KJ, f(res.w22) / KJ, f(res.w12) / KJ, f(res.w21) / KJ),
        ln_f12=f(res.ln_f12),
        ln_W12=f(res.ln_W12),
        log10_k11=f(se.ln_k[0]) / LN10,
        log10_k22=f(se.ln_k[1]) / LN10,
        log10_k_act=f(res.ln_k_act) / LN10,
        log10_k_diff=f(res.ln_k_diff) / LN10,
        log10_k_obs=f(res.ln_k_obs) / LN10,
        log10_k_obs_95=interval,
        log10_k_obs_sd_linear=sd_lin,
        log10_k_obs_sd_mc=sd_mc,
        samples=int(samples or 0),
        regime=regime,
        regime_explanation=REGIME_EXPLANATIONS[regime],
        diffusion_controlled=bool(res.diffusion_controlled),
        warnings=warnings,
        estimated=estimated,
        kappa_el12=float(np.exp(f(res.ln_kappa12))),
        log10_k_diff_sd=spread.ln_k_diff / LN10,
        rate_model=cond.rate_model,
        semiclassical=semiclassical,
        oxidant_provenance=ox.provenance,
        reductant_provenance=red.provenance,
        potentials=potential_records(ox, red, pa, rc),
    )


def diffusion_control_rule() -> str:
    """The documented rule for the diffusion-controlled flag."""
    return f"k_act > {DIFFUSION_CONTROL_RATIO:g} x k_D"


def rt_kJ(T_K: float) -> float:
    """RT in kJ/mol at T (K)."""
    return GAS_CONSTANT * T_K / KJ
