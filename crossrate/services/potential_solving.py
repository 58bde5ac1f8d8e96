"""Solving the Marcus cross relation backwards for the potential of an unknown couple from a measured cross
rate with a known partner.

ln k12 is quadratic in Delta G deg', with its maximum at -Delta G deg' = lambda12; a rate below the maximum
gives two potentials, one on the normal side (reported first) and one on the inverted side. Roots are
bracketed and found with Brent's method (scipy.optimize.brentq) in volts, after removing the diffusion limit
(1/k_act = 1/k_obs - 1/k_D).
"""

import math
from dataclasses import dataclass

from ..core.constants import EV, FARADAY, KJ
from ..errors import ScienceError
from ..library.couple_set import CoupleSet
from .conditions import Conditions
from .measured_check import Z95
from .results import UsedConditions, _Record
from .solve_setup import (
    LN10,
    PairSetup,
    activation_target,
    activation_target_nudged_k_diff,
    brentq_solver,
    checked_measurement,
)

#: Library limit on |E| (V): a root beyond it is not a potential the data can support.
E_LIMIT_V = 5.0


@dataclass(frozen=True)
class PotentialSolution(_Record):
    """Potentials of `unknown` (its library field E, V on E_scale) reproducing the measured rate.

    E_V: roots, normal side first; E_regime: 'normal'/'inverted' per root; E_V_95: (low, high) per root;
    supported: whether the data can support each root; E_at_maximum_V: where the rate would be highest.
    """

    unknown: str
    partner: str
    role: str
    role_reason: str
    conditions: UsedConditions
    k_measured: float
    k_measured_log10_sd: float
    measured_sd_defaulted: bool
    E_V: tuple[float, ...]
    E_scale: str
    E_regime: tuple[str, ...]
    E_V_95: tuple[tuple[float, float], ...]
    E_sd_V: tuple[float, ...]
    supported: tuple[bool, ...]
    E_at_maximum_V: float
    lambda_kJ_per_mol: float
    library_E_V: float
    log10_k_act: float
    log10_k_diff: float
    log10_k_max: float
    diffusion_limited: bool
    explanation: str
    warnings: tuple[str, ...]
    #: SD of log10 k_D propagated into the intervals (0 with the diffusion cap off).
    log10_k_diff_sd: float = 0.0


def _E_roots(s: PairSetup, target: float, **others) -> tuple[float, float, float, float]:
    """(normal root, inverted root, E at the maximum, lambda12 J/mol) of ln k_act(E_unknown) = target."""
    brentq = brentq_solver()
    r = s.evaluate(**others)
    lam = float(r.lambda12)
    w12, w21 = float(r.w12), float(r.w21)
    # Maximum of ln k_act at Delta G deg' = -lambda12, i.e. Delta G deg = -lambda12 + w12 - w21 (barrier w12).
    E_star = s.E_from_dG0(-lam + w12 - w21)
    ln_max = s.ln_k_act(E_unknown=E_star, **others)
    if target > ln_max + 1e-9:
        raise ScienceError(
            f"the measured rate is faster than the cross relation allows with {s.partner.id} for any potential of "
            f"{s.unknown.id} (at most 10^{ln_max / LN10:.2f} M^-1 s^-1 activation-controlled, at the activationless "
            "point): an outer-sphere path with these self-exchange rates cannot explain it"
        )

    def f(E):
        return s.ln_k_act(E_unknown=E, **others) - target

    # Less driving force is the normal side: lower E for an oxidant, higher E for a reductant.
    toward_normal = -1.0 if s.role == "oxidant" else 1.0
    roots = []
    for direction in (toward_normal, -toward_normal):
        step = 0.25
        far = E_star + direction * step
        while f(far) > 0:
            step *= 2.0
            far = E_star + direction * step
            if step > 64.0:
                raise ScienceError("no potential within 64 V reproduces the measured rate")
        a, b = sorted((E_star, far))
        roots.append(E_star if f(E_star) <= 0 else brentq(f, a, b, xtol=1e-14, rtol=1e-15, maxiter=200))
    return roots[0], roots[1], E_star, lam


def solve_potential(
    couple_set: CoupleSet,
    unknown: str,
    partner: str,
    k_measured: float,
    k_measured_log10_sd: float | None = None,
    role: str = "auto",
    conditions: Conditions | None = None,
) -> PotentialSolution:
    """The potential E of `unknown` that reproduces a measured cross rate with `partner` (two roots).

    Same arguments as solve_k_self; the unknown's own k_self (or lambda) is used and its library E only
    decides the direction when role is 'auto'. Returns PotentialSolution with E in V on the unknown's own
    E_scale (the library field E, ground state when the couple is an excited state's).
    """
    s, k_measured, sd, defaulted = checked_measurement(
        couple_set, unknown, partner, k_measured, k_measured_log10_sd, role, conditions
    )
    if not math.isfinite(s.ln_k_unknown):
        raise ScienceError(
            f"{s.unknown.id} has no k_self and no reorganization energy: solving for its potential needs one"
        )
    ln_meas = math.log(k_measured)
    target, limited = activation_target(s, ln_meas)
    E_n, E_i, E_star, lam = _E_roots(s, target)
    nudges = (
        ("k", 1e-4 * LN10, sd * LN10, None),
        ("Ep", 1e-4, s.E_partner_sd, "E_partner"),
        ("lp", 1e-3, s.ln_k_partner_sd, "ln_k_partner"),
        ("lu", 1e-3, s.ln_k_unknown_sd, "ln_k_unknown"),
        ("kd", 1e-4 * LN10, s.ln_k_diff_sd, None),
    )
    var = [0.0, 0.0]
    near_peak = False
    for name, h, spread, key in nudges:
        if spread == 0.0:
            continue
        vals = []
        for sign in (1.0, -1.0):
            try:
                if name == "kd":
                    # A k_D moved to the measured rate leaves no activation rate: the roots merge at the top.
                    t = activation_target_nudged_k_diff(s, ln_meas, sign * h)
                    vals.append((E_star, E_star) if t is None else _E_roots(s, t)[:2])
                elif key is None:
                    t, _ = activation_target(s, ln_meas + sign * h)
                    vals.append(_E_roots(s, t)[:2])
                else:
                    vals.append(_E_roots(s, target, **{key: getattr(s, key) + sign * h})[:2])
            except ScienceError:
                near_peak = True  # a nudge pushes the rate past the maximum: the roots merge there
                vals.append((E_star, E_star))
        for j in range(2):
            var[j] += ((vals[0][j] - vals[1][j]) / (2.0 * h) * spread) ** 2
    sds = tuple(math.sqrt(v) for v in var)
    own = tuple(s.to_own_scale(E, couple_set.scales) for E in (E_n, E_i))
    E_star_own = s.to_own_scale(E_star, couple_set.scales)
    ok_range = tuple(abs(E) <= E_LIMIT_V for E in own)
    band = 2.0 * math.sqrt(lam * s.RT) / FARADAY  # activationless band half-width: 1 RT of intrinsic barrier
    merged = near_peak or abs(E_n - E_i) <= 2.0 * band
    supported = (ok_range[0], ok_range[1] and merged)
    text = _potential_text(s, own, E_star_own, lam, band, merged, limited, ok_range)
    return PotentialSolution(
        unknown=s.unknown.id, partner=s.partner.id, role=s.role, role_reason=s.role_reason,
        conditions=s.used_conditions(), k_measured=float(k_measured), k_measured_log10_sd=sd,
        measured_sd_defaulted=defaulted, E_V=own, E_scale=s.unknown.E_scale, E_regime=("normal", "inverted"),
        E_V_95=tuple((E - Z95 * d, E + Z95 * d) for E, d in zip(own, sds, strict=True)), E_sd_V=sds,
        supported=supported, E_at_maximum_V=E_star_own, lambda_kJ_per_mol=lam / KJ, library_E_V=s.unknown.E,
        log10_k_act=target / LN10, log10_k_diff=s.ln_k_diff / LN10, log10_k_diff_sd=s.ln_k_diff_sd / LN10,
        log10_k_max=s.ln_k_act(E_unknown=E_star) / LN10, diffusion_limited=limited, explanation=text,
        warnings=s.warnings,
    )


def _potential_text(s, own, E_star, lam, band, merged, limited, ok_range) -> str:
    u = s.unknown
    parts = [
        f"two potentials of {u.id} give this rate with {s.partner.id}: E = {own[0]:.3f} V (normal side) and "
        f"E = {own[1]:.3f} V (inverted side) vs {u.E_scale}; the rate would peak at E = {E_star:.3f} V, "
        f"where -Delta G deg' = lambda12 = {lam / EV:.2f} eV"
    ]
    if merged:
        parts.append(
            "the measured rate is close to the activationless maximum, so the two roots lie within the "
            f"measurement's reach of each other (+-{band:.2f} V): the data fix E only near {E_star:.3f} V"
        )
    else:
        parts.append(
            "the data support the normal-side root; the inverted-side root would need -Delta G deg' beyond "
            "lambda12, where bimolecular rates are usually hidden by the diffusion plateau; a single rate cannot "
            "tell the two apart, so take it only with independent evidence for so strong a driving force"
        )
    if not all(ok_range):
        bad = [f"{E:.2f} V" for E, ok in zip(own, ok_range, strict=True) if not ok]
        parts.append(f"{' and '.join(bad)} lies beyond +-{E_LIMIT_V:g} V and is not a potential the data can support")
    if limited:
        parts.append(
            "the measured rate is at the diffusion limit: it bounds the potential (at least this much driving "
            "force) rather than fixing it"
        )
    parts.append(f"the library lists E = {u.E:.3f} V for {u.id}")
    return "; ".join(parts)
