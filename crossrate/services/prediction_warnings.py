"""Plain-language warnings attached to a prediction: what the user should know before trusting it."""

import numpy as np

from ..core.constants import EV, KJ
from ..core.regime import DIFFUSION_CONTROL_RATIO
from .couple_lambda import KAPPA_DEFAULT, couple_kappa

#: |Delta G deg| (eV) beyond which the quadratic Marcus form is flagged as least reliable (common practice).
LARGE_DRIVING_FORCE_EV = 0.75
#: Tags that mark a couple whose self-exchange involves a change of spin state.
SPIN_CHANGE_TAGS = ("spin-change", "spin_change", "spin change")


def pair_warnings(ox, red, rc, res, estimated, defaulted) -> tuple[str, ...]:
    """Warnings for a prediction of ox + red under resolved conditions rc with core result res."""
    out = []
    for c in (ox, red):
        if c.invented:
            out.append(f"{c.id}: invented values (made-up, not measurements); never use them for real "
                       "predictions")
        elif not c.verified:
            out.append(f"{c.id}: values not verified against the primary source (recalled or estimated)")
        if c.k_self is not None:
            moved = []
            if abs(c.ionic_strength - rc.ionic_strength_M) > 1e-9:
                moved.append(f"I {c.ionic_strength:g} -> {rc.ionic_strength_M:g} M")
            if abs(c.temperature - rc.temperature_K) > 1e-6:
                how = "Eyring step with dH_self" if c.dH_self is not None else "lambda held fixed"
                moved.append(f"T {c.temperature:g} -> {rc.temperature_K:g} K ({how})")
            if c.medium != rc.medium:
                moved.append(f"medium {c.medium} -> {rc.medium}")
            if moved:
                out.append(f"{c.id}: k_self carried from its measurement conditions ({'; '.join(moved)})")
        if any(t.lower() in SPIN_CHANGE_TAGS for t in c.tags):
            out.append(
                f"{c.id}: spin change on electron transfer; the cross relation often fails for such couples"
            )
        kappa, code = couple_kappa(c)
        if kappa < 1.0:
            how = "default for couples tagged non-adiabatic" if code == KAPPA_DEFAULT else "given"
            out.append(
                f"{c.id}: marked non-adiabatic (kappa_el = {kappa:g}, {how}); its lambda is read from "
                "k_self / (kappa_el Z), and k12 carries kappa12 = (kappa11 kappa22)^1/2"
            )
    # An excited-state couple reacts from its excited form only in one role: *Ox as oxidant, *Red as reductant.
    # In the other role the excited form is the product, and E -/+ E00 then prices forming it.
    for c, role, product in ((ox, "oxidant", "red"), (red, "reductant", "ox")):
        if c.E00 is not None and c.excited_form == product:
            out.append(
                f"{c.id}: as the {role} its excited {product} form is formed, not consumed "
                f"(E {'-' if product == 'red' else '+'} E00 used): the reaction would have to make the excited state"
            )
    for e in estimated:
        out.append(f"estimated: {e}")
    if defaulted:
        out.append("no uncertainty given, default used for: " + ", ".join(defaulted))
    if bool(np.asarray(res.diffusion_controlled)):
        out.append(
            f"diffusion-controlled (k_act > {DIFFUSION_CONTROL_RATIO:g} k_D): the measured rate would show k_D, "
            "and would hide an inverted region"
        )
    dG0 = float(np.asarray(res.dG0))
    if abs(dG0) / EV >= LARGE_DRIVING_FORCE_EV:
        out.append(
            f"|Delta G deg| = {abs(dG0) / KJ:.0f} kJ/mol ({abs(dG0) / EV:.2f} eV) is large: the cross relation is "
            "least reliable far from Delta G deg = 0"
        )
    return tuple(out)
