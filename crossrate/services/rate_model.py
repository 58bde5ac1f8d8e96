"""The rate model of a cross-rate prediction: classical (the Marcus cross relation, the default) or
semiclassical (the same, bent by a quantized high-frequency mode).

Semiclassical: the pair's lambda12 is split into an inner, high-frequency part lambda_v12 and an outer,
classical part lambda_s12 = lambda12 - lambda_v12 (crossrate.core.semiclassical.pair_inner_lambda, from each
couple's lambda_in or bonds; DEFAULT_INNER_FRACTION of its lambda where it gives neither), with one mode of
energy hbar omega. The pair's hbar omega is the mean of the two couples' modes weighted by their inner parts
(crossrate.core.semiclassical.pair_hbar_omega); a couple's mode is its own `hbar_omega` field where it gives
one, else the --hbar-omega option, else DEFAULT_HBAR_OMEGA_CM1; an --hbar-omega given explicitly
(Conditions.hbar_omega_cm1) overrides the couples' own values. The activation-controlled cross rate is the
classical one times the quantum factor Q(Delta G deg') of crossrate.core.semiclassical.ln_quantum_factor:
the Marcus–Levich–Jortner rate over the classical rate at the same lambda, normalized to Q = 1 at
Delta G deg' = 0. Why: the cross relation is built on the measured self-exchange rates, which are rates at
Delta G deg' = 0; a factor that is 1 there keeps the prediction anchored on them (a self-exchange
"predicted" with itself still returns its measured rate) and changes only how the rate follows the driving
force, above all in the inverted region, where the quantized mode makes it fall far more gently.
"""

from dataclasses import dataclass

import numpy as np

from ..core.cross_rate import CrossRateArrays
from ..core.diffusion import ln_k_observed
from ..core.regime import diffusion_controlled
from ..errors import ConditionsError
from .couple_lambda import LAMBDA_IN_BONDS, LAMBDA_IN_FIELD, lambda_columns

RATE_MODELS = ("classical", "semiclassical")
#: Energy of the quantized mode when neither the option nor the couples give one: 1500 cm^-1, a C=C/C=O
#: skeletal stretch (common practice for organic couples; metal-ligand stretches lie nearer 300-500 cm^-1,
#: from memory, and are then nearly classical at room temperature).
DEFAULT_HBAR_OMEGA_CM1 = 1500.0
HBAR_OMEGA_RANGE_CM1 = (100.0, 5000.0)
#: Inner (high-frequency) share of a couple's lambda when it gives no lambda_in or bonds (a documented
#: assumption, not a measurement; said in the warnings).
DEFAULT_INNER_FRACTION = 0.25
#: J/mol per cm^-1: h c (100 cm/m) N_A (exact SI values).
J_PER_MOL_PER_CM1 = 6.62607015e-34 * 299792458.0 * 100.0 * 6.02214076e23
#: Up to this many pairs ln Q is summed exactly for each; beyond (Monte Carlo draws) it is interpolated.
_EXACT_UP_TO = 2000
_SOURCES = {LAMBDA_IN_FIELD: "lambda_in", LAMBDA_IN_BONDS: "bonds"}


def check_rate_model(model: str, hbar_omega_cm1: float | None) -> None:
    """ConditionsError for an unknown model name or an hbar omega outside 100-5000 cm^-1."""
    if model not in RATE_MODELS:
        raise ConditionsError(f"rate model {model!r}: expected {' or '.join(RATE_MODELS)}")
    if hbar_omega_cm1 is not None:
        lo, hi = HBAR_OMEGA_RANGE_CM1
        w = hbar_omega_cm1
        if isinstance(w, bool) or not isinstance(w, int | float) or not (np.isfinite(w) and lo <= w <= hi):
            raise ConditionsError(f"hbar omega {w!r} cm^-1: expected {lo:g} to {hi:g} cm^-1")


@dataclass(frozen=True)
class QuantumModel:
    """Inner parts of the two couples' lambdas (J/mol, NaN = not given), where they came from ('lambda_in',
    'bonds' or 'default'), each couple's mode (cm^-1) and where it came from ('couple': its hbar_omega field;
    'option': --hbar-omega; 'default')."""

    lambda_in11_J: float
    lambda_in22_J: float
    sources: tuple[str, str]
    hbar_omega1_cm1: float
    hbar_omega2_cm1: float
    hbar_sources: tuple[str, str] = ("default", "default")
    #: The couples' own hbar_omega fields, cm^-1 (NaN where none; overridden when the option is given).
    own_cm1: tuple[float, float] = (float("nan"), float("nan"))

    def inner_lambda(self, res: CrossRateArrays):
        """(lambda_v12, clipped) for the pairs of res (J/mol)."""
        from ..core.semiclassical import pair_inner_lambda

        return pair_inner_lambda(res.lambda11, res.lambda22, self.lambda_in11_J, self.lambda_in22_J,
                                 DEFAULT_INNER_FRACTION)

    def pair_hbar_omega_J(self, lam11, lam22):
        """The pair's mode energy, J/mol, at self-exchange lambdas lam11, lam22 (J/mol): the couples' modes
        weighted by their inner parts (crossrate.core.semiclassical.pair_hbar_omega)."""
        from ..core.semiclassical import couple_inner_lambda, pair_hbar_omega

        v11 = couple_inner_lambda(lam11, self.lambda_in11_J, DEFAULT_INNER_FRACTION)
        v22 = couple_inner_lambda(lam22, self.lambda_in22_J, DEFAULT_INNER_FRACTION)
        return pair_hbar_omega(v11, v22, self.hbar_omega1_cm1 * J_PER_MOL_PER_CM1,
                               self.hbar_omega2_cm1 * J_PER_MOL_PER_CM1)

    def _exact(self, dG0p, lam11, lam22, T_K):
        from ..core.semiclassical import ln_quantum_factor, pair_inner_lambda

        lv12, _ = pair_inner_lambda(lam11, lam22, self.lambda_in11_J, self.lambda_in22_J, DEFAULT_INNER_FRACTION)
        lam = 0.5 * (np.asarray(lam11, dtype=float) + np.asarray(lam22, dtype=float))
        ok = np.isfinite(lam) & (lam > 0) & np.isfinite(dG0p)
        safe_lam = np.where(ok, lam, 1.0)
        safe_lv = np.where(ok, lv12, 0.0)
        hw = self.pair_hbar_omega_J(np.where(ok, lam11, 1.0), np.where(ok, lam22, 1.0))
        q = ln_quantum_factor(np.where(ok, dG0p, 0.0), safe_lam - safe_lv, safe_lv, hw, T_K)
        return np.where(ok, q, 0.0)

    def ln_factor(self, res: CrossRateArrays, T_K: float):
        """ln Q at each pair of res (0 where lambda12 is not a usable positive number). For many pairs
        (Monte Carlo draws around one prediction) ln Q is computed exactly on a 9 x 9 x 9 grid spanning the
        draws in (dG0', lambda11, lambda22) and interpolated linearly (error < 0.01 in ln Q for the usual
        spreads: the grid step is about one SD of the inputs)."""
        x = np.asarray(res.dG0_prime, dtype=float)
        l11 = np.broadcast_to(np.asarray(res.lambda11, dtype=float), x.shape)
        l22 = np.broadcast_to(np.asarray(res.lambda22, dtype=float), x.shape)
        if x.size <= _EXACT_UP_TO or not (np.all(np.isfinite(l11)) and np.all(np.isfinite(l22))
                                          and np.all(np.isfinite(x))):
            return self._exact(x, l11, l22, T_K)
        axes = [np.linspace(v.min(), v.max(), 9) if v.max() > v.min() else np.array([v.min(), v.min() + 1.0])
                for v in (x, l11, l22)]
        G = np.meshgrid(*axes, indexing="ij")
        return _trilinear(self._exact(G[0], G[1], G[2], T_K), axes, (x, l11, l22))

    def apply(self, res: CrossRateArrays, T_K: float, diffusion: bool) -> CrossRateArrays:
        """res with k_act multiplied by Q and k_obs, the diffusion flag recomputed."""
        ln_act = np.asarray(res.ln_k_act, dtype=float) + self.ln_factor(res, T_K)
        ln_obs = ln_k_observed(ln_act, res.ln_k_diff) if diffusion else ln_act
        return res._replace(ln_k_act=ln_act, ln_k_obs=ln_obs,
                            diffusion_controlled=diffusion_controlled(ln_act, res.ln_k_diff) & bool(diffusion))


def _trilinear(table, axes, points):
    """Linear interpolation in a table on a regular 3-D grid (axes: evenly spaced node arrays) at points
    (three arrays of equal shape, inside the grid)."""
    idx, frac = [], []
    for ax, v in zip(axes, points, strict=True):
        t = np.clip((v - ax[0]) / (ax[1] - ax[0]), 0.0, ax.size - 1.0)
        i = np.minimum(t.astype(np.int64), ax.size - 2)
        idx.append(i)
        frac.append(t - i)
    out = np.zeros(np.shape(points[0]))
    for corner in range(8):
        d = [(corner >> k) & 1 for k in range(3)]
        w = np.ones_like(out)
        for k in range(3):
            w = w * (frac[k] if d[k] else 1.0 - frac[k])
        out += w * table[idx[0] + d[0], idx[1] + d[1], idx[2] + d[2]]
    return out


def couple_modes(couple_set, members, hbar_omega_cm1: float | None):
    """(mode of each couple at positions `members` in cm^-1, where it came from: 'couple', 'option' or
    'default'): the couple's own hbar_omega field unless the option hbar_omega_cm1 is given, which overrides
    them all; the option, else DEFAULT_HBAR_OMEGA_CM1, where a couple gives none."""
    own = lambda_columns(couple_set).hbar_omega_cm1[np.asarray(members, dtype=np.intp)]
    if hbar_omega_cm1 is not None:
        return np.full(own.shape, float(hbar_omega_cm1)), ("option",) * own.size
    has = np.isfinite(own)
    return (np.where(has, own, DEFAULT_HBAR_OMEGA_CM1),
            tuple("couple" if h else "default" for h in has.tolist()))


def quantum_model(couple_set, indices, hbar_omega_cm1: float | None) -> QuantumModel:
    """The QuantumModel of the pair of couples at positions indices (oxidant, reductant) of couple_set;
    hbar_omega_cm1: the --hbar-omega option (None: each couple's own mode, else the default)."""
    cols = lambda_columns(couple_set)
    i, j = (int(k) for k in indices)
    hw, from_ = couple_modes(couple_set, [i, j], hbar_omega_cm1)
    return QuantumModel(
        lambda_in11_J=float(cols.lambda_in_J[i]), lambda_in22_J=float(cols.lambda_in_J[j]),
        sources=(_SOURCES.get(int(cols.lambda_in_from[i]), "default"),
                 _SOURCES.get(int(cols.lambda_in_from[j]), "default")),
        hbar_omega1_cm1=float(hw[0]), hbar_omega2_cm1=float(hw[1]), hbar_sources=from_,
        own_cm1=(float(cols.hbar_omega_cm1[i]), float(cols.hbar_omega_cm1[j])),
    )


def semiclassical_summary(q: QuantumModel, res: CrossRateArrays, T_K: float, ids, hbar_given: bool):
    """(dict for the Prediction record, warnings) of a semiclassical prediction at its central values."""
    lv12, clipped = q.inner_lambda(res)
    lam = float(np.asarray(res.lambda12))
    lnq = float(np.asarray(q.ln_factor(res, T_K)))
    hw = float(np.asarray(q.pair_hbar_omega_J(res.lambda11, res.lambda22))) / J_PER_MOL_PER_CM1
    info = {
        "lambda_in12_kJ_per_mol": float(np.asarray(lv12)) / 1e3,
        "lambda_out12_kJ_per_mol": (lam - float(np.asarray(lv12))) / 1e3,
        "hbar_omega_cm1": hw,
        "hbar_omega_from": {ids[0]: q.hbar_sources[0], ids[1]: q.hbar_sources[1]},
        "log10_quantum_factor": lnq / np.log(10.0),
        "inner_from": {ids[0]: q.sources[0], ids[1]: q.sources[1]},
    }
    warnings = []
    for cid, src in zip(ids, q.sources, strict=True):
        if src == "default":
            warnings.append(f"semiclassical model: {cid} gives no lambda_in or bonds; its inner (high-frequency) "
                            f"part is taken as {DEFAULT_INNER_FRACTION:.0%} of its lambda (a default)")
    if bool(np.any(clipped)):
        warnings.append("semiclassical model: a couple's lambda_in exceeds 95 % of the lambda read from its "
                        "k_self; its inner part was held to 95 %")
    warnings.append(_mode_warning(q, ids, hw, hbar_given))
    return info, warnings


def _mode_warning(q: QuantumModel, ids, hw: float, hbar_given: bool) -> str:
    """The line saying which hbar omega the prediction used and where it came from."""
    if hbar_given:
        over = [f"{cid}'s own {w:g} cm^-1" for cid, w in zip(ids, q.own_cm1, strict=True) if np.isfinite(w)]
        return (f"semiclassical model: hbar omega {hw:g} cm^-1 (--hbar-omega"
                + (f", overriding {' and '.join(over)})" if over else ")"))
    parts = []
    for cid, w, src in zip(ids, (q.hbar_omega1_cm1, q.hbar_omega2_cm1), q.hbar_sources, strict=True):
        parts.append(f"{cid} {w:g} cm^-1 ({'its hbar_omega' if src == 'couple' else 'the default'})")
    if q.hbar_sources == ("default", "default"):
        return f"semiclassical model: hbar omega {hw:g} cm^-1 (the default; --hbar-omega to change)"
    return (f"semiclassical model: hbar omega {hw:.0f} cm^-1, the inner-lambda-weighted mean of "
            + " and ".join(parts))


def grid_model(couple_set, members, cond):
    """Keyword arguments of the core rate grid (crossrate.core.rate_grid) for the rate model of `cond` over the
    couples at positions `members`: {} for the classical model; for the semiclassical one the mode
    (level_sum.SemiclassicalMode: the option's or the default hbar omega, DEFAULT_INNER_FRACTION), each
    couple's inner lambda_in (J/mol, NaN where the couple gives neither lambda_in nor bonds) and each couple's
    own mode (hbar_omega_J, J/mol, NaN where none; None when the option overrides them or none has one). The
    same rules as quantum_model, per couple."""
    if cond.rate_model != "semiclassical":
        return {}
    from ..core.level_sum import SemiclassicalMode

    cols = lambda_columns(couple_set)
    idx = np.asarray(members, dtype=np.intp)
    hw = cond.hbar_omega_cm1 if cond.hbar_omega_cm1 is not None else DEFAULT_HBAR_OMEGA_CM1
    own = cols.hbar_omega_cm1[idx]
    return {"semiclassical": SemiclassicalMode(hw * J_PER_MOL_PER_CM1, DEFAULT_INNER_FRACTION),
            "lambda_in_J": cols.lambda_in_J[idx],
            "hbar_omega_J": own * J_PER_MOL_PER_CM1
            if cond.hbar_omega_cm1 is None and bool(np.any(np.isfinite(own))) else None}


def model_record(couple_set, members, cond) -> dict | None:
    """What a many-pair result (map, screen) says of its semiclassical model: hbar omega (cm^-1; the option's or
    the default, for the couples without a mode of their own) and whether it was the default, how many of the
    couples at positions `members` used their own hbar_omega, the default inner fraction and how many used it
    (no lambda_in or bonds). None for the classical model."""
    if cond.rate_model != "semiclassical":
        return None
    cols = lambda_columns(couple_set)
    idx = np.asarray(members, dtype=np.intp)
    own = 0 if cond.hbar_omega_cm1 is not None else int(np.isfinite(cols.hbar_omega_cm1[idx]).sum())
    return {
        "hbar_omega_cm1": float(cond.hbar_omega_cm1 if cond.hbar_omega_cm1 is not None else DEFAULT_HBAR_OMEGA_CM1),
        "hbar_omega_default": cond.hbar_omega_cm1 is None,
        "couples_with_own_hbar_omega": own,
        "inner_default_fraction": DEFAULT_INNER_FRACTION,
        "couples_with_default_inner": int((~np.isfinite(cols.lambda_in_J[idx])).sum()),
    }


def model_line(record: dict | None) -> str:
    """One sentence naming the model of a many-pair result (map, screen), from model_record."""
    if record is None:
        return "model: classical (Marcus cross relation)"
    hw = f"hbar omega {record['hbar_omega_cm1']:g} cm^-1" + (" (the default)" if record["hbar_omega_default"] else
                                                               " (--hbar-omega)")
    own = record["couples_with_own_hbar_omega"]
    if own:
        hw = (f"each couple's own hbar_omega for {own} couple{'' if own == 1 else 's'}, else {hw}; a pair takes "
              "the inner-lambda-weighted mean of its two")
    text = f"model: semiclassical (cross relation x quantum factor Q, Q = 1 at dG0' = 0; {hw}"
    n = record["couples_with_default_inner"]
    if n:
        text += (f"; inner part taken as {record['inner_default_fraction']:.0%} of lambda for {n} couple"
                 f"{'' if n == 1 else 's'} without lambda_in or bonds")
    return text + ")"


def apply_to_pairs(res: CrossRateArrays, couple_set, ox, red, cond, diffusion: bool) -> CrossRateArrays:
    """res (classical cross rates of the pairs ox[k], red[k], positions in couple_set, one temperature) with
    k_act times the quantum factor Q of the semiclassical model, k_obs and the diffusion flag recomputed;
    res unchanged for the classical model. The same Q as predict() (quantum_model), for all pairs at once
    (crossrate.core.level_sum, within LEVEL_SUM_TOLERANCE in ln Q)."""
    if cond.rate_model != "semiclassical":
        return res
    lam_in = lambda_columns(couple_set).lambda_in_J
    o, r = np.asarray(ox, dtype=np.intp), np.asarray(red, dtype=np.intp)
    hw1, _ = couple_modes(couple_set, o, cond.hbar_omega_cm1)
    hw2, _ = couple_modes(couple_set, r, cond.hbar_omega_cm1)
    return apply_inner(res, lam_in[o], lam_in[r], cond, diffusion, hw1, hw2)


def apply_inner(res: CrossRateArrays, lambda_in11_J, lambda_in22_J, cond, diffusion: bool, hbar_omega1_cm1=None,
                hbar_omega2_cm1=None) -> CrossRateArrays:
    """apply_to_pairs for pairs given by their couples' lambda_in (J/mol, NaN: the default fraction) and modes
    (cm^-1; None: the option's or the default)."""
    from ..core.level_sum import ln_q_pairs
    from ..core.semiclassical import couple_inner_lambda, pair_hbar_omega

    T = float(cond.temperature_K)
    v11 = couple_inner_lambda(res.lambda11, lambda_in11_J, DEFAULT_INNER_FRACTION)
    v22 = couple_inner_lambda(res.lambda22, lambda_in22_J, DEFAULT_INNER_FRACTION)
    lv12 = 0.5 * (v11 + v22)
    base = cond.hbar_omega_cm1 if cond.hbar_omega_cm1 is not None else DEFAULT_HBAR_OMEGA_CM1
    hw1 = base if hbar_omega1_cm1 is None else hbar_omega1_cm1
    hw2 = base if hbar_omega2_cm1 is None else hbar_omega2_cm1
    hw = pair_hbar_omega(v11, v22, hw1, hw2) * J_PER_MOL_PER_CM1
    x = np.asarray(res.dG0_prime, dtype=float)
    lam = np.broadcast_to(np.asarray(res.lambda12, dtype=float), x.shape)
    ln_q = ln_q_pairs(x, lam, np.broadcast_to(lv12, x.shape), np.broadcast_to(hw, x.shape), T)
    ln_act = np.asarray(res.ln_k_act, dtype=float) + np.where(np.isfinite(ln_q), ln_q, 0.0)
    ln_obs = ln_k_observed(ln_act, res.ln_k_diff) if diffusion else ln_act
    return res._replace(ln_k_act=ln_act, ln_k_obs=ln_obs,
                        diffusion_controlled=diffusion_controlled(ln_act, res.ln_k_diff) & bool(diffusion))
