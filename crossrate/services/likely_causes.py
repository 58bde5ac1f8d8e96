"""Why a measured cross rate departs from the cross-relation prediction: the usual causes, ordered by what
the two couples' data and the prediction suggest for this pair.

Each cause gets a weight from the evidence at hand (tags, kappa_el, charges and ionic strength, conditions
the couples were measured under, driving force, nearness to the diffusion limit) and the direction of the
departure; causes are listed by weight, the generic ones last. The weights are a ranking aid, not a
probability (common practice of the trade, written down so it can be argued with).
"""

from dataclasses import dataclass

from ..core.constants import EV, KJ
from ..library.couple import Couple
from .prediction_warnings import LARGE_DRIVING_FORCE_EV, SPIN_CHANGE_TAGS
from .results import Prediction

#: |z1 z2| of the precursor pair at and above which ion pairing is worth checking.
HIGH_CHARGE_PRODUCT = 6
#: Ionic strength (mol/L) at and above which the Debye-Hueckel-Brønsted work terms are least reliable.
HIGH_IONIC_STRENGTH_M = 0.5
INNER_SPHERE_TAGS = ("inner-sphere", "inner_sphere", "bridging", "labile", "substitution-labile")
NON_ADIABATIC_TAGS = ("non-adiabatic", "nonadiabatic", "non_adiabatic")


@dataclass(frozen=True)
class Cause:
    """One likely cause: key (stable, for programs), text (plain words), weight (ranking only)."""

    key: str
    text: str
    weight: float


def _tagged(couples, tags) -> list[str]:
    if not couples:
        return []
    return [c.id for c in couples if any(t.lower() in tags for t in c.tags)]


def _conditions_moved(p: Prediction, couples) -> list[str]:
    if not couples:
        return [w for w in p.warnings if "carried from" in w or "mixed media" in w]
    cond = p.conditions
    out = []
    for c in couples:
        moved = []
        if abs(c.ionic_strength - cond.ionic_strength_M) > max(0.05, 0.5 * c.ionic_strength):
            moved.append(f"I {c.ionic_strength:g} M")
        if abs(c.temperature - cond.temperature_K) > 5.0:
            moved.append(f"T {c.temperature:g} K")
        if c.medium != cond.medium:
            moved.append(f"medium {c.medium}")
        if moved:
            out.append(f"{c.id} ({', '.join(moved)})")
    return out


def likely_causes(
    p: Prediction, log10_ratio: float, log10_k_measured: float, couples: tuple[Couple, Couple] | None
) -> tuple[Cause, ...]:
    """Causes worth checking for a measured rate 10**log10_ratio times the prediction p, most suggestive first.

    Args:
        p: the prediction; log10_ratio: log10(k_measured / k_predicted); log10_k_measured: log10 M^-1 s^-1.
        couples: (oxidant, reductant) records, or None (then only the prediction's own data are used).
    """
    slower = log10_ratio < 0
    out: list[Cause] = []

    if log10_k_measured > p.log10_k_diff:
        out.append(Cause(
            "above_diffusion_limit",
            f"the measured rate is above the computed diffusion limit (k_D = 10^{p.log10_k_diff:.2f} M^-1 s^-1): "
            "check the units (M^-1 s^-1) and the concentrations, or the radii behind k_D",
            5.0,
        ))
    elif log10_k_measured > p.log10_k_diff - 0.5 or p.diffusion_controlled:
        out.append(Cause(
            "diffusion_control",
            "diffusion control: the rate is near the encounter limit k_D, so it says little about activation; "
            "viscosity and radii set k_D here",
            3.5,
        ))

    spin = _tagged(couples, SPIN_CHANGE_TAGS)
    if spin or any("spin change" in w for w in p.warnings):
        out.append(Cause(
            "spin_change",
            f"spin change on electron transfer ({', '.join(spin) or 'tagged'}): the self-exchange rate of such "
            "couples is anomalous and the cross relation often fails",
            4.0,
        ))

    non_ad = [c.id for c in couples or () if c.kappa_el is not None and c.kappa_el < 1.0]
    non_ad += [cid for cid in _tagged(couples, NON_ADIABATIC_TAGS) if cid not in non_ad]
    if non_ad:
        out.append(Cause(
            "non_adiabatic",
            f"non-adiabatic transfer ({', '.join(non_ad)} marked so; the prediction already includes "
            f"kappa12 = (kappa11 kappa22)^1/2 = {p.kappa_el12:.2g}): the cross pair's electronic coupling may be "
            "weaker than that geometric mean of the self-exchanges assumes",
            3.5 if slower else 0.8,
        ))
    elif slower:
        out.append(Cause(
            "non_adiabatic",
            "non-adiabatic transfer: weak electronic coupling between the partners (kappa_el < 1) slows the "
            "cross reaction below the adiabatic estimate",
            1.0,
        ))

    zz = None
    if couples:
        zz = couples[0].charge_ox * couples[1].charge_red
    I = p.conditions.ionic_strength_M
    high_z = zz is not None and abs(zz) >= HIGH_CHARGE_PRODUCT
    high_I = I >= HIGH_IONIC_STRENGTH_M
    if high_z or high_I:
        why = []
        if high_z:
            why.append(f"charge product {zz:+d} of the precursor pair")
        if high_I:
            why.append(f"ionic strength {I:g} M")
        out.append(Cause(
            "ion_pairing",
            f"ion pairing or specific electrolyte effects ({' and '.join(why)}): the Debye-Hueckel work terms "
            "are least reliable here, and cations or anions of the electrolyte can mediate the transfer",
            3.0 if (high_z and high_I) else 2.0,
        ))

    inner = _tagged(couples, INNER_SPHERE_TAGS)
    if inner:
        out.append(Cause(
            "inner_sphere",
            f"an inner-sphere path ({', '.join(inner)} can bridge or exchange ligands), which can be much faster "
            "than the outer-sphere estimate",
            3.5 if not slower else 1.5,
        ))
    elif not slower:
        out.append(Cause(
            "inner_sphere",
            "an inner-sphere path (a bridging ligand) would make the reaction faster than the outer-sphere estimate",
            1.5,
        ))

    moved = _conditions_moved(p, couples)
    out.append(Cause(
        "mismatched_conditions",
        (
            f"mismatched conditions: E or k_self measured under other conditions ({'; '.join(moved)}) and carried "
            "to these with lambda held fixed"
            if moved else
            "mismatched conditions: check that E and k_self of both couples apply to the medium, ionic strength "
            "and temperature of the measurement"
        ),
        2.5 if moved else 0.5,
    ))

    big = abs(p.dG0_kJ_per_mol) * KJ / EV
    if big >= LARGE_DRIVING_FORCE_EV:
        if not slower and p.regime == "inverted":
            text = (
                f"large driving force (|Delta G deg| = {big:.2f} eV, inverted region): measured rates there are often "
                "faster than the quadratic Marcus form, as products can form in excited states"
            )
        else:
            text = f"large |Delta G deg| ({big:.2f} eV): the cross relation is least reliable far from Delta G deg = 0"
        out.append(Cause("large_driving_force", text, 2.5))
    out.sort(key=lambda c: -c.weight)
    return tuple(out)
