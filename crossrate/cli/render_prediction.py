"""Table form of one prediction (`crossrate predict`): plain text for pipes and NO_COLOR, Rich on a terminal.

Both forms come from the same rows, so they show the same numbers; the plain form is fixed-width and
deterministic (the golden tests compare it).
"""

import sys

from .render_common import (
    CLOSING_CAUTION,
    fmt_fixed,
    fmt_sci,
    pow10,
    symbols,
    use_rich,
    wrap_item,
    wrap_line,
)

RATE_UNIT = "M^-1 s^-1"
LABEL_W, VALUE_W, UNIT_W = 26, 24, 11


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
    driving = [
        (sym["dG0"], fmt_fixed(p.dG0_kJ_per_mol, 2), "kJ/mol", f"{fmt_fixed(p.dG0_eV, 3)} eV"),
        (f"{sym['dG0p']} (work-corrected)", fmt_fixed(p.dG0_prime_kJ_per_mol, 2), "kJ/mol",
         f"{fmt_fixed(p.dG0_prime_eV, 3)} eV"),
        ("K12", pow10(p.log10_K12), "", f"log10 K12 = {fmt_fixed(p.log10_K12, 3)}"),
    ]
    barrier = [
        (f"{lam}11", fmt_fixed(p.lambda11_kJ_per_mol, 2), "kJ/mol", "4 (RT ln(Z/k11) - w11)"),
        (f"{lam}22", fmt_fixed(p.lambda22_kJ_per_mol, 2), "kJ/mol", "4 (RT ln(Z/k22) - w22)"),
        (f"{lam}12", fmt_fixed(p.lambda_kJ_per_mol, 2), "kJ/mol", f"({lam}11 + {lam}22)/2"),
        (sym["dGact"], fmt_fixed(p.dG_act_kJ_per_mol, 2), "kJ/mol", f"w12 + ({lam}12/4)(1 + {sym['dG0p']}/{lam}12)^2"),
        ("f12", pow10(p.ln_f12 / 2.302585092994046), "", f"ln f12 = {fmt_fixed(p.ln_f12, 4)}"),
        ("W12", pow10(p.ln_W12 / 2.302585092994046), "", f"ln W12 = {fmt_fixed(p.ln_W12, 4)}"),
    ]
    work = [
        ("w11 (Ox1 + Red1)", fmt_fixed(w.w11, 3), "kJ/mol", "self-exchange of the oxidant's couple"),
        ("w22 (Ox2 + Red2)", fmt_fixed(w.w22, 3), "kJ/mol", "self-exchange of the reductant's couple"),
        ("w12 (Ox1 + Red2)", fmt_fixed(w.w12, 3), "kJ/mol", "forming the precursor complex"),
        ("w21 (Red1 + Ox2)", fmt_fixed(w.w21, 3), "kJ/mol", "forming the successor complex"),
    ]
    rates = [
        ("k11 (at these conditions)", pow10(p.log10_k11), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k11, 3)}"),
        ("k22 (at these conditions)", pow10(p.log10_k22), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k22, 3)}"),
        ("k_act (activation)", pow10(p.log10_k_act), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_act, 3)}"),
        ("k_D (diffusion limit)", pow10(p.log10_k_diff), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_diff, 3)}"),
        ("k_obs (predicted)", pow10(p.log10_k_obs), RATE_UNIT, f"log10 = {fmt_fixed(p.log10_k_obs, 3)}"),
    ]
    if p.log10_k_obs_95 is not None:
        lo, hi = p.log10_k_obs_95
        rates.append((
            "k_obs 95 % interval", f"{pow10(lo)} {sym['to']} {pow10(hi)}", RATE_UNIT,
            f"log10 {fmt_fixed(lo, 3)} to {fmt_fixed(hi, 3)}; Monte Carlo, {p.samples} draws",
        ))
    else:
        rates.append(("k_obs 95 % interval", "n/a", "", "Monte Carlo skipped (--samples 0)"))
    rates.append((
        "log10 k_obs SD", f"{sym['pm']}{fmt_fixed(p.log10_k_obs_sd_linear, 3)}", "log10",
        "first-order (linear)" + (
            f"; Monte Carlo {sym['pm']}{fmt_fixed(p.log10_k_obs_sd_mc, 3)}" if p.log10_k_obs_sd_mc is not None else ""
        ),
    ))
    return [
        ("Conditions used", conditions),
        ("Driving force", driving),
        ("Reorganization energy and barrier", barrier),
        ("Work terms", work),
        ("Rate constants", rates),
    ]


def plain_prediction(p, sym: dict[str, str]) -> str:
    """The fixed-width plain-text table (ends with the closing caution line and a newline)."""
    lines = [
        f"Cross reaction  Ox1 + Red2 -> Red1 + Ox2   oxidant (couple 1): {p.oxidant}   reductant (couple 2): {p.reductant}",
        "",
    ]
    for title, rows in prediction_sections(p, sym):
        lines.append(title)
        for label, value, unit, note in rows:
            lines.append(f"  {label:<{LABEL_W}}{value:>{VALUE_W}}  {unit:<{UNIT_W}}{note}".rstrip())
        lines.append("")
    lines.append("Regime")
    lines.extend(wrap_item(f"{p.regime}: {p.regime_explanation}", bullet=""))
    lines.extend(wrap_item(
        "diffusion-controlled: " + ("yes (k_obs is close to k_D)" if p.diffusion_controlled else "no"), bullet=""
    ))
    lines.append("")
    lines.append("Warnings")
    if p.warnings:
        for text in p.warnings:
            lines.extend(wrap_item(text))
    else:
        lines.append("  (none)")
    lines.append("")
    lines.extend(wrap_line(CLOSING_CAUTION))
    return "\n".join(lines) + "\n"


def _rich_prediction(p, stream) -> None:
    from rich.console import Console
    from rich.table import Table
    from rich.text import Text

    sym = symbols(stream)
    console = Console(file=stream, highlight=False)
    console.print(
        Text.assemble(("Cross reaction ", "bold"), "Ox1 + Red2 -> Red1 + Ox2   oxidant: ",
                      (p.oxidant, "bold cyan"), "   reductant: ", (p.reductant, "bold cyan"))
    )
    table = Table(show_header=False, box=None, pad_edge=False)
    table.add_column("quantity", style="bold")
    table.add_column("value", justify="right")
    table.add_column("unit", style="dim")
    table.add_column("note", style="dim")
    for title, rows in prediction_sections(p, sym):
        table.add_row(Text(title, style="bold underline"), "", "", "")
        for label, value, unit, note in rows:
            style = "bold green" if label.startswith("k_obs") else ""
            table.add_row("  " + label, Text(value, style=style), unit, note)
    console.print(table)
    console.print(Text.assemble(("Regime ", "bold"), (p.regime, "bold magenta"), f": {p.regime_explanation}"))
    console.print("diffusion-controlled: " + ("yes (k_obs is close to k_D)" if p.diffusion_controlled else "no"))
    if p.warnings:
        console.print(Text("Warnings", style="bold yellow"))
        for text in p.warnings:
            console.print(Text("  - " + text, style="yellow"))
    console.print(Text(CLOSING_CAUTION, style="italic"))


def print_prediction(p, stream=None) -> None:
    """Write the table form of a Prediction to stream (default stdout): Rich on a colour terminal, else plain."""
    stream = stream or sys.stdout
    if use_rich(stream):
        _rich_prediction(p, stream)
    else:
        stream.write(plain_prediction(p, symbols(stream)))
