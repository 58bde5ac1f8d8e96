"""Table form of a lambda breakdown (`crossrate lambda`): plain text for pipes and NO_COLOR, Rich on a terminal.

Both forms are built from the same rows, so they show the same numbers.
"""

import sys

from ..services.lambda_estimate import STRUCTURE_ID
from .render_common import (
    CLOSING_CAUTION,
    fmt_fixed,
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


def _pm(value, sd, digits, sym) -> str:
    return f"{fmt_fixed(value, digits)} {sym['pm']} {fmt_fixed(sd, digits)}"


def lambda_sections(b, sym: dict[str, str]) -> list[tuple[str, list[tuple[str, str, str, str]]]]:
    """[(section title, [(label, value, unit, note)])] for a LambdaBreakdown."""
    lam = sym["lambda"]
    charges = "charges not given" if b.charge_ox is None else f"z_ox = {b.charge_ox:+d}, z_red = {b.charge_red:+d}"
    conditions = [
        ("medium", b.medium, "", f"n = {fmt_fixed(b.refractive_index, 4)}, eps_s = {fmt_fixed(b.relative_permittivity, 2)}"),
        ("Pekar 1/n^2 - 1/eps_s", fmt_fixed(b.pekar_factor, 4), "", ""),
        ("temperature", fmt_fixed(b.temperature_K, 2), "K", ""),
        ("ionic strength", f"{b.ionic_strength_M:g}", "M", ""),
        ("radius a", fmt_fixed(b.radius_A, 2), "angstrom", charges),
        ("Z (collision factor)", f"{b.Z:.3g}", RATE_UNIT, ""),
    ]
    estimate = [
        (f"{lam}_in (inner sphere)", fmt_fixed(b.lambda_in_kJ_per_mol, 1) if b.lambda_in_kJ_per_mol is not None
         else "0 (none)", "kJ/mol", b.lambda_in_source),
        (f"{lam}_out (outer sphere)", fmt_fixed(b.lambda_out_kJ_per_mol, 1), "kJ/mol",
         "Marcus two-sphere, r = 2a"),
        (f"{lam} (estimate)", _pm(b.lambda_estimate_kJ_per_mol, b.lambda_estimate_sd_kJ_per_mol, 1, sym), "kJ/mol",
         "default 15 % SD"),
        ("w_ii (self-exchange work)", fmt_fixed(b.work_kJ_per_mol, 2), "kJ/mol", "Debye-Hueckel-Bronsted, r=2a"),
        ("kappa_el", f"{b.kappa_el:g}", "", b.kappa_el_source),
        ("k_self implied", pow10(b.log10_k_self_estimate), RATE_UNIT,
         f"log10 = {_pm(b.log10_k_self_estimate, b.log10_k_self_estimate_sd, 2, sym)}"),
    ]
    sections = [("Conditions", conditions), ("Estimate from structure and solvent", estimate)]
    given = []
    if b.log10_k_self_measured is not None:
        given.append(("k_self measured", pow10(b.log10_k_self_measured), RATE_UNIT,
                      f"in {b.measured_medium}, {b.measured_temperature_K:g} K, {b.measured_ionic_strength_M:g} M"))
        given.append((f"{lam} the measurement implies", fmt_fixed(b.lambda_measured_kJ_per_mol, 1), "kJ/mol",
                      "from k_self and w_ii at its own conditions"))
        given.append((f"{lam}_in inferred", fmt_fixed(b.lambda_in_inferred_kJ_per_mol, 1), "kJ/mol",
                      f"measured {lam} minus two-sphere {lam}_out in {b.measured_medium}"))
        spread = b.log10_k_self_estimate - b.log10_k_self_measured
        given.append(("estimate / measured", f"{spread:+.2f}", "log10", "decades between the two k_self values"))
    if b.lambda_total_given_kJ_per_mol is not None:
        given.append((f"{lam}_total given", fmt_fixed(b.lambda_total_given_kJ_per_mol, 1), "kJ/mol",
                      "library value (in the couple's own solvent)"))
    if given:
        sections.append(("From the library", given))
    used = [("k_self used", pow10(b.log10_k_self_used) if b.log10_k_self_used is not None else "none", RATE_UNIT,
             f"log10 = {_pm(b.log10_k_self_used, b.log10_k_self_used_sd, 2, sym)}"
             if b.log10_k_self_used is not None else "")]
    if b.couple_id != STRUCTURE_ID:
        sections.append(("Used by predictions at these conditions", used))
    return sections


def plain_lambda(b, sym: dict[str, str]) -> str:
    """The fixed-width plain-text table (ends with the closing caution line and a newline)."""
    lines = [*wrap_line(f"Reorganization energy of {b.couple_id} ({b.name}), self-exchange Ox + Red -> Red + Ox"), ""]
    for title, rows in lambda_sections(b, sym):
        lines.append(title)
        for label, value, unit, note in rows:
            lines.extend(labelled_row(label, value, unit, note, WIDTHS))
        lines.append("")
    lines.append("How")
    lines.extend(wrap_item(b.estimate_label))
    lines.extend(wrap_item("predictions: " + b.k_self_used_how))
    for note in b.notes:
        lines.extend(wrap_item(note))
    lines.append("")
    lines.extend(wrap_line(CLOSING_CAUTION))
    return "\n".join(lines) + "\n"


def _rich_lambda(b, stream) -> None:
    from rich.text import Text

    from .terminal_output import console_for

    sym = symbols(stream)
    console = console_for(stream, highlight=False)
    first, *rest = wrap_line(f"Reorganization energy of {b.couple_id} ({b.name}), self-exchange Ox + Red -> Red + Ox")
    console.print(Text.assemble(("Reorganization energy of ", "bold"), (b.couple_id, "bold cyan"),
                                first[len("Reorganization energy of ") + len(b.couple_id):]))
    for line in rest:
        console.print(line)
    print_rich_sections(console, lambda_sections(b, sym), WIDTHS, "k_self")
    console.print()
    console.print(Text("How", style="bold underline"))
    for text, style in ([(b.estimate_label, ""), ("predictions: " + b.k_self_used_how, "")]
                        + [(note, "yellow") for note in b.notes]):
        for line in wrap_item(text):
            console.print(Text(line, style=style))
    console.print()
    console.print(Text(CLOSING_CAUTION, style="italic"))


def print_lambda(b, stream=None) -> None:
    """Write the table form of a LambdaBreakdown to stream (default stdout)."""
    stream = stream or sys.stdout
    if use_rich(stream):
        _rich_lambda(b, stream)
    else:
        stream.write(plain_lambda(b, symbols(stream)))
