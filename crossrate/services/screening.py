"""Screening: every couple of the loaded set that can react with one target couple, ranked by k_obs.

The target takes the role of oxidant (Ox_target + Red_partner) or reductant (Ox_partner + Red_target); the
rates come from the vectorized predict_many (Marcus cross relation with work terms and the diffusion cap,
times the quantum factor under the semiclassical model), with the first-order (linear) uncertainty of
log10 k_obs.
"""

from collections import Counter
from dataclasses import dataclass

import numpy as np

from ..core.solvents import get_solvent
from ..errors import ConditionsError, ScienceError
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set
from .batch_prediction import predict_many
from .conditions import Conditions
from .prediction_table import PredictionTable
from .rate_model import model_record
from .results import _Record, json_safe
from .self_exchange import self_exchange_at

ROLES = ("oxidant", "reductant")
#: z value of the two-sided 95 % normal interval, used for the linear interval log10 k_obs +- Z95 sd.
Z95 = 1.959963984540054


@dataclass(frozen=True)
class ScreenResult(_Record):
    """Ranked partners of a target couple.

    target: id of the target couple; role: 'oxidant' or 'reductant' (the target's role).
    table: PredictionTable of the kept pairs, fastest first (oxidant/reductant columns as in predict_many).
    partner: the partner id of each kept row.
    log10_k_obs_95_linear: per row (low, high), log10 k_obs +- 1.96 SD of the linear propagation,
        log10(M^-1 s^-1).
    candidates: partners considered after the medium/tag filters; not_computable: pairs left out because
    they cannot be computed (different media or potential scales, no self-exchange data...);
    not_computable_reasons: (reason, count) pairs; filtered_out: computable pairs removed by --min-k,
    --max-dG0 or --top.
    """

    target: str
    role: str
    table: PredictionTable
    partner: tuple[str, ...]
    log10_k_obs_95_linear: tuple[tuple[float, float], ...]
    candidates: int
    not_computable: int
    not_computable_reasons: tuple[tuple[str, int], ...]
    filtered_out: int
    #: "invented", "unverified" or "verified" for the target and for each kept partner.
    target_provenance: str = ""
    partner_provenance: tuple[str, ...] = ()
    #: Couples of the shown rows whose potential, measured in another medium, was used as given (not carried).
    E_not_carried: tuple[str, ...] = ()
    #: 'classical' or 'semiclassical'; for the latter, semiclassical holds services.rate_model.model_record.
    rate_model: str = "classical"
    semiclassical: dict | None = None

    def __len__(self) -> int:
        return len(self.partner)

    def records(self) -> list[dict]:
        """One JSON-safe dict per kept row (table columns plus partner and the linear 95 % interval)."""
        out = []
        kinds = self.partner_provenance or ("",) * len(self.partner)
        for rec, partner, kind, (lo, hi) in zip(
            self.table.records(), self.partner, kinds, self.log10_k_obs_95_linear, strict=True
        ):
            rec = {"partner": partner, "partner_provenance": kind, **rec,
                   "log10_k_obs_95_linear": json_safe([lo, hi])}
            out.append(rec)
        return out


def _take(table: PredictionTable, order: np.ndarray) -> PredictionTable:
    """The rows `order` of a PredictionTable, as a new (immutable) table."""
    rows = order.tolist()
    cols = {}
    for name in table.__dataclass_fields__:
        col = getattr(table, name)
        cols[name] = tuple(map(col.__getitem__, rows))
    return PredictionTable(**cols)


def _candidate_mask(cs: CoupleSet, target_index: int, medium: str | None, tag: str | None) -> np.ndarray:
    a = cs.arrays
    mask = np.ones(len(cs), dtype=bool)
    mask[target_index] = False
    if medium is not None:
        mask &= a.medium == medium
    if tag is not None:
        want = tag.lower()
        tagged = np.array([any(t.lower() == want for t in c.tags) for c in cs], dtype=bool)
        mask &= tagged
    return mask


def _require_target_rate(cs: CoupleSet, t: int, cond: Conditions) -> None:
    """ScienceError when the target itself has no self-exchange data (every pair would be NaN)."""
    a = cs.arrays
    medium = cond.medium or str(a.medium[t])
    try:
        eps = float(get_solvent(medium).permittivity(cond.temperature_K))
    except KeyError as exc:
        raise ConditionsError(str(exc.args[0])) from None
    I = cond.ionic_strength_M if cond.ionic_strength_M is not None else float(a.I0_M[t])
    se = self_exchange_at(cs, [t], cond.temperature_K, I, eps, float(np.log(cond.Z)), medium=cond.medium)
    if se.reason[0]:
        raise ScienceError(se.reason[0] + "; add one to the library or estimate lambda with `crossrate lambda`")


def screen(
    couple_set: CoupleSet,
    target: str,
    role: str = "oxidant",
    conditions: Conditions | None = None,
    min_k: float | None = None,
    max_dG0: float | None = None,
    medium: str | None = None,
    tag: str | None = None,
    top: int | None = None,
) -> ScreenResult:
    """Rank every couple that can react with `target` in the given role by predicted k_obs.

    Args:
        couple_set: the loaded couples.
        target: id of the target couple.
        role: 'oxidant' (target's oxidized form takes the electron from each partner's reduced form) or
            'reductant' (target's reduced form gives the electron to each partner's oxidized form).
        conditions: target conditions (see Conditions; default 298.15 K, the couples' own I and medium; the
            rate model, classical or semiclassical, as in predict()).
        min_k: keep pairs with k_obs >= min_k, M^-1 s^-1.
        max_dG0: keep pairs with Delta G deg <= max_dG0, kJ/mol.
        medium: keep partners measured in this medium (solvent key).
        tag: keep partners carrying this tag (case-insensitive).
        top: keep at most this many rows (after ranking).

    Returns:
        ScreenResult, fastest first. Raises UnknownCoupleError, ConditionsError or ScienceError.
    """
    require_couple_set(couple_set)
    require_conditions(conditions)
    if role not in ROLES:
        raise ConditionsError(f"role {role!r}: expected 'oxidant' or 'reductant'")
    if min_k is not None and not (np.isfinite(min_k) and min_k > 0):
        raise ConditionsError(f"min_k {min_k!r}: expected a positive rate constant in M^-1 s^-1")
    if max_dG0 is not None and not np.isfinite(max_dG0):
        raise ConditionsError(f"max_dG0 {max_dG0!r}: expected a finite free energy in kJ/mol")
    if top is not None and top < 1:
        raise ConditionsError(f"top {top!r}: expected a whole number of at least 1")
    cond = conditions or Conditions()
    t = int(couple_set.index_of([target])[0])
    _require_target_rate(couple_set, t, cond)

    partners = np.flatnonzero(_candidate_mask(couple_set, t, medium, tag))
    fixed = np.full(partners.shape, t, dtype=np.intp)
    ox, red = (fixed, partners) if role == "oxidant" else (partners, fixed)
    table = predict_many(couple_set, ox, red, cond, uncertainty=True)

    log_k = np.asarray(table.log10_k_obs, dtype=float)
    problems = np.asarray(table.problem, dtype=object)
    ok = problems == ""
    reasons = Counter(problems[~ok].tolist())
    keep = ok.copy()
    if min_k is not None:
        keep &= log_k >= np.log10(min_k)
    if max_dG0 is not None:
        keep &= np.asarray(table.dG0_kJ_per_mol, dtype=float) <= max_dG0
    rows = np.flatnonzero(keep)
    # Fastest first; ties keep library order (stable sort), so the output is deterministic.
    rows = rows[np.argsort(-log_k[rows], kind="stable")]
    if top is not None:
        rows = rows[:top]

    ranked = _take(table, rows)
    sd = np.asarray(ranked.log10_k_obs_sd_linear, dtype=float)
    k = np.asarray(ranked.log10_k_obs, dtype=float)
    interval = tuple(zip((k - Z95 * sd).tolist(), (k + Z95 * sd).tolist(), strict=True))
    ids = couple_set.arrays.ids
    kept = tuple(map(ids.__getitem__, partners[rows].tolist()))
    return ScreenResult(
        target=ids[t],
        role=role,
        table=ranked,
        partner=kept,
        target_provenance=couple_set[ids[t]].provenance,
        partner_provenance=tuple(couple_set[p].provenance for p in kept),
        log10_k_obs_95_linear=interval,
        candidates=int(partners.size),
        not_computable=int((~ok).sum()),
        not_computable_reasons=tuple(sorted(reasons.items())),
        filtered_out=int(ok.sum()) - int(rows.size),
        E_not_carried=_E_not_carried(couple_set, ox[rows], red[rows], cond),
        rate_model=cond.rate_model,
        semiclassical=model_record(couple_set, np.concatenate(([t], partners)), cond),
    )


def _E_not_carried(cs: CoupleSet, ox, red, cond: Conditions) -> tuple[str, ...]:
    """Ids (library order) of the couples in the kept pairs whose potential was measured in another medium than
    the pair's (conditions' medium, else the oxidant's) and used as given (allow_E_other_medium)."""
    if not cond.allow_E_other_medium or ox.size == 0:
        return ()
    a = cs.arrays
    pair_medium = np.full(ox.shape, cond.medium, dtype=object) if cond.medium is not None else a.medium[ox]
    used = set(ox[a.medium[ox] != pair_medium].tolist()) | set(red[a.medium[red] != pair_medium].tolist())
    return tuple(a.ids[i] for i in sorted(used))
