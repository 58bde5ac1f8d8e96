"""Table form of one prediction (`crossrate predict`): plain text for pipes and NO_COLOR, Rich on a terminal.

Both forms come from the same rows, so they show the same numbers; the plain form is fixed-width and
deterministic (the golden tests compare it).
"""

import sys

from ..library.provenance import labelled_id
from ..services.wording import with_symbols
from .render_common import (
    CLOSING_CAUTION,
    fmt_fixed,
    fmt_sci,
    labelled_row,
    pow10,
    print_rich_sections,
    symbols,
    use_rich,
    wrap_item,
    wrap_line,
)

RATE_UNIT = "M^-1 s^-1"
#: Column widths of the plain form (label, value, unit); notes wrap in the rest of the 80 columns.
WIDTHS = (25, 12, 11)


def prediction_sections(p, sym: dict[str, str]) -> list[tuple[str, list[tuple[str, str, str, str]]]]:
    """[(section title, [(label, value, unit, note)])] for a Prediction."""
    c = p.conditions
    w = p.work_kJ_per_mol
    lam = sym["lambda"]
    conditions = [
        ("temperature", fmt_fixed(c.temperature_K, 2), "K", ""),
        ("ionic strength", f"{c.ionic_strength_M:g}", "M", ""),
        ("medium", c.medium, "", ""),
        ("relative permittivity", fmt_fixed(c.relative_permittivity, 2), "", "solvent value used"),
        ("refractive index", fmt_fixed(c.refractive_index, 4), "", ""),
        ("viscosity", fmt_fixed(c.viscosity_mPa_s, 4), "mPa s", ""),
        ("Z (collision factor)", fmt_sci(c.Z), RATE_UNIT, ""),
        ("diffusion cap", "on" if c.diffusion else "off", "", "1/k_obs = 1/k_act + 1/k_D" if c.diffusion else ""),
    ]
    potentials = []
    for k, pot in enumerate(p.potentials, start=1):
        unit = f"V {pot.E_scale}"
        potentials.append((f"E{k} as given", f"{pot.E_given_V:+.4f}", unit, pot.couple))
        note = pot.basis + (f"; SD {pot.E_sd_V * 1e3:.1f} mV" if pot.carried else "")
        potentials.append((f"E{k} at these conditions", f"{pot.E_at_conditions_V:+.4f}", unit, note))
    driving = [
        (sym["dG0"], fmt_fixed(p.dG0_kJ_per_mol, 2), "kJ/mol", f"{fmt_fixed(p.dG0_eV, 3)} eV"),
        (f"{sym['dG0p']} (work-corrected)", fmt_fixed(p.dG0_prime_kJ_per_mol, 2), "kJ/mol",
         f"{fmt_fixed(p.dG0_prime_eV, 3)} eV"),
        ("K12", pow10(p.log10_K12), "", f"log10 K12 = {fmt_fixed(p.log10_K12, 3)}"),
    ]
    # A non-adiabatic pair reads lambda with kappa_el Z (see the README, "Electronic factor").
    kappa = "κ" if lam == "λ" else "kappa "
    kz = "Z" if abs(p.kappa_el12 - 1.0) < 1e-12 else f"{kappa}Z"
    barrier = [
        (f"{lam}11", fmt_fixed(p.lambda11_kJ_per_mol, 2), "kJ/mol", f"4 (RT ln({kz}/k11) - w11)"),
        (f"{lam}22", fmt_fixed(p.lambda22_kJ_per_mol, 2), "kJ/mol", f"4 (RT ln({kz}/k22) - w22)"),
        (f"{lam}12", fmt_fixed(p.lambda_kJ_per_mol, 2), "kJ/mol", f"({lam}11 + {lam}22)/2"),
        (sym["dGact"], fmt_fixed(p.dG_act_kJ_per_mol, 2), "kJ/mol", f"w12 + ({lam}12/4)(1+{sym['dG0p']}/{lam}12)^2"),
        ("f12", pow10(p.ln_f12 / 2.302585092994046), "", f"ln f12 = {fmt_fixed(p.ln_f12, 4)}"),
        ("W12", pow10(p.ln_W12 / 2.302585092994046), "", f"ln W12 = {fmt_fixed(p.ln_W12, 4)}"),
    ]
    if kz != "Z":
        barrier.append((f"{kappa.strip()}12 (electronic)", fmt_fixed(p.kappa_el12, 3), "", f"({kappa}11 {kappa}22)^1/2"))
    if p.rate_model == "semiclassical" and p.semiclassical:
        q = p.semiclassical
        barrier += [
            ("rate model", "MLJ", "", "semiclassical: Marcus-Levich-Jortner quantum factor Q, Q = 1 at dG0' = 0"),
            (f"{lam}12 inner (quantized)", fmt_fixed(q["lambda_in12_kJ_per_mol"], 2), "kJ/mol",
             "from " + ", ".join(f"{k}: {v}" for k, v in q["inner_from"].items())),
            (f"{lam}12 outer (classical)", fmt_fixed(q["lambda_out12_kJ_per_mol"], 2), "kJ/mol", ""),
            ("hbar omega", f"{q['hbar_omega_cm1']:g}", "cm^-1", "energy of the quantized mode"),
            ("Q (quantum factor)", pow10(q["log10_quantum_factor"]), "",
             f"log10 Q = {fmt_fixed(q['log10_quantum_factor'], 3)}; k_act includes it"),
        ]
    work = [
        ("w11 (Ox1 + Red1)", fmt_fixed(w.w11, 3), "kJ/mol", "oxidant's self-exchange"),
        ("w22 (Ox2 + Red2)", fmt_fixed(w.w22, 3), "kJ/mol", "reductant's self-exchange"),
        ("w12 (Ox1 + Red2)", fmt_fixed(w.w12, 3), "kJ/mol", "precursor complex"),
        ("w21 (Red1 + Ox2)", fmt_fixed(w.w21, 3), "kJ/mol", "successor complex"),
    ]
    rates = [
        ("k11 (at these conditions)", pow10(p.log10_k11), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k11, 3)}"),
        ("k22 (at these conditions)", pow10(p.log10_k22), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k22, 3)}"),
        ("k_act (activation)", pow10(p.log10_k_act), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_act, 3)}"),
        ("k_D (diffusion limit)", pow10(p.log10_k_diff), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_diff, 3)}"
         + (f"; SD {p.log10_k_diff_sd:g}" if p.log10_k_diff_sd else "")),
        ("k_obs (predicted)", pow10(p.log10_k_obs), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_obs, 3)}"),
    ]
    if p.log10_k_obs_95 is not None:
        lo, hi = p.log10_k_obs_95
        rates.append(("k_obs 95 % interval, low", pow10(lo), RATE_UNIT,
                      f"log10 = {fmt_fixed(lo, 3)}; Monte Carlo"))
        rates.append(("k_obs 95 % interval, high", pow10(hi), RATE_UNIT,
                      f"log10 = {fmt_fixed(hi, 3)}; {p.samples} draws"))
    else:
        rates.append(("k_obs 95 % interval", "n/a", "", "Monte Carlo skipped (--samples 0)"))
    rates.append((
        "log10 k_obs SD", f"{sym['pm']}{fmt_fixed(p.log10_k_obs_sd_linear, 3)}", "log10",
        "linear" + (
            f"; Monte Carlo {sym['pm']}{fmt_fixed(p.log10_k_obs_sd_mc, 3)}" if p.log10_k_obs_sd_mc is not None else ""
        ),
    ))
    return [
        ("Conditions used", conditions),
        *([("Formal potentials", potentials)] if potentials else []),
        ("Driving force", driving),
        ("Reorganization energy and barrier", barrier),
        ("Work terms", work),
        ("Rate constants", rates),
    ]


def plain_prediction(p, sym: dict[str, str]) -> str:
    """The fixed-width plain-text table (ends with the closing caution line and a newline)."""
    ox = labelled_id(p.oxidant, p.oxidant_provenance)
    red = labelled_id(p.reductant, p.reductant_provenance)
    lines = [
        "Cross reaction  Ox1 + Red2 -> Red1 + Ox2",
        *wrap_item(f"oxidant (couple 1): {ox}   reductant (couple 2): {red}", bullet=""),
        "",
    ]
    for title, rows in prediction_sections(p, sym):
        lines.append(title)
        for label, value, unit, note in rows:
            lines.extend(labelled_row(label, value, unit, note, WIDTHS))
        lines.append("")
    say = _speaker(sym)
    lines.append("Regime")
    lines.extend(wrap_item(f"{p.regime}: {say(p.regime_explanation)}", bullet=""))
    lines.extend(wrap_item(
        "diffusion-controlled: " + ("yes (k_obs is close to k_D)" if p.diffusion_controlled else "no"), bullet=""
    ))
    lines.append("")
    lines.append("Warnings")
    if p.warnings:
        for text in p.warnings:
            lines.extend(wrap_item(say(text)))
    else:
        lines.append("  (none)")
    lines.append("")
    lines.extend(wrap_line(CLOSING_CAUTION))
    return "\n".join(lines) + "\n"


def _speaker(sym: dict[str, str]):
    """The services' ASCII wording with ΔG°' and λ where the stream can show them."""
    return with_symbols if sym["lambda"] == "λ" else str


def _rich_prediction(p, stream) -> None:
    from rich.text import Text

    from .terminal_output import console_for

    sym = symbols(stream)
    console = console_for(stream, highlight=False)
    console.print(Text("Cross reaction  Ox1 + Red2 -> Red1 + Ox2", style="bold"))
    ox = labelled_id(p.oxidant, p.oxidant_provenance)[len(p.oxidant):]
    red = labelled_id(p.reductant, p.reductant_provenance)[len(p.reductant):]
    console.print(Text.assemble("  oxidant (couple 1): ", (p.oxidant, "bold cyan"), ox, "   reductant (couple 2): ",
                                (p.reductant, "bold cyan"), red))
    print_rich_sections(console, prediction_sections(p, sym), WIDTHS, "k_obs")
    console.print()
    console.print(Text("Regime", style="bold underline"))
    say = _speaker(sym)
    first, *rest = wrap_item(f"{p.regime}: {say(p.regime_explanation)}", bullet="")
    console.print(Text.assemble("  ", (p.regime, "bold magenta"), first[2 + len(p.regime):]))
    for line in rest:
        console.print(line)
    console.print("  diffusion-controlled: " + ("yes (k_obs is close to k_D)" if p.diffusion_controlled else "no"))
    if p.warnings:
        console.print()
        console.print(Text("Warnings", style="bold yellow"))
        for text in p.warnings:
            for line in wrap_item(say(text)):
                console.print(Text(line, style="yellow"))
    console.print()
    console.print(Text(CLOSING_CAUTION, style="italic"))


def print_prediction(p, stream=None) -> None:
    """Write the table form of a Prediction to stream (default stdout): Rich on a colour terminal, else plain."""
    stream = stream or sys.stdout
    if use_rich(stream):
        _rich_prediction(p, stream)
    else:
        stream.write(plain_prediction(p, symbols(stream)))
