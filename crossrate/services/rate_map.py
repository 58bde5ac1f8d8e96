"""The rate map: log10 k_obs for every ordered pair (oxidant i, reductant j) of a set of couples.

Pairs are computed only where predict() would compute them: both couples measured in the same medium
(or one medium chosen with allow_mixed_media), potentials on related scales, one ionic strength (the
conditions' or, when none is given, the couples' common one) and self-exchange data for both. Every other
cell is NaN. Couples are grouped by (medium, root scale, ionic strength) and each group is one all-pairs
grid on the core fast path (crossrate.core.rate_grid.ln_k_obs_grid: Marcus cross relation with work terms
in its barrier form and the Debye-Smoluchowski diffusion cap). With the semiclassical model
(conditions.rate_model) every cell's k_act carries the quantum factor Q of predict() (services.rate_model),
summed over vibrational levels for all pairs at once (crossrate.core.level_sum, within LEVEL_SUM_TOLERANCE
in ln Q of predict's per-pair sum).
"""

from dataclasses import dataclass, field

import numpy as np

from ..core.level_sum import LevelWeights
from ..core.rate_grid import ln_k_obs_grid, semiclassical_weights
from ..core.screened_debye_table import TABLE_MIN_PAIRS, screened_debye_table
from ..core.solvents import get_solvent
from ..errors import ConditionsError
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set
from .carried_potentials import potentials_at
from .conditions import Conditions
from .progress import ProgressCallback, report
from .rate_model import grid_model, model_record
from .results import json_safe
from .self_exchange import self_exchange_at

LN10 = float(np.log(10.0))
#: Oxidant rows per call of the fast path between two progress reports.
ROWS_PER_STEP = 256


@dataclass(frozen=True, eq=False)
class RateMap:
    """log10 k_obs of Ox_i + Red_j for the couples `ids` (rows: oxidant i, columns: reductant j).

    ids: couple ids, in library order (or the order asked for); media: the medium each couple was
    measured in; medium: the one medium of the map when all couples share it (or the one chosen), else
    None; log10_k_obs: read-only (n x n) float array of log10(M^-1 s^-1), NaN where the pair cannot be
    computed. The diagonal holds each couple's self-exchange rate at the map's conditions (capped by
    diffusion like any pair). temperature_K (K), ionic_strength_M (mol/L, None: each couple's own), Z
    (M^-1 s^-1), diffusion: the conditions used. Formal potentials are carried to the map's conditions as in
    predict(); E_not_carried: couples whose potential was measured in another medium and used as given
    (allow_E_other_medium; without it their rows and columns are NaN).
    """

    ids: tuple[str, ...]
    media: tuple[str, ...]
    medium: str | None
    log10_k_obs: np.ndarray = field(repr=False)
    temperature_K: float
    ionic_strength_M: float | None
    Z: float
    diffusion: bool
    #: "invented", "unverified" or "verified" for each couple of `ids`.
    provenance: tuple[str, ...] = ()
    E_not_carried: tuple[str, ...] = ()
    #: 'classical' or 'semiclassical'; for the latter, semiclassical holds services.rate_model.model_record.
    rate_model: str = "classical"
    semiclassical: dict | None = None

    def __len__(self) -> int:
        return len(self.ids)

    @property
    def computable(self) -> int:
        """Number of cells (ordered pairs, diagonal included) with a value."""
        return int(np.isfinite(self.log10_k_obs).sum())

    def value(self, oxidant: str, reductant: str) -> float:
        """log10 k_obs of one pair, log10(M^-1 s^-1) (NaN when not computable); KeyError for unknown ids."""
        return float(self.log10_k_obs[self.ids.index(oxidant), self.ids.index(reductant)])

    def to_dict(self) -> dict:
        """JSON-safe dict: the matrix as nested lists with null where a pair cannot be computed."""
        return json_safe(
            {
                "ids": list(self.ids),
                "provenance": list(self.provenance),
                "media": list(self.media),
                "medium": self.medium,
                "conditions": {
                    "temperature_K": self.temperature_K,
                    "ionic_strength_M": self.ionic_strength_M,
                    "Z": self.Z,
                    "diffusion": self.diffusion,
                },
                "E_not_carried": list(self.E_not_carried),
                "rate_model": self.rate_model,
                "semiclassical": self.semiclassical,
                "rows": "oxidant",
                "columns": "reductant",
                "log10_k_obs": self.log10_k_obs.tolist(),
            }
        )


def ids_with_tag(couple_set: CoupleSet, tag: str) -> list[str]:
    """Ids of the couples carrying `tag` (case-insensitive), in library order."""
    want = tag.lower()
    return [c.id for c in couple_set if any(t.lower() == want for t in c.tags)]


def _groups(cs: CoupleSet, idx: np.ndarray, cond: Conditions):
    """{(medium used, root scale, ionic strength): positions in idx}; pairs across groups are not computable."""
    a = cs.arrays
    own_medium = a.medium[idx]
    if cond.medium is not None and cond.allow_mixed_media:
        used = np.full(idx.shape, cond.medium, dtype=object)
    else:
        used = own_medium
    I = a.I0_M[idx] if cond.ionic_strength_M is None else np.full(idx.shape, float(cond.ionic_strength_M))
    groups: dict[tuple, list[int]] = {}
    for k, key in enumerate(zip(used.tolist(), a.scale_root[idx].tolist(), I.tolist(), strict=True)):
        groups.setdefault(key, []).append(k)
    return {key: np.asarray(pos, dtype=np.intp) for key, pos in groups.items()}


def rate_map(
    couple_set: CoupleSet,
    ids=None,
    conditions: Conditions | None = None,
    progress: ProgressCallback | None = None,
) -> RateMap:
    """log10 k_obs for every ordered pair of the couples `ids` (default: all loaded couples).

    Args:
        couple_set: the loaded couples.
        ids: couple ids to include (in this order), or None for all. With conditions.medium set and
            allow_mixed_media off, only couples measured in that medium are kept.
        conditions: target conditions (temperature K, ionic strength mol/L or None for the couples' own,
            medium, Z in M^-1 s^-1, diffusion cap, rate model: classical or semiclassical as in predict()).
        progress: progress(done, total) called as oxidant rows are finished (total = number of couples).

    Returns:
        RateMap (log10(M^-1 s^-1), NaN where not computable). Raises UnknownCoupleError, ConditionsError.
    """
    require_couple_set(couple_set)
    require_conditions(conditions)
    cond = conditions or Conditions()
    a = couple_set.arrays
    idx = np.arange(len(couple_set), dtype=np.intp) if ids is None else couple_set.index_of(list(ids))
    if cond.medium is not None:
        try:
            get_solvent(cond.medium)
        except KeyError as exc:
            raise ConditionsError(str(exc.args[0])) from None
        if not cond.allow_mixed_media:
            idx = idx[a.medium[idx] == cond.medium]
    n = int(idx.size)
    out = np.full((n, n), np.nan)
    T = float(cond.temperature_K)
    ln_Z = float(np.log(cond.Z))
    done = 0
    not_carried: list[str] = []
    report(progress, 0, n)
    for (medium, _root, I), pos in _groups(couple_set, idx, cond).items():
        sol = get_solvent(medium)
        eps, visc = float(sol.permittivity(T)), float(sol.viscosity_Pa_s(T))
        members = idx[pos]
        se = self_exchange_at(couple_set, members, T, I, eps, ln_Z, medium=medium)
        pa = potentials_at(couple_set, members, T, I, eps, medium=medium, activity_model=cond.activity_model)
        if cond.allow_E_other_medium:
            not_carried.extend(a.ids[i] for i in members[pa.other_medium].tolist())
        ok = np.isfinite(se.ln_k) & (cond.allow_E_other_medium | ~pa.other_medium)
        E = pa.E_root_V[ok]
        ln_kap = np.log(se.kappa_el)  # non-adiabatic couples: as cross_rate's ln_kappa11 / ln_kappa22
        cols = pos[ok]
        m = members[ok]
        # One screened-diffusion table for all row blocks of this group (None at I = 0 or for small maps).
        table = screened_debye_table(a.z_ox[m], a.radius_m[m], a.z_red[m], a.radius_m[m], T, I, eps) \
            if cond.diffusion and m.size * m.size >= TABLE_MIN_PAIRS else None
        model = grid_model(couple_set, m, cond)
        semi = {}
        if model:
            # One set of tables for all row blocks of the map (level_sum.LevelWeights; its zero-driving-force
            # table built once over every pair's range).
            weights = semiclassical_weights(E, a.z_ox[m], a.z_red[m], a.radius_m[m], se.ln_k[ok], T, I, eps, visc,
                                            ln_Z, model["semiclassical"], model["lambda_in_J"], ln_kap[ok]) \
                if model["hbar_omega_J"] is None else LevelWeights(T)
            semi = {"semiclassical": model["semiclassical"], "level_weights": weights}
        for s in range(0, m.size, ROWS_PER_STEP):
            r = slice(s, s + ROWS_PER_STEP)
            if model:
                own = model["hbar_omega_J"]
                semi.update(lambda_in1_J=model["lambda_in_J"][r], lambda_in2_J=model["lambda_in_J"],
                            hbar_omega1_J=None if own is None else own[r], hbar_omega2_J=own)
            grid = ln_k_obs_grid(
                E[r], a.z_ox[m[r]], a.z_red[m[r]], a.radius_m[m[r]], se.ln_k[ok][r],
                E, a.z_ox[m], a.z_red[m], a.radius_m[m], se.ln_k[ok],
                T, I, eps, visc, ln_Z, diffusion=cond.diffusion,
                ln_kappa1=ln_kap[ok][r], ln_kappa2=ln_kap[ok], debye_table=table, **semi,
            )
            out[np.ix_(cols[r], cols)] = grid.ln_k_obs / LN10
            done += int(cols[r].size)
            report(progress, done, n)
        if cols.size < pos.size:  # couples without self-exchange data (or a usable E): their rows stay NaN
            done += int(pos.size - cols.size)
            report(progress, done, n)
    out.setflags(write=False)
    media = tuple(a.medium[idx].tolist())
    single = cond.medium if cond.medium is not None else (media[0] if media and len(set(media)) == 1 else None)
    map_ids = tuple(a.ids[i] for i in idx.tolist())
    return RateMap(
        ids=map_ids,
        provenance=tuple(couple_set[i].provenance for i in map_ids),
        media=media,
        medium=single,
        log10_k_obs=out,
        temperature_K=T,
        ionic_strength_M=None if cond.ionic_strength_M is None else float(cond.ionic_strength_M),
        Z=float(cond.Z),
        diffusion=bool(cond.diffusion),
        E_not_carried=tuple(not_carried),
        rate_model=cond.rate_model,
        semiclassical=model_record(couple_set, idx, cond),
    )
