"""`crossrate solve k-self|potential UNKNOWN`: the self-exchange rate or the potential of an unknown couple
from its measured cross rate with a known partner (or several, --from-csv)."""

import json

from . import common_options as co
from .help_format import CAUTION

KSELF_HELP = """\
The apparent self-exchange rate constant of UNKNOWN (its E, charges and radius from the library; its own
k_self, if any, is ignored and shown beside) from a measured cross rate with a known partner, solving the
full Marcus cross relation (f12 and work terms) after removing the diffusion limit. A measured rate at the
diffusion limit only bounds k_self; one above it is refused.
"""

POTENTIAL_HELP = """\
The potential E of UNKNOWN (on its own scale) that reproduces a measured cross rate with a known partner,
using UNKNOWN's k_self. ln k12 is quadratic in the driving force, so there are two roots: the normal-side
root first, then the inverted-side one, with which of them the data can support.
"""

CSV_HELP = ("CSV of several partners: partner, k_measured (M^-1 s^-1); optional k_measured_log10_sd, role "
            "(the unknown's: oxidant|reductant|auto), temperature (K), ionic_strength (mol/L), medium")


def register(subparsers) -> None:
    p = subparsers.add_parser(
        "solve", help="solve for an unknown k_self or potential from a measured rate",
        description="Back out the self-exchange rate (k-self) or the potential (potential) of an unknown couple "
                    "from its measured cross rate with a known partner, through the full Marcus cross relation.",
        epilog=CAUTION,
    )
    sub = p.add_subparsers(dest="solve_for", metavar="WHAT", required=True)
    for name, helptext, desc in (
        ("k-self", "apparent self-exchange rate of an unknown couple", KSELF_HELP),
        ("potential", "potential of an unknown couple (two roots)", POTENTIAL_HELP),
    ):
        q = sub.add_parser(name, help=helptext, description=desc, epilog=CAUTION)
        q.add_argument("unknown", metavar="UNKNOWN", help="id of the couple solved for")
        q.add_argument("--partner", metavar="ID", help="id of the known partner couple")
        q.add_argument("--k-measured", type=co.positive_float, metavar="K",
                       help="measured cross rate constant, M^-1 s^-1")
        q.add_argument("--k-measured-log10-sd", type=co.positive_float, default=None, metavar="S",
                       help="SD of the measured rate in log10 units (default 0.1)")
        q.add_argument("--role", choices=("auto", "oxidant", "reductant"), default="auto",
                       help="the unknown's role in the measured reaction (default auto: downhill with the "
                            "library potentials)")
        q.add_argument("--from-csv", metavar="FILE", default=None, help=CSV_HELP)
        co.add_library_option(q)
        co.add_condition_options(q)
        co.add_format_option(q)
        q.set_defaults(func=run)


def run(args) -> int:
    from ..errors import ConditionsError

    kind = "k_self" if args.solve_for == "k-self" else "potential"
    if args.from_csv:
        if args.partner or args.k_measured:
            raise ConditionsError("give either --from-csv FILE or --partner ID --k-measured K, not both")
        from ..services.measured_csv import read_partner_csv
        from ..services.solving_several import solve_several

        rows = read_partner_csv(args.from_csv)
        cs = co.load_set(args)
        result = solve_several(cs, args.unknown, rows, kind, co.conditions_from_args(args), args.role)
        _emit(args, result, lambda r: _several_lines(r, cs))
        return 0
    if not args.partner or args.k_measured is None:
        raise ConditionsError("give the partner and the measured rate: --partner ID --k-measured K (or --from-csv FILE)")
    from ..services import solving

    cs = co.load_set(args)
    solver = solving.solve_k_self if kind == "k_self" else solving.solve_potential
    result = solver(cs, args.unknown, args.partner, args.k_measured, args.k_measured_log10_sd, args.role,
                    co.conditions_from_args(args))
    _emit(args, result, _k_self_lines if kind == "k_self" else _potential_lines)
    return 0


def _emit(args, result, lines) -> None:
    if args.format == "json":
        print(json.dumps(result.to_dict(), indent=2, allow_nan=False))
        return
    from .render_common import print_lines

    print_lines(lines(result), closing=CAUTION)


def _cond(c) -> str:
    return (f"{c.temperature_K:g} K, I = {c.ionic_strength_M:g} M, {c.medium}, Z = {c.Z:g} M^-1 s^-1, "
            f"diffusion cap {'on' if c.diffusion else 'off'}")


def _kd_sd(r) -> str:
    return f" (SD {r.log10_k_diff_sd:g} in log10)" if r.log10_k_diff_sd else ""


def _k_self_lines(r) -> list[str]:
    out = [f"{r.unknown} with {r.partner} ({r.role_reason})", f"conditions: {_cond(r.conditions)}",
           f"k measured = {r.k_measured:.4g} M^-1 s^-1 (SD {r.k_measured_log10_sd:g} in log10"
           f"{', default' if r.measured_sd_defaulted else ''}); k_D = 10^{r.log10_k_diff:.2f}{_kd_sd(r)}; "
           f"Delta G deg = {r.dG0_kJ_per_mol:.1f} kJ/mol"]
    if r.log10_k_self is None:
        out.append(f"k_self: not determinable (diffusion-limited); k_self >= 10^{r.log10_k_self_lower_bound:.2f} "
                   "M^-1 s^-1")
    else:
        lo, hi = r.log10_k_self_95
        out.append(f"k_self = {r.k_self:.3g} M^-1 s^-1 (log10 {r.log10_k_self:.3f}, 95 % [{lo:.2f}, {hi:.2f}]); "
                   f"lambda = {r.lambda_unknown_kJ_per_mol:.1f} kJ/mol")
    if r.log10_k_self_second_root is not None:
        where = ("the forward reaction's inverted region" if r.second_root_region == "inverted"
                 else "the reverse reaction's inverted region (the forward one is uphill)")
        out.append(f"second root: log10 k_self {r.log10_k_self_second_root:.3f}, in {where}")
    if r.library_log10_k_self is not None:
        out.append(f"library: log10 k_self {r.library_log10_k_self:.2f} as listed"
                   + (f", {r.library_log10_k_self_at_conditions:.2f} at these conditions"
                      if r.library_log10_k_self_at_conditions is not None else ""))
    out.append(r.explanation)
    out.extend(f"warning: {w}" for w in r.warnings)
    return out


def _potential_lines(r) -> list[str]:
    out = [f"{r.unknown} with {r.partner} ({r.role_reason})", f"conditions: {_cond(r.conditions)}",
           f"k measured = {r.k_measured:.4g} M^-1 s^-1; k_D = 10^{r.log10_k_diff:.2f}{_kd_sd(r)}; highest possible 10^{r.log10_k_max:.2f} at "
           f"E = {r.E_at_maximum_V:.3f} V; lambda12 = {r.lambda_kJ_per_mol:.1f} kJ/mol"]
    for E, (lo, hi), side, ok in zip(r.E_V, r.E_V_95, r.E_regime, r.supported, strict=True):
        out.append(f"E = {E:.4f} V vs {r.E_scale} ({side} side; 95 % [{lo:.3f}, {hi:.3f}]): "
                   f"{'supported by the data' if ok else 'not supported by the data alone'}")
    out.append(r.explanation)
    out.extend(f"warning: {w}" for w in r.warnings)
    return out


def _several_lines(r, cs=None) -> list[str]:
    """The estimate, then one line per partner, its id marked '!' invented or '?' unverified (from cs)."""
    from ..library.provenance import legend_lines, marked_id

    kinds = [cs[p.partner].provenance if cs is not None and p.partner in cs else "" for p in r.partners]
    out = [r.explanation]
    for p, kind in zip(r.partners, kinds, strict=True):
        val = "diffusion-limited" if p.value is None else f"{p.value:.3f} +- {p.sd:.3f}"
        z = "" if p.z is None else f", z = {p.z:+.1f}"
        flag = "" if p.agrees else "  DISAGREES"
        out.append(f"  line {p.line}: {marked_id(p.partner, kind)} ({p.role}): {val}{z}{flag}")
    return out + legend_lines([k for k in kinds if k], "partners")
