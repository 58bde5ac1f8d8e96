"""Random numeric inputs across and just beyond the documented ranges, through the vectorized predictions and
the command line's JSON.

Couples are drawn field by field: mostly inside each field's documented range (schema.FIELD_SPECS), a few
times in a hundred just beyond it; a couple with a value beyond a range must be refused when it is made, every
other one accepted. Conditions likewise (temperature, ionic strength, Z). For every pair the model can
compute: no NaN or infinity in any column, and k_obs never above min(k_act, k_D). Shared by
tests/faults/test_faults_numeric.py and tests/benchmarks/bench_faults_numeric.py. All values are invented.
"""

import json
import math
from dataclasses import dataclass, field

import numpy as np

DRAWN = ("E", "E_sd", "k_self", "k_self_log10_sd", "radius", "ionic_strength", "temperature", "lambda_in",
         "dH_self", "kappa_el")


@dataclass
class NumericStats:
    couples_tried: int = 0
    couples_refused: int = 0
    conditions_tried: int = 0
    conditions_refused: int = 0
    pairs: int = 0
    pairs_computed: int = 0
    pairs_not_computable: int = 0
    json_values: int = 0
    cli_pairs: int = 0
    failures: list[str] = field(default_factory=list)


def _draw(rng: np.random.Generator, low: float, high: float, log: bool, p_beyond: float = 0.03) -> tuple[float, bool]:
    """(value, beyond): inside [low, high], or with probability p_beyond just beyond one end."""
    if rng.random() >= p_beyond:
        if log:
            return float(10 ** rng.uniform(math.log10(max(low, 1e-3)), math.log10(high))), False
        return float(rng.uniform(low, high)), False
    span = high - low
    if rng.random() < 0.5:
        return float(low - span * 10 ** rng.uniform(-9, -1)), True
    return float(high + span * 10 ** rng.uniform(-9, -1)), True


def random_couples(rng: np.random.Generator, n: int, stats: NumericStats):
    """Up to n valid Couples (refused ones counted and checked: refused exactly when a value is beyond)."""
    from crossrate import Couple
    from crossrate.core.solvents import solvent_table
    from crossrate.errors import LibraryError
    from crossrate.library.schema import FIELDS_BY_NAME

    media = sorted(solvent_table())
    out = []
    for i in range(n):
        values = {}
        beyond = []
        for name in DRAWN:
            spec = FIELDS_BY_NAME[name]
            if not spec.required and rng.random() < (0.1 if name == "k_self" else 0.3):
                continue
            v, b = _draw(rng, spec.low, spec.high, log=name == "k_self")
            if spec.low_open and v == spec.low:
                v = float(np.nextafter(spec.low, math.inf))
            values[name] = v
            if b:
                beyond.append(name)
        z_red = int(rng.integers(-4, 4))
        stats.couples_tried += 1
        try:
            c = Couple(id=f"r{i}", name=f"random {i}", charge_ox=z_red + 1, charge_red=z_red, E_scale="SHE",
                       medium=media[int(rng.integers(len(media)))], source="random (invented)", **values)
        except LibraryError as exc:
            stats.couples_refused += 1
            if not beyond:
                stats.failures.append(f"couple refused with every value in range: {exc}")
            continue
        if beyond:
            stats.failures.append(f"couple accepted with {beyond} beyond the range: {values}")
            continue
        out.append(c)
    return out


def random_conditions(rng: np.random.Generator, stats: NumericStats):
    """Valid Conditions (refusals counted and checked like the couples')."""
    from crossrate import Conditions
    from crossrate.errors import ConditionsError
    from crossrate.services.conditions import IONIC_STRENGTH_MAX_M, TEMPERATURE_RANGE_K, Z_RANGE

    while True:
        T, bT = _draw(rng, *TEMPERATURE_RANGE_K, log=False)
        I, bI = _draw(rng, 0.0, IONIC_STRENGTH_MAX_M, log=False)
        Z, bZ = _draw(rng, *Z_RANGE, log=True)
        stats.conditions_tried += 1
        try:
            # couples of every medium are mixed on purpose (each pair is then computed in the oxidant's medium)
            cond = Conditions(temperature_K=T, ionic_strength_M=I if rng.random() < 0.9 else None, Z=Z,
                              diffusion=bool(rng.random() < 0.8), allow_mixed_media=True, allow_E_other_medium=True)
        except ConditionsError:
            stats.conditions_refused += 1
            if not (bT or bI or bZ):
                stats.failures.append(f"conditions refused in range: T={T} I={I} Z={Z}")
            continue
        if bT or bZ or (bI and cond.ionic_strength_M is not None):
            stats.failures.append(f"conditions accepted beyond range: T={T} I={I} Z={Z}")
            continue
        return cond


def check_table(table, cond, stats: NumericStats, tol: float = 1e-9) -> None:
    """No NaN/inf for a computable pair; k_obs <= min(k_act, k_D) (log10, with rounding slack)."""
    cols = {n: np.asarray(getattr(table, n), dtype=float) for n in
            ("dG0_kJ_per_mol", "dG0_prime_kJ_per_mol", "lambda_kJ_per_mol", "log10_k_act", "log10_k_diff",
             "log10_k_obs", "log10_k_obs_sd_linear")}
    ok = np.asarray(table.problem) == ""
    stats.pairs += len(ok)
    stats.pairs_computed += int(ok.sum())
    stats.pairs_not_computable += int((~ok).sum())
    for name, v in cols.items():
        if name == "log10_k_diff" and not cond.diffusion:
            continue
        bad = ok & ~np.isfinite(v)
        if bad.any():
            i = int(np.flatnonzero(bad)[0])
            stats.failures.append(f"{name} not finite for {table.oxidant[i]} + {table.reductant[i]}: {v[i]}")
    cap = cols["log10_k_act"] if not cond.diffusion else np.minimum(cols["log10_k_act"], cols["log10_k_diff"])
    over = ok & (cols["log10_k_obs"] > cap + tol)
    if over.any():
        i = int(np.flatnonzero(over)[0])
        stats.failures.append(f"k_obs above min(k_act, k_D) for {table.oxidant[i]} + {table.reductant[i]}: "
                              f"{cols['log10_k_obs'][i]} > {cap[i]}")


def vectorized_round(rng: np.random.Generator, n_couples: int, n_pairs: int, stats: NumericStats) -> None:
    """One random couple set and n_pairs random pairs through predict_many."""
    from crossrate import predict_many
    from crossrate.library.couple_set import CoupleSet

    couples = random_couples(rng, n_couples, stats)
    if len(couples) < 2:
        return
    cs = CoupleSet(couples)
    cond = random_conditions(rng, stats)
    ox = rng.integers(0, len(couples), n_pairs)
    red = rng.integers(0, len(couples), n_pairs)
    table = predict_many(cs, ox, red, cond)
    check_table(table, cond, stats)


def _strict_json(text: str):
    def refuse(token):
        raise ValueError(f"non-strict JSON token {token}")

    return json.loads(text, parse_constant=refuse)


def cli_json_round(rng: np.random.Generator, folder, n_couples: int, stats: NumericStats) -> None:
    """A random library file through `crossrate map --format json` (n_couples^2 pairs) and `predict --format
    json` for one pair: strict JSON, finite numbers (null for a pair that cannot be computed)."""
    import io
    from contextlib import redirect_stderr, redirect_stdout

    from crossrate.cli.main import main
    from crossrate.library.couple_export import export_toml
    from crossrate.library.couple_set import CoupleSet

    couples = random_couples(rng, n_couples, stats)
    if len(couples) < 2:
        return
    path = folder / "random.toml"
    path.write_text(export_toml(couples, CoupleSet(couples).scales), encoding="utf-8")
    cond = random_conditions(rng, stats)
    opts = ["--temperature", repr(cond.temperature_K), "--Z", repr(cond.Z), "--allow-mixed-media",
            "--allow-E-other-medium", "--medium", "water"]
    if cond.ionic_strength_M is not None:
        opts += ["--ionic-strength", repr(cond.ionic_strength_M)]
    for argv in (["map", "--format", "json", *opts],
                 ["predict", couples[0].id, couples[1].id, "--format", "json", *opts]):
        out, err = io.StringIO(), io.StringIO()
        with redirect_stdout(out), redirect_stderr(err):
            rc = main([*argv, "--no-bundled", "--library", str(path)])
        if rc == 2:  # a refused pair (e.g. no barrier left): one message, no JSON
            if "Traceback" in err.getvalue() or not err.getvalue().startswith("crossrate: "):
                stats.failures.append(f"{argv[0]}: exit 2 without the one-line message: {err.getvalue()[:200]}")
            continue
        if rc != 0:
            stats.failures.append(f"{argv[0]}: exit {rc}: {err.getvalue()[:200]}")
            continue
        try:
            doc = _strict_json(out.getvalue())
        except ValueError as exc:
            stats.failures.append(f"{argv[0]}: not strict JSON ({exc})")
            continue
        _walk(doc, argv[0], stats)
        stats.cli_pairs += len(doc["ids"]) ** 2 if argv[0] == "map" else 1


def _walk(node, where: str, stats: NumericStats) -> None:
    if isinstance(node, dict):
        for v in node.values():
            _walk(v, where, stats)
    elif isinstance(node, list):
        for v in node:
            _walk(v, where, stats)
    elif isinstance(node, float | int) and not isinstance(node, bool):
        stats.json_values += 1
        if not math.isfinite(node):
            stats.failures.append(f"{where}: non-finite number in JSON")
