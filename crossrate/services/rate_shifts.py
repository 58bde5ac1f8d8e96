"""How much predicted cross rates move between two versions of a library file (for reviewing a change).

The couples of each version are laid over the same context (the layered set the other commands use, less
the couples of either version), so a pair of a changed group couple with a starter couple is covered too.
Pairs are the chosen ones, or every ordered pair of couples present in both versions in which at least
one couple moved (its fields changed, or its potential on the root scale did through a redefined custom
scale); any other pair is computed from identical inputs and cannot move. Each pair is predicted with
services.batch_prediction.predict_many (Marcus cross relation, work terms, diffusion cap) at the same
conditions in both versions; shifts are in log10 k_obs (M^-1 s^-1), largest first.
"""

from dataclasses import dataclass

import numpy as np

from ..library.couple_set import CoupleSet
from .batch_prediction import predict_many
from .conditions import Conditions


@dataclass(frozen=True)
class RateShift:
    """One ordered pair: log10 k_obs (M^-1 s^-1) with the old and the new file (NaN when not computable, the
    reason in old_problem / new_problem) and the shift new - old (NaN unless both are computable)."""

    oxidant: str
    reductant: str
    old_log10_k: float
    new_log10_k: float
    old_problem: str
    new_problem: str

    @property
    def shift(self) -> float:
        return self.new_log10_k - self.old_log10_k

    def to_dict(self) -> dict:
        def num(x):
            return None if not np.isfinite(x) else float(x)

        return {"oxidant": self.oxidant, "reductant": self.reductant, "old_log10_k_obs": num(self.old_log10_k),
                "new_log10_k_obs": num(self.new_log10_k), "shift_log10": num(self.shift),
                "old_problem": self.old_problem or None, "new_problem": self.new_problem or None}


def overlay(context: CoupleSet | None, couples, scales) -> CoupleSet:
    """The context's couples (less any id in `couples`) followed by `couples`, with the scales of both."""
    from ..core.potential_scales import ScaleRegistry

    ids = {c.id for c in couples}
    base = [c for c in context if c.id not in ids] if context is not None else []
    merged = {k: context.scales.get(k) for k in context.scales.keys()} if context is not None else {}
    merged.update(scales)
    return CoupleSet(base + list(couples), ScaleRegistry(merged))


def _moved(old_set: CoupleSet, new_set: CoupleSet, common: list[str]) -> list[str]:
    out = []
    for cid in common:
        a, b = old_set[cid], new_set[cid]
        if a != b:
            out.append(cid)
            continue
        try:
            if old_set.E_on_root(a) != new_set.E_on_root(b):
                out.append(cid)
        except (KeyError, ValueError):
            out.append(cid)
    return out


def rate_shifts(old_set: CoupleSet, new_set: CoupleSet, pairs=None, conditions: Conditions | None = None,
                only_ids=None) -> list[RateShift]:
    """Shifts of log10 k_obs between two sets, largest |shift| first, then pairs computable in one version only.

    pairs: (oxidant, reductant) ids to compare, or None for every ordered pair of couples in both sets where
    at least one of `only_ids` (default: every couple of both sets) moved. Raises UnknownCoupleError for a
    chosen pair not in both sets, ConditionsError for bad conditions.
    """
    if pairs is None:
        pool = set(only_ids) if only_ids is not None else None
        common = [cid for cid in new_set.ids() if cid in old_set]
        moved = set(_moved(old_set, new_set, [c for c in common if pool is None or c in pool]))
        pairs = [(a, b) for a in common for b in common if a != b and (a in moved or b in moved)]
    else:
        for a, b in pairs:
            for cid in (a, b):
                old_set[cid], new_set[cid]  # noqa: B018  (UnknownCoupleError naming the id and close ones)
    if not pairs:
        return []
    ox = [a for a, _ in pairs]
    red = [b for _, b in pairs]
    before = predict_many(old_set, ox, red, conditions, uncertainty=False)
    after = predict_many(new_set, ox, red, conditions, uncertainty=False)
    out = [RateShift(a, b, float(o), float(n), po, pn) for a, b, o, n, po, pn in
           zip(ox, red, before.log10_k_obs, after.log10_k_obs, before.problem, after.problem, strict=True)]

    def order(s: RateShift):
        d = s.shift
        if np.isfinite(d):
            return (0, -abs(d))
        return (1, 0.0) if np.isfinite(s.old_log10_k) or np.isfinite(s.new_log10_k) else (2, 0.0)

    out.sort(key=order)
    return out
