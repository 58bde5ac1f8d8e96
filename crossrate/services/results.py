"""Result records of the prediction services. Field names and units match the CLI's JSON keys."""

import math
from dataclasses import asdict, dataclass


def json_safe(value):
    """Recursively turn NaN/inf into None and tuples into lists, so json.dumps emits strict JSON."""
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    if isinstance(value, dict):
        return {k: json_safe(v) for k, v in value.items()}
    if isinstance(value, list | tuple):
        return [json_safe(v) for v in value]
    if hasattr(value, "item") and callable(value.item):  # numpy scalar
        return json_safe(value.item())
    return value


class _Record:
    def to_dict(self) -> dict:
        """Plain dict of the record (nested records included), JSON-safe (no NaN/inf)."""
        return json_safe(asdict(self))


@dataclass(frozen=True)
class UsedConditions(_Record):
    """The conditions and solvent values a prediction actually used.

    temperature_K (K), ionic_strength_M (mol/L), medium (solvent key), Z (M^-1 s^-1),
    relative_permittivity, viscosity_mPa_s (mPa s), refractive_index, diffusion (cap applied).
    """

    temperature_K: float
    ionic_strength_M: float
    medium: str
    Z: float
    relative_permittivity: float
    viscosity_mPa_s: float
    refractive_index: float
    diffusion: bool


@dataclass(frozen=True)
class WorkTerms(_Record):
    """The four work terms of a cross reaction, kJ/mol."""

    w11: float
    w22: float
    w12: float
    w21: float


@dataclass(frozen=True)
class CarriedPotential(_Record):
    """A couple's formal potential as given and at the prediction's conditions (V, on the couple's E_scale).

    E_given_V: the library value (ground state); E_at_conditions_V: after the corrections;
    ionic_correction_V, temperature_correction_V: the two corrections; E_sd_V: SD used in the interval, V;
    carried: False when E was measured in another medium and used as given; basis: how, in words.
    """

    couple: str
    E_scale: str
    E_given_V: float
    E_at_conditions_V: float
    ionic_correction_V: float
    temperature_correction_V: float
    E_sd_V: float
    carried: bool
    basis: str


@dataclass(frozen=True)
class Prediction(_Record):
    """One cross-rate prediction for Ox1 + Red2 -> Red1 + Ox2 (oxidant = couple 1, reductant = couple 2).

    Energies in kJ/mol (and eV where named), rate constants as log10 of M^-1 s^-1, ln_f12 and ln_W12
    dimensionless natural logs. log10_k_obs_95 is the Monte Carlo 95 % interval (None when samples = 0).
    dG_act_kJ_per_mol is the Marcus barrier w12 + (lambda12/4)(1 + dG0'/lambda12)^2, so that
    k_act = kappa_el12 Z exp(-dG_act/RT); kappa_el12 = (kappa11 kappa22)^(1/2) is the pair's electronic
    transmission factor (1 when both couples are adiabatic; lambda11, lambda22 are read with kappa_el Z).
    log10_k_obs_sd_mc is None when fewer than two Monte Carlo draws were made. potentials: the oxidant's and
    the reductant's formal potential as given and at these conditions (CarriedPotential).
    """

    oxidant: str
    reductant: str
    conditions: UsedConditions
    dG0_kJ_per_mol: float
    dG0_eV: float
    dG0_prime_kJ_per_mol: float
    dG0_prime_eV: float
    log10_K12: float
    lambda11_kJ_per_mol: float
    lambda22_kJ_per_mol: float
    lambda_kJ_per_mol: float
    dG_act_kJ_per_mol: float
    work_kJ_per_mol: WorkTerms
    ln_f12: float
    ln_W12: float
    log10_k11: float
    log10_k22: float
    log10_k_act: float
    log10_k_diff: float
    log10_k_obs: float
    log10_k_obs_95: tuple[float, float] | None
    log10_k_obs_sd_linear: float
    log10_k_obs_sd_mc: float | None
    samples: int
    regime: str
    regime_explanation: str
    diffusion_controlled: bool
    warnings: tuple[str, ...]
    estimated: tuple[str, ...]
    kappa_el12: float = 1.0
    #: How far each couple's values can be trusted: "invented" (made-up), "unverified" or "verified".
    oxidant_provenance: str = ""
    reductant_provenance: str = ""
    potentials: tuple[CarriedPotential, ...] = ()
    #: SD of log10 k_D propagated into the interval and the SD (0 with the diffusion cap off).
    log10_k_diff_sd: float = 0.0
    #: 'classical' or 'semiclassical'; for the latter, semiclassical holds lambda_in12_kJ_per_mol,
    #: lambda_out12_kJ_per_mol, hbar_omega_cm1, log10_quantum_factor (log10 Q, Q = 1 at dG0' = 0) and
    #: inner_from (couple id -> 'lambda_in', 'bonds' or 'default'); log10_k_act and log10_k_obs include Q.
    rate_model: str = "classical"
    semiclassical: dict | None = None

    @property
    def k_obs(self) -> float:
        """k_obs in M^-1 s^-1 (may overflow to inf for absurd inputs; log10_k_obs is always finite)."""
        return 10.0**self.log10_k_obs
