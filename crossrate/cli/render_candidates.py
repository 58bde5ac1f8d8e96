"""Output of `crossrate screen TARGET --candidates TABLE.csv`: the fastest computed candidates as a table, JSON
or CSV (services.candidate_screening does the work)."""

import csv
import io
import json
import sys

from .help_format import CAUTION

DEFAULT_TOP = 20


def run_candidates(args, couple_set, conditions) -> int:
    from ..errors import CrossrateError, printable
    from ..library.candidate_table import read_candidate_table
    from ..services.candidate_screening import screen_candidates

    if args.tag or args.min_k is not None or args.max_dG0 is not None:
        raise CrossrateError("--candidates: --tag, --min-k and --max-dG0 filter library partners; expected "
                             "--top N to limit the candidates shown")
    table = read_candidate_table(args.candidates)
    top = args.top or DEFAULT_TOP
    res = screen_candidates(couple_set, args.target, args.role, table, args.candidate_scale, conditions, top)
    if args.format == "json":
        data = {"target": res.target, "role": res.role, "medium": res.medium, "temperature_K": res.temperature_K,
                "ionic_strength_M": res.ionic_strength_M, "candidate_scale": res.scale,
                "candidates": res.candidates, "not_computable": res.not_computable, "rate_model": res.rate_model,
                "semiclassical": res.semiclassical, "rows": res.records()}
        sys.stdout.write(json.dumps(data, indent=2, allow_nan=False) + "\n")
        return 0
    if args.format == "csv":
        buf = io.StringIO()
        w = csv.writer(buf, lineterminator="\n")
        w.writerow(["partner", "log10_k_obs", "dG0_kJ_per_mol", "diffusion_controlled"])
        for r in res.records():
            w.writerow([r["partner"], f"{r['log10_k_obs']:.4f}", f"{r['dG0_kJ_per_mol']:.3f}",
                        "true" if r["diffusion_controlled"] else "false"])
        sys.stdout.write(buf.getvalue())
        return 0
    pair = "Ox(target) + Red(candidate)" if res.role == "oxidant" else "Ox(candidate) + Red(target)"
    out = [f"{res.target} as {res.role}: {pair}; {res.medium}, {res.temperature_K:g} K, I = "
           f"{res.ionic_strength_M:g} M; candidates from {printable(table.path, keep_newlines=False)} "
           f"(E vs {res.scale})",
           f"{'candidate':<24} {'log10 k_obs':>11} {'dG0 kJ/mol':>11}  diffusion-controlled"]
    for r in res.records():
        out.append(f"{r['partner']:<24} {r['log10_k_obs']:>11.2f} {r['dG0_kJ_per_mol']:>11.1f}  "
                   f"{'yes' if r['diffusion_controlled'] else ''}")
    out.append(f"{len(res.partner)} fastest of {res.candidates} candidates shown"
               + (f"; {res.not_computable} not computable" if res.not_computable else "")
               + "; k_obs in M^-1 s^-1; candidates' values taken at these conditions")
    if res.rate_model != "classical":
        from ..services.rate_model import model_line

        out.append(model_line(res.semiclassical))
    out += ["", CAUTION]
    print("\n".join(out))
    return 0
