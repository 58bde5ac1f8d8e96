"""Solving the Marcus cross relation backwards: the self-exchange rate or the potential of an unknown couple
from a measured cross rate with a known partner.

Both solvers (this module for k_self, crossrate.services.potential_solving for E) use the full relation, k12 = (k11 k22 K12 f12)^(1/2) W12 with f12 and the work terms, after
removing the diffusion limit (1/k_act = 1/k_obs - 1/k_D). Roots are bracketed and found with Brent's method
(scipy.optimize.brentq) in log space for k_self and in volts for E.

* k_self: ln k12 rises with ln k11 while lambda12 > |Delta G deg'| (the normal side), so the normal-branch
  root is unique; a second root exists only when a very fast unknown would bring lambda12 below
  |Delta G deg'|, and is reported beside it, named for where it lies: the forward reaction's inverted region
  for a downhill pair, the reverse reaction's for an uphill one.
* E: ln k12 is quadratic in Delta G deg', with its maximum at -Delta G deg' = lambda12; a rate below the
  maximum gives two potentials, one on the normal side (reported first) and one on the inverted side.
"""

import math
from dataclasses import dataclass

from ..core.constants import KJ
from ..errors import ScienceError
from ..library.couple_set import CoupleSet
from .conditions import Conditions
from .measured_check import Z95
from .potential_solving import E_LIMIT_V, PotentialSolution, solve_potential
from .results import UsedConditions, _Record
from .solve_setup import (
    LN10,
    PairSetup,
    activation_target,
    activation_target_nudged_k_diff,
    brentq_solver,
    checked_measurement,
    lambda_kJ,
)

__all__ = [
    "E_LIMIT_V", "KSelfSolution", "PotentialSolution", "SECOND_ROOT_FORWARD_INVERTED",
    "SECOND_ROOT_REVERSE_INVERTED", "second_root_region", "solve_k_self", "solve_potential",
]


# ---- self-exchange rate ------------------------------------------------------------------------------------

@dataclass(frozen=True)
class KSelfSolution(_Record):
    """Apparent self-exchange rate constant of `unknown` at the stated conditions (log10 M^-1 s^-1).

    log10_k_self is None when the measured rate is diffusion-limited; then log10_k_self_lower_bound holds
    the value that k_act >= k_obs guarantees. log10_k_self_second_root: the second root, if one exists (a
    faster unknown with lambda12 < |Delta G deg'|); second_root_region names where it lies: "inverted" (the
    forward reaction in its inverted region, -Delta G deg' > lambda12) or "reverse inverted" (a strongly uphill
    forward reaction, Delta G deg' > lambda12: the reverse reaction is in its inverted region, not the forward).
    library_log10_k_self: the library's own value as listed; _at_conditions: carried to these conditions.
    """

    unknown: str
    partner: str
    role: str
    role_reason: str
    conditions: UsedConditions
    k_measured: float
    k_measured_log10_sd: float
    measured_sd_defaulted: bool
    log10_k_self: float | None
    k_self: float | None
    log10_k_self_95: tuple[float, float] | None
    log10_k_self_sd: float | None
    log10_k_self_lower_bound: float | None
    log10_k_self_second_root: float | None
    lambda_unknown_kJ_per_mol: float | None
    library_log10_k_self: float | None
    library_log10_k_self_at_conditions: float | None
    dG0_kJ_per_mol: float
    log10_k_act: float
    log10_k_diff: float
    diffusion_limited: bool
    explanation: str
    warnings: tuple[str, ...]
    second_root_region: str | None = None
    #: SD of log10 k_D propagated into the interval (0 with the diffusion cap off).
    log10_k_diff_sd: float = 0.0


#: Names of the second k_self root by the sign of Delta G deg' (see KSelfSolution).
SECOND_ROOT_FORWARD_INVERTED = "inverted"
SECOND_ROOT_REVERSE_INVERTED = "reverse inverted"


def second_root_region(dG0_prime_J_per_mol: float) -> str:
    """Where the second k_self root lies: the forward reaction's inverted region when the pair is downhill
    (Delta G deg' < 0), the reverse reaction's when it is uphill (lambda12 < Delta G deg' there)."""
    return SECOND_ROOT_FORWARD_INVERTED if dG0_prime_J_per_mol < 0 else SECOND_ROOT_REVERSE_INVERTED


def _k_self_roots(s: PairSetup, target: float, **others) -> tuple[float, float | None]:
    """(normal-branch root, inverted-branch root or None) of ln k_act(ln k11) = target, ln k11 in ln M^-1 s^-1."""
    brentq = brentq_solver()
    RT = s.RT
    res0 = s.evaluate(ln_k_unknown=0.0, **others)
    w_u = float(res0.w11 if s.role == "oxidant" else res0.w22)
    lam_p = float(res0.lambda22 if s.role == "oxidant" else res0.lambda11)
    dGp = float(res0.dG0_prime)
    ln_Z = s.rc.ln_Z + s.ln_kappa_unknown  # the unknown's own pre-exponential kappa_el Z
    top = ln_Z - w_u / RT - 1e-9  # lambda_unknown -> 0
    # Over lambda the barrier (lambda + dG')^2 / 4 lambda is lowest at lambda = |dG'| (either sign of dG'),
    # so k12 peaks where lambda12 = |Delta G deg'|, i.e. at this lambda of the unknown:
    lam_star = 2.0 * abs(dGp) - lam_p
    peak = ln_Z - (w_u + lam_star / 4.0) / RT if lam_star > 0 else top

    def f(y):
        return s.ln_k_act(ln_k_unknown=y, **others) - target

    if f(peak) < 0:
        raise ScienceError(
            f"the measured rate is faster than the cross relation allows with {s.partner.id} for any self-exchange "
            f"rate of {s.unknown.id} (at most 10^{(f(peak) + target) / LN10:.2f} M^-1 s^-1 activation-controlled): "
            "an outer-sphere path with these potentials cannot explain it"
        )
    lo = peak - 10.0
    while f(lo) > 0:
        lo -= 10.0
        if lo < -700.0:
            raise ScienceError("no self-exchange rate above 1e-300 M^-1 s^-1 reproduces so slow a rate")
    normal = brentq(f, lo, peak, xtol=1e-13, rtol=1e-15, maxiter=200)
    inverted = None
    if peak < top and f(top) < 0 < f(peak):
        inverted = brentq(f, peak, top, xtol=1e-13, rtol=1e-15, maxiter=200)
    return normal, inverted


def solve_k_self(
    couple_set: CoupleSet,
    unknown: str,
    partner: str,
    k_measured: float,
    k_measured_log10_sd: float | None = None,
    role: str = "auto",
    conditions: Conditions | None = None,
) -> KSelfSolution:
    """Apparent k_self of `unknown` from its measured cross rate with `partner` (Marcus cross relation, full).

    Args:
        couple_set: the loaded couples; unknown: id whose E, charges and radius are used (its own k_self is
            ignored and shown beside); partner: id of a couple with a known k_self (or lambda).
        k_measured: measured cross rate constant, M^-1 s^-1; k_measured_log10_sd: its SD (log10), None for
            the default DEFAULT_MEASURED_LOG10_SD.
        role: the unknown's role, 'oxidant', 'reductant' or 'auto' (downhill with the library potentials).
        conditions: conditions of the measurement.

    Returns:
        KSelfSolution (log10 M^-1 s^-1, kJ/mol). ScienceError when the rate is at or above k_D or faster
        than any k_self allows.
    """
    s, k_measured, sd, defaulted = checked_measurement(
        couple_set, unknown, partner, k_measured, k_measured_log10_sd, role, conditions
    )
    ln_meas = math.log(k_measured)
    target, limited = activation_target(s, ln_meas)
    res = s.evaluate(ln_k_unknown=0.0)
    lib = s.unknown.k_self
    lib_at = s.ln_k_unknown / LN10 if (lib is not None and math.isfinite(s.ln_k_unknown)) else None
    common = dict(
        unknown=s.unknown.id, partner=s.partner.id, role=s.role, role_reason=s.role_reason,
        conditions=s.used_conditions(), k_measured=float(k_measured), k_measured_log10_sd=sd,
        measured_sd_defaulted=defaulted, library_log10_k_self=math.log10(lib) if lib else None,
        library_log10_k_self_at_conditions=lib_at, dG0_kJ_per_mol=float(res.dG0) / KJ,
        log10_k_act=target / LN10, log10_k_diff=s.ln_k_diff / LN10, log10_k_diff_sd=s.ln_k_diff_sd / LN10,
        diffusion_limited=limited, warnings=s.warnings,
    )
    if limited:
        # k_act >= k_obs always, so solving with k_act = k_obs (lowered by the measurement spread) bounds k_self.
        bound, _ = _k_self_roots(s, ln_meas - Z95 * sd * LN10)
        return KSelfSolution(
            log10_k_self=None, k_self=None, log10_k_self_95=None, log10_k_self_sd=None,
            log10_k_self_lower_bound=bound / LN10, log10_k_self_second_root=None, lambda_unknown_kJ_per_mol=None,
            explanation=(
                f"the measured rate is at the diffusion limit (k_D = 10^{s.ln_k_diff / LN10:.2f} M^-1 s^-1): "
                "it fixes k_D, not the activation step, so no k_self can be backed out; k_self is at least "
                f"10^{bound / LN10:.2f} M^-1 s^-1"
            ),
            **common,
        )
    y, y_inv = _k_self_roots(s, target)
    # First-order propagation: re-solve with each input nudged (log10 k_meas, E of both, ln k of the partner,
    # ln k_D: the diffusion limit removed from k_obs is itself good to about a factor of 2).
    nudges = (
        ("k", 1e-4 * LN10, sd * LN10),
        ("Eu", 1e-4, s.E_unknown_sd),
        ("Ep", 1e-4, s.E_partner_sd),
        ("lp", 1e-3, s.ln_k_partner_sd),
        ("kd", 1e-4 * LN10, s.ln_k_diff_sd),
    )
    var = 0.0
    for name, h, spread in nudges:
        if spread == 0.0:
            continue
        vals = []
        for sign in (1.0, -1.0):
            try:
                if name == "k":
                    t, _ = activation_target(s, ln_meas + sign * h)
                    vals.append(_k_self_roots(s, t)[0])
                elif name == "kd":
                    t = activation_target_nudged_k_diff(s, ln_meas, sign * h)
                    vals.append(None if t is None else _k_self_roots(s, t)[0])
                else:
                    key = {"Eu": "E_unknown", "Ep": "E_partner", "lp": "ln_k_partner"}[name]
                    base = {"Eu": s.E_unknown, "Ep": s.E_partner, "lp": s.ln_k_partner}[name]
                    vals.append(_k_self_roots(s, target, **{key: base + sign * h})[0])
            except ScienceError:
                # At the activationless top a nudge can lift the target past the largest rate the relation
                # allows; the other side's one-sided difference then carries the slope.
                vals.append(None)
        if vals[0] is not None and vals[1] is not None:
            slope = (vals[0] - vals[1]) / (2.0 * h)
        elif vals[0] is not None or vals[1] is not None:
            slope = ((vals[0] - y) if vals[0] is not None else (y - vals[1])) / h
        else:
            raise ScienceError(
                f"the measured rate sits at the largest rate the cross relation allows for {s.unknown.id} with "
                f"{s.partner.id}: no spread of k_self can be estimated there"
            )
        var += (slope * spread) ** 2
    sd_y = math.sqrt(var) / LN10
    ly = y / LN10
    text = (
        f"apparent k_self of {s.unknown.id} = 10^{ly:.2f} M^-1 s^-1 at these conditions, from k12 with "
        f"{s.partner.id} through the full cross relation (f12 and work terms)"
    )
    if lib_at is not None:
        text += f"; the library's value carried here is 10^{lib_at:.2f} ({ly - lib_at:+.2f} in log10)"
    region = None
    if y_inv is not None:
        region = second_root_region(float(res.dG0_prime))
        where = (
            "the pair in the inverted region (-Delta G deg' > lambda12)" if region == SECOND_ROOT_FORWARD_INVERTED
            else "lambda12 below the uphill Delta G deg' (the reverse reaction in its inverted region; the forward "
            "one is endergonic, not inverted)"
        )
        text += f"; a second root, 10^{y_inv / LN10:.2f}, would put {where} and is shown for completeness only"
    return KSelfSolution(
        log10_k_self=ly, k_self=10.0**ly, log10_k_self_95=(ly - Z95 * sd_y, ly + Z95 * sd_y), log10_k_self_sd=sd_y,
        log10_k_self_lower_bound=None, log10_k_self_second_root=None if y_inv is None else y_inv / LN10,
        lambda_unknown_kJ_per_mol=lambda_kJ(s, y), explanation=text, second_root_region=region, **common,
    )


