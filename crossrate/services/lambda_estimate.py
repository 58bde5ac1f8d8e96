"""The reorganization-energy breakdown of a couple (inner, outer, work), measured or estimated.

For a library couple: the structural estimate (lambda_in from the couple's lambda_in field or bond sets,
plus the Marcus two-sphere lambda_out in the chosen solvent), the work term of its self-exchange, the
k_self that estimate implies (k_self = kappa_el Z exp(-(w + lambda/4)/RT)), and beside it the measured
k_self with the lambda it implies, and the k_self predictions actually use at these conditions.
For a couple not in the library: the same estimate from a radius, bond sets and charges.
"""

from dataclasses import dataclass, replace

import numpy as np

from ..core.barrier import self_exchange_lambda, self_exchange_ln_k
from ..core.constants import ANGSTROM, GAS_CONSTANT, KJ
from ..core.reorganization import self_exchange_outer_lambda
from ..core.solvents import get_solvent
from ..core.work_terms import work_term
from ..errors import ConditionsError, ScienceError
from ..library.couple import BondSet, Couple, Origin
from ..library.couple_set import CoupleSet
from ..library.schema import FIELDS_BY_NAME
from .arguments import require_conditions, require_couple_set, require_id, require_number
from .conditions import Conditions
from .couple_lambda import (
    DEFAULT_KAPPA_EL_LOG10_SD,
    KAPPA_DEFAULT,
    KAPPA_FIELD,
    LAMBDA_IN_BONDS,
    LAMBDA_IN_FIELD,
    couple_kappa,
    couple_lambda_in,
)
from .results import _Record
from .self_exchange import DEFAULT_LAMBDA_REL_SD, METHOD_MEASURED, self_exchange_at

LN10 = float(np.log(10.0))
#: Id given to a couple described on the command line rather than taken from a library.
STRUCTURE_ID = "(structure)"


@dataclass(frozen=True)
class LambdaBreakdown(_Record):
    """lambda breakdown of one couple's self-exchange at stated conditions.

    Energies kJ/mol, rate constants log10 of M^-1 s^-1, radius angstrom. None where a value does not apply.
    lambda_estimate = lambda_in (0 when the couple gives none) + lambda_out (two-sphere, this medium);
    its SD is DEFAULT_LAMBDA_REL_SD of it. log10_k_self_estimate follows from it, the work term and kappa_el.
    lambda_measured: the lambda the measured k_self implies at its own conditions (same Z and kappa_el);
    lambda_in_inferred: lambda_measured minus the two-sphere lambda_out in the measurement solvent.
    log10_k_self_used: what predictions use at these conditions (k_self_used_how says how it was obtained).
    """

    couple_id: str
    name: str
    medium: str
    temperature_K: float
    ionic_strength_M: float
    Z: float
    radius_A: float
    charge_ox: int | None
    charge_red: int | None
    refractive_index: float
    relative_permittivity: float
    pekar_factor: float
    lambda_in_kJ_per_mol: float | None
    lambda_in_source: str
    lambda_out_kJ_per_mol: float
    lambda_estimate_kJ_per_mol: float
    lambda_estimate_sd_kJ_per_mol: float
    estimate_label: str
    work_kJ_per_mol: float
    kappa_el: float
    kappa_el_source: str
    log10_k_self_estimate: float
    log10_k_self_estimate_sd: float
    lambda_total_given_kJ_per_mol: float | None
    log10_k_self_measured: float | None
    measured_medium: str | None
    measured_temperature_K: float | None
    measured_ionic_strength_M: float | None
    lambda_measured_kJ_per_mol: float | None
    lambda_in_inferred_kJ_per_mol: float | None
    log10_k_self_used: float | None
    log10_k_self_used_sd: float | None
    k_self_used_how: str
    notes: tuple[str, ...]


def _solvent(key: str):
    try:
        return get_solvent(key)
    except KeyError as exc:
        raise ConditionsError(str(exc.args[0])) from None


def _lambda_in_source(code: int, c: Couple) -> str:
    if code == LAMBDA_IN_FIELD:
        extra = " (bond sets given too, not used)" if c.bonds else ""
        return "lambda_in field" + extra
    if code == LAMBDA_IN_BONDS:
        n = sum(b.count for b in c.bonds)
        return f"bond data: {len(c.bonds)} set{'s' if len(c.bonds) != 1 else ''}, {n} bonds per molecule"
    return "none given"


def _kappa_source(code: int) -> str:
    if code == KAPPA_FIELD:
        return "kappa_el field"
    if code == KAPPA_DEFAULT:
        return f"default for couples tagged non-adiabatic (SD {DEFAULT_KAPPA_EL_LOG10_SD:g} in log10)"
    return "adiabatic (1)"


def lambda_breakdown(
    couple_set: CoupleSet, couple_id: str, medium: str | None = None, conditions: Conditions | None = None
) -> LambdaBreakdown:
    """The lambda breakdown of couple `couple_id` in `medium` (default: conditions.medium, else the couple's own).

    Temperature (K), Z (M^-1 s^-1) and ionic strength (mol/L; default the couple's own) come from conditions.
    Raises UnknownCoupleError for an unknown id, ConditionsError for an unknown medium.
    """
    require_couple_set(couple_set)
    require_id(couple_id, "couple_id")
    require_conditions(conditions)
    cond = conditions or Conditions()
    c = couple_set[couple_id]
    med = medium or cond.medium or c.medium
    sol = _solvent(med)
    T = float(cond.temperature_K)
    I = float(cond.ionic_strength_M) if cond.ionic_strength_M is not None else float(c.ionic_strength)
    ln_Z = float(np.log(cond.Z))
    RT = GAS_CONSTANT * T
    eps = float(sol.permittivity(T))
    pekar = float(sol.pekar_factor(T))
    a_m = c.radius * ANGSTROM

    lam_in, in_code = couple_lambda_in(c)
    kappa, k_code = couple_kappa(c)
    lam_out = float(self_exchange_outer_lambda(a_m, pekar))
    has_in = np.isfinite(lam_in)
    lam_est = (lam_in if has_in else 0.0) + lam_out
    sd_lam = DEFAULT_LAMBDA_REL_SD * lam_est
    w = float(work_term(c.charge_ox, c.charge_red, 2.0 * a_m, eps, T, I))
    ln_k_est = float(np.log(kappa) + self_exchange_ln_k(lam_est, w, T, ln_Z))
    kappa_var = (DEFAULT_KAPPA_EL_LOG10_SD * LN10) ** 2 if k_code == KAPPA_DEFAULT else 0.0
    sd_ln_est = float(np.sqrt((sd_lam / (4.0 * RT)) ** 2 + kappa_var))
    notes = []
    if has_in:
        label = f"estimate: lambda_in + two-sphere lambda_out in {med}"
    else:
        label = (
            f"lambda_out only (two-sphere, {med}): no inner-sphere data, lambda_in taken as 0, so lambda is a "
            "lower bound and k_self an upper bound"
        )
    if not sol.temperature_dependent and abs(T - 298.15) > 5.0:
        notes.append(f"{sol.name}: permittivity held at its 25 degC value at T = {T:g} K")

    lgk_meas = lam_meas = lam_in_inf = None
    if c.k_self is not None:
        sol0 = _solvent(c.medium)
        eps0 = float(sol0.permittivity(c.temperature))
        w0 = float(work_term(c.charge_ox, c.charge_red, 2.0 * a_m, eps0, c.temperature, c.ionic_strength))
        ln_k0 = float(np.log(c.k_self))
        lam_meas_J = float(self_exchange_lambda(ln_k0 - np.log(kappa), w0, c.temperature, ln_Z))
        lam_out0 = float(self_exchange_outer_lambda(a_m, sol0.pekar_factor(c.temperature)))
        lgk_meas = ln_k0 / LN10
        lam_meas = lam_meas_J / KJ
        lam_in_inf = (lam_meas_J - lam_out0) / KJ
        if lam_in_inf < 0:
            notes.append(
                "the measured lambda is below the two-sphere lambda_out: the continuum model overestimates the "
                "solvent part for this couple (common for large or non-spherical couples); carried to another "
                "solvent, all of the measured lambda is treated as outer-sphere (inner part 0)"
            )
        if med != c.medium:
            notes.append(f"k_self was measured in {c.medium}; lambda_measured and lambda_in_inferred refer to it")

    i = int(couple_set.index_of([couple_id])[0])
    se = self_exchange_at(couple_set, [i], T, I, eps, ln_Z, medium=med)
    if np.isfinite(se.ln_k[0]):
        lgk_used = float(se.ln_k[0]) / LN10
        sd_used = float(se.ln_k_sd[0]) / LN10
        how = se.description(0)
        if not how and int(se.method[0]) == METHOD_MEASURED:
            how = "measured k_self, carried to this temperature and ionic strength with lambda held fixed"
    else:
        lgk_used = sd_used = None
        how = (
            f"none: predictions refuse {c.id} until it has k_self, lambda_total, lambda_in or bonds "
            "(the estimate above is lambda_out only)"
        )
    return LambdaBreakdown(
        couple_id=c.id,
        name=c.name,
        medium=med,
        temperature_K=T,
        ionic_strength_M=I,
        Z=float(cond.Z),
        radius_A=float(c.radius),
        charge_ox=int(c.charge_ox),
        charge_red=int(c.charge_red),
        refractive_index=float(sol.n_D),
        relative_permittivity=eps,
        pekar_factor=pekar,
        lambda_in_kJ_per_mol=lam_in / KJ if has_in else None,
        lambda_in_source=_lambda_in_source(in_code, c),
        lambda_out_kJ_per_mol=lam_out / KJ,
        lambda_estimate_kJ_per_mol=lam_est / KJ,
        lambda_estimate_sd_kJ_per_mol=sd_lam / KJ,
        estimate_label=label,
        work_kJ_per_mol=w / KJ + 0.0,  # + 0.0: no -0.0 when one form is neutral
        kappa_el=kappa,
        kappa_el_source=_kappa_source(k_code),
        log10_k_self_estimate=ln_k_est / LN10,
        log10_k_self_estimate_sd=sd_ln_est / LN10,
        lambda_total_given_kJ_per_mol=c.lambda_total,
        log10_k_self_measured=lgk_meas,
        measured_medium=c.medium if c.k_self is not None else None,
        measured_temperature_K=c.temperature if c.k_self is not None else None,
        measured_ionic_strength_M=c.ionic_strength if c.k_self is not None else None,
        lambda_measured_kJ_per_mol=lam_meas,
        lambda_in_inferred_kJ_per_mol=lam_in_inf,
        log10_k_self_used=lgk_used,
        log10_k_self_used_sd=sd_used,
        k_self_used_how=how,
        notes=tuple(notes),
    )


def lambda_for_structure(
    radius_A: float,
    medium: str,
    bonds: tuple[BondSet, ...] = (),
    charges: tuple[int, int] | None = None,
    lambda_in_kJ: float | None = None,
    kappa_el: float | None = None,
    conditions: Conditions | None = None,
) -> LambdaBreakdown:
    """lambda breakdown of a couple not in the library, from its radius (angstrom), solvent key, bond sets
    (count, delta_d angstrom, f_ox and f_red N/m), charges (z_ox, z_red; None: work term 0) and optionally
    lambda_in (kJ/mol, instead of bonds) and kappa_el. Temperature, Z and ionic strength (default 0 M)
    from conditions. Raises ScienceError for a non-physical structure, ConditionsError for an unknown medium.
    """
    require_number(radius_A, "radius_A", "angstrom")
    require_conditions(conditions)
    cond = conditions or Conditions()
    radius_spec = FIELDS_BY_NAME["radius"]
    if not (np.isfinite(radius_A) and radius_spec.in_range(radius_A)):
        raise ScienceError(f"radius {radius_A!r} angstrom: expected {radius_spec.expected()} (the library's range "
                           "for a couple's effective radius)")
    for b in bonds:
        if b.count < 1 or not (b.f_ox > 0 and b.f_red > 0) or not np.isfinite(b.delta_d):
            raise ScienceError(
                f"bond set {b.count}:{b.delta_d}:{b.f_ox}:{b.f_red}: expected count >= 1, a finite delta_d "
                "(angstrom) and positive force constants (N/m)"
            )
    if lambda_in_kJ is not None and not (np.isfinite(lambda_in_kJ) and lambda_in_kJ >= 0):
        raise ScienceError(f"lambda_in {lambda_in_kJ!r} kJ/mol: expected a number >= 0")
    if kappa_el is not None and not (0 < kappa_el <= 1):
        raise ScienceError(f"kappa_el {kappa_el!r}: expected 0 < kappa_el <= 1")
    _solvent(medium)
    z_ox, z_red = charges if charges is not None else (0, 0)
    # Checked above field by field; without charges both are 0 (no work term), which a library couple may
    # not have, so the record is built as a trusted one.
    couple = Couple.trusted(
        id=STRUCTURE_ID,
        name=f"couple of radius {radius_A:g} A",
        charge_ox=int(z_ox),
        charge_red=int(z_red),
        E=0.0,
        E_scale="SHE",
        radius=float(radius_A),
        medium=medium,
        ionic_strength=float(cond.ionic_strength_M or 0.0),
        temperature=float(cond.temperature_K),
        source="command line",
        lambda_in=lambda_in_kJ,
        bonds=tuple(bonds),
        kappa_el=kappa_el,
        origin=Origin("<command line>", 0, "cli"),
    )
    out = lambda_breakdown(CoupleSet([couple]), STRUCTURE_ID, medium=medium, conditions=cond)
    notes = out.notes + (("charges not given: work term taken as 0",) if charges is None else ())
    return replace(
        out,
        charge_ox=None if charges is None else out.charge_ox,
        charge_red=None if charges is None else out.charge_red,
        log10_k_self_used=None,
        log10_k_self_used_sd=None,
        k_self_used_how="not a library couple: predictions do not use it (add it to a library to use it)",
        notes=notes,
    )
