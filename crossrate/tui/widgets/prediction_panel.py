"""The prediction panel: everything `crossrate predict` shows, energies in the chosen unit."""

from rich.text import Text
from textual.widgets import Static

from ...services.results import Prediction
from ...services.wording import with_symbols
from ..units import energy_text, rate_text

K_UNIT = "M⁻¹ s⁻¹"


def prediction_text(p: Prediction, unit: str, note: str = "") -> Text:
    """The full prediction as display text (energies in `unit`, rates in M^-1 s^-1)."""
    c = p.conditions
    w = p.work_kJ_per_mol
    t = Text()

    def line(label: str, value: str, style: str = "") -> None:
        t.append(f"{label:<11}", style="bold")
        t.append(value + "\n", style=style)

    t.append(f"{p.oxidant} + {p.reductant}", style="bold")
    t.append("   (Ox1 + Red2 -> Red1 + Ox2)\n")
    if note:
        t.append(note + "\n", style="italic")
    # The answer first (k_obs, interval, regime, warnings), so it is on screen at 80x24; how it was
    # obtained follows, reachable by scrolling.
    line("k_obs", f"{rate_text(p.log10_k_obs)} {K_UNIT}  (log10 {p.log10_k_obs:.2f})", "bold")
    if p.log10_k_obs_95 is not None:
        lo, hi = p.log10_k_obs_95
        line("95 %", f"{rate_text(lo)} to {rate_text(hi)}  (Monte Carlo, {p.samples} draws)")
    else:
        line("95 %", f"working... (linear SD {p.log10_k_obs_sd_linear:.2f} in log10)", "italic")
    line("regime", p.regime + (", diffusion-controlled" if p.diffusion_controlled else ""), "bold")
    t.append(f"  {with_symbols(p.regime_explanation)}\n")
    if p.warnings:
        t.append("warnings\n", style="bold")
        for wtext in p.warnings:
            t.append(f"  ! {with_symbols(wtext)}\n")
    if p.estimated:
        t.append("estimated\n", style="bold")
        for e in p.estimated:
            t.append(f"  ~ {e}\n")
    t.append("how it was obtained\n", style="bold underline")
    line("conditions", f"{c.temperature_K:g} K, I = {c.ionic_strength_M:g} M, {c.medium}")
    line("", f"eps {c.relative_permittivity:.2f}, eta {c.viscosity_mPa_s:.3g} mPa s, n {c.refractive_index:.3f}")
    line("", f"Z = {c.Z:.2g} {K_UNIT}, diffusion cap {'on' if c.diffusion else 'off'}")
    for k, pot in enumerate(p.potentials, start=1):
        line(f"E{k}", f"{pot.E_at_conditions_V:+.3f} V {pot.E_scale} here (given {pot.E_given_V:+.3f}): {pot.basis}")
    line("ΔG°", energy_text(p.dG0_kJ_per_mol, unit))
    line("ΔG°'", energy_text(p.dG0_prime_kJ_per_mol, unit) + "  (work-corrected)")
    line("K12", f"{rate_text(p.log10_K12)}  (log10 {p.log10_K12:.2f})")
    line("λ11", energy_text(p.lambda11_kJ_per_mol, unit, signed=False))
    line("λ22", energy_text(p.lambda22_kJ_per_mol, unit, signed=False))
    line("λ12", energy_text(p.lambda_kJ_per_mol, unit, signed=False))
    line("ΔG‡", energy_text(p.dG_act_kJ_per_mol, unit))
    if p.rate_model == "semiclassical" and p.semiclassical:
        q = p.semiclassical
        line("model", f"semiclassical: k_act x quantum factor Q = {rate_text(q['log10_quantum_factor'])} "
                      "(Q = 1 at ΔG°' = 0)")
        line("λ12 split", f"inner {energy_text(q['lambda_in12_kJ_per_mol'], unit, signed=False)}, outer "
                          f"{energy_text(q['lambda_out12_kJ_per_mol'], unit, signed=False)}, "
                          f"ħω {q['hbar_omega_cm1']:g} cm⁻¹")
    line("f12, W12", f"ln f12 = {p.ln_f12:.3f}, ln W12 = {p.ln_W12:.3f}")
    line("w11, w22", f"{energy_text(w.w11, unit)}, {energy_text(w.w22, unit)}")
    line("w12, w21", f"{energy_text(w.w12, unit)}, {energy_text(w.w21, unit)}")
    line("k11, k22", f"{rate_text(p.log10_k11)}, {rate_text(p.log10_k22)} {K_UNIT} (at these conditions)")
    line("k_act", f"{rate_text(p.log10_k_act)} {K_UNIT}")
    line("k_D", f"{rate_text(p.log10_k_diff)} {K_UNIT}")
    return t


class PredictionPanel(Static):
    """Shows a Prediction (or a hint while no pair is set)."""

    def show(self, p: Prediction | None, unit: str, note: str = "") -> None:
        if p is None:
            self.update(Text(note or "No pair yet. In the couples table press o to set the oxidant, r the reductant."))
        else:
            self.update(prediction_text(p, unit, note))
