"""Output forms of `crossrate screen`: fixed-width table (Rich on a colour terminal), CSV and JSON."""

import csv
import io
import sys

from ..library.provenance import labelled_id, legend_lines, marked_id
from ..library.spreadsheet_cells import safe_row
from .render_common import CLOSING_CAUTION, fmt_fixed, pow10, symbols, use_rich, wrap_line

CSV_COLUMNS = (
    "rank", "partner", "partner_provenance", "oxidant", "reductant", "log10_k_obs", "log10_k_obs_low95_linear",
    "log10_k_obs_high95_linear", "log10_k_obs_sd_linear", "dG0_kJ_per_mol", "dG0_prime_kJ_per_mol",
    "lambda_kJ_per_mol", "log10_k_act", "log10_k_diff", "regime", "diffusion_controlled",
)


def heading(result) -> str:
    """Two lines saying what was screened (the reaction on the second)."""
    t = result.target
    who = labelled_id(t, result.target_provenance)
    if result.role == "oxidant":
        return f"Screening {who} as oxidant:\n  Ox({t}) + Red(partner) -> Red({t}) + Ox(partner)"
    return f"Screening {who} as reductant:\n  Ox(partner) + Red({t}) -> Red(partner) + Ox({t})"


def count_line(result) -> str:
    """How many rows are shown, removed by the filters, and left out as not computable (with reasons)."""
    text = (
        f"{len(result)} of {result.candidates} candidate partners shown; {result.filtered_out} removed by the "
        "filters (--min-k, --max-dG0, --top)."
    )
    if result.not_computable:
        why = ", ".join(f"{reason} ({n})" for reason, n in result.not_computable_reasons)
        text += f" {result.not_computable} left out as not computable: {why}."
    else:
        text += " None left out as not computable."
    if result.rate_model != "classical":
        from ..services.rate_model import model_line

        text += f" {model_line(result.semiclassical)[0].upper()}{model_line(result.semiclassical)[1:]}."
    if result.E_not_carried:
        text += (f" E was not carried for {', '.join(result.E_not_carried)}: measured in another medium, used as "
                 "given (--allow-E-other-medium).")
    return text


def units_line(sym) -> str:
    """What the columns hold, with units."""
    return (f"k_obs in M^-1 s^-1, log10 k = log10 k_obs; {sym['dG0']} in kJ/mol; (D) diffusion-controlled "
            "(k_act > 10 k_D). The 95 % interval is log10 k_obs +- 1.96 SD from first-order propagation of E_sd "
            "and k_self_log10_sd (defaults 10 mV and 0.3 where a couple gives none).")


def table_rows(result, sym) -> tuple[list[str], list[list[str]]]:
    """(header, rows) of the table form."""
    header = ["#", "partner", "k_obs", "log10 k", "95 % (linear)", sym["dG0"], "regime"]
    t = result.table
    kinds = _kinds(result)
    rows = []
    for i, partner in enumerate(result.partner):
        lo, hi = result.log10_k_obs_95_linear[i]
        regime = t.regime[i] + (" (D)" if t.diffusion_controlled[i] else "")
        rows.append([
            str(i + 1), marked_id(partner, kinds[i]), pow10(t.log10_k_obs[i]), fmt_fixed(t.log10_k_obs[i], 2),
            f"{fmt_fixed(lo, 2)} to {fmt_fixed(hi, 2)}", fmt_fixed(t.dG0_kJ_per_mol[i], 2), regime,
        ])
    return header, rows


def _kinds(result) -> tuple[str, ...]:
    return result.partner_provenance or ("",) * len(result.partner)


def legend(result) -> list[str]:
    """The '!' invented and '?' unverified legend lines of the partners shown (target included)."""
    return legend_lines(list(_kinds(result)), "partners")


def plain_screen(result, sym) -> str:
    header, rows = table_rows(result, sym)
    right = {0, 2, 3, 4, 5}
    widths = [max([len(header[k])] + [len(r[k]) for r in rows]) for k in range(len(header))]

    def line(cells):
        parts = [c.rjust(w) if k in right else c.ljust(w) for k, (c, w) in enumerate(zip(cells, widths, strict=True))]
        return "  ".join(parts).rstrip()

    out = [heading(result), ""]
    if rows:
        out.append(line(header))
        out.extend(line(r) for r in rows)
    else:
        out.append("(no partner passes the filters)")
    out.append("")
    for text in legend(result):
        out.extend(wrap_line(text))
    out.extend(wrap_line(count_line(result)))
    out.extend(wrap_line(units_line(sym)))
    out.extend(wrap_line(CLOSING_CAUTION))
    return "\n".join(out) + "\n"


def _rich_screen(result, stream) -> None:
    from rich import box
    from rich.table import Table
    from rich.text import Text

    from .terminal_output import console_for

    sym = symbols(stream)
    console = console_for(stream, highlight=False)
    header, rows = table_rows(result, sym)
    console.print(Text(heading(result), style="bold"))
    table = Table(box=box.SIMPLE_HEAD, pad_edge=False, collapse_padding=True, padding=(0, 1))
    for k, name in enumerate(header):
        table.add_column(name, justify="right" if k in (0, 2, 3, 4, 5) else "left", no_wrap=True)
    for r in rows:
        table.add_row(*r)
    console.print(table)
    for text in legend(result):
        console.print(Text(text, style="dim"))
    console.print(count_line(result))
    console.print(Text(units_line(sym), style="dim"))
    console.print(Text(CLOSING_CAUTION, style="italic"))


def print_screen(result, stream=None) -> None:
    stream = stream or sys.stdout
    if use_rich(stream):
        _rich_screen(result, stream)
    else:
        stream.write(plain_screen(result, symbols(stream)))


def _num(value, digits):
    return "" if value is None or value != value else f"{value:.{digits}f}"


def screen_csv(result) -> str:
    """CSV with one row per kept pair (CSV_COLUMNS); empty cells where a value does not exist."""
    buf = io.StringIO()
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(CSV_COLUMNS)
    t = result.table
    kinds = _kinds(result)
    for i, partner in enumerate(result.partner):
        lo, hi = result.log10_k_obs_95_linear[i]
        writer.writerow(safe_row([
            i + 1, partner, kinds[i], t.oxidant[i], t.reductant[i], _num(t.log10_k_obs[i], 5), _num(lo, 5), _num(hi, 5),
            _num(t.log10_k_obs_sd_linear[i], 5), _num(t.dG0_kJ_per_mol[i], 4),
            _num(t.dG0_prime_kJ_per_mol[i], 4), _num(t.lambda_kJ_per_mol[i], 4), _num(t.log10_k_act[i], 5),
            _num(t.log10_k_diff[i], 5), t.regime[i], "true" if t.diffusion_controlled[i] else "false",
        ]))
    return buf.getvalue()


def screen_json(result) -> dict:
    """JSON-safe dict: target, role, counts and one record per kept pair."""
    return {
        "target": result.target,
        "target_provenance": result.target_provenance,
        "role": result.role,
        "candidates": result.candidates,
        "not_computable": result.not_computable,
        "not_computable_reasons": {reason: n for reason, n in result.not_computable_reasons},
        "filtered_out": result.filtered_out,
        "E_not_carried": list(result.E_not_carried),
        "rate_model": result.rate_model,
        "semiclassical": result.semiclassical,
        "results": result.records(),
    }
