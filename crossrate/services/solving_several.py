"""One consistent estimate of an unknown couple's k_self or E from its measured rates with several partners.

Each row is solved on its own (crossrate.services.solving). The estimate is the inverse-variance weighted
mean of the rows' values (log10 k_self, or the normal-side root of E); a row disagrees when it lies more
than DISAGREE_Z standard errors from the weighted mean of the other rows (leave-one-out, so one stray
partner cannot drag the mean toward itself). Disagreeing rows are left out of the estimate when at least
two rows remain; the standard error is inflated by sqrt(reduced chi-square) when the rows scatter more than
their own uncertainties say.
"""

import math
from dataclasses import dataclass

import numpy as np

from ..errors import ConditionsError, InputFileError, ScienceError, UnknownCoupleError
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set, require_id
from .conditions import Conditions, row_conditions
from .measured_check import Z95
from .measured_csv import PartnerRow
from .results import _Record, json_safe
from .solving import solve_k_self, solve_potential

#: |z| beyond which a partner's value disagrees with the others (about the two-sided 95 % point).
DISAGREE_Z = 2.0


@dataclass(frozen=True)
class PartnerEstimate(_Record):
    """One row's own value: log10 k_self (log10 M^-1 s^-1) or normal-side E (V on the unknown's scale)."""

    line: int
    partner: str
    role: str
    value: float | None
    sd: float | None
    diffusion_limited: bool
    lower_bound: float | None
    z: float | None
    agrees: bool
    used: bool


@dataclass(frozen=True)
class SeveralSolution(_Record):
    """The combined estimate. kind: 'k_self' (values log10 M^-1 s^-1) or 'potential' (V on E_scale)."""

    unknown: str
    kind: str
    n: int
    n_used: int
    estimate: float
    estimate_se: float
    estimate_95: tuple[float, float]
    spread_sd: float
    reduced_chi2: float | None
    E_scale: str | None
    partners: tuple[PartnerEstimate, ...]
    disagreeing: tuple[str, ...]
    explanation: str

    def to_dict(self) -> dict:
        d = super().to_dict()
        if self.kind == "k_self":
            d.update(log10_k_self=self.estimate, k_self=10.0**self.estimate, log10_k_self_95=list(self.estimate_95))
        else:
            d.update(E_V=[self.estimate], E_V_95=[list(self.estimate_95)])
        return json_safe(d)


def _weighted(v, sd):
    w = 1.0 / np.square(sd)
    m = float(np.sum(w * v) / np.sum(w))
    se = float(math.sqrt(1.0 / np.sum(w)))
    return m, se, w


def combine(values, sds) -> tuple[float, float, float, float | None, np.ndarray, np.ndarray]:
    """(estimate, se, spread SD, reduced chi2 or None, z per row, used mask) for values with SDs (1-D)."""
    v = np.asarray(values, dtype=float)
    sd = np.asarray(sds, dtype=float)
    n = len(v)

    def loo_z(used):
        """z of every row against the weighted mean of the other used rows (leave-one-out)."""
        z = np.full(n, np.nan)
        for i in range(n):
            rest = used & (np.arange(n) != i)
            if rest.any():
                m_i, se_i, _ = _weighted(v[rest], sd[rest])
                z[i] = (v[i] - m_i) / math.hypot(sd[i], se_i)
        return z

    used = np.ones(n, dtype=bool)
    # Leave out the worst disagreeing row, one at a time, while at least three rows remain to judge by.
    while used.sum() >= 3:
        z = loo_z(used)
        zu = np.where(used, np.abs(z), -1.0)
        worst = int(np.argmax(zu))
        if zu[worst] <= DISAGREE_Z:
            break
        used[worst] = False
    z = loo_z(used)
    m, se, w = _weighted(v[used], sd[used])
    k = int(used.sum())
    chi2_red = float(np.sum(w * (v[used] - m) ** 2) / (k - 1)) if k >= 2 else None
    if chi2_red is not None and chi2_red > 1.0:
        se *= math.sqrt(chi2_red)
    spread = float(np.std(v[used], ddof=1)) if k >= 2 else 0.0
    return m, se, spread, chi2_red, z, used


def solve_several(
    couple_set: CoupleSet,
    unknown: str,
    rows: list[PartnerRow],
    kind: str = "k_self",
    conditions: Conditions | None = None,
    default_role: str = "auto",
) -> SeveralSolution:
    """Solve for `unknown` from several partner measurements (read_partner_csv) and combine them.

    Args:
        kind: 'k_self' or 'potential'. conditions: defaults; each row's temperature, ionic strength and
            medium override them. default_role: the unknown's role where a row gives none.

    Returns:
        SeveralSolution. InputFileError lists every row that cannot be solved (file:line: message).
    """
    require_couple_set(couple_set)
    require_id(unknown, "unknown")
    require_conditions(conditions)
    if kind not in ("k_self", "potential"):
        raise ScienceError(f"kind {kind!r}: expected k_self or potential")
    couple_set[unknown]  # UnknownCoupleError for the unknown itself, before any row
    base = conditions or Conditions()
    solver = solve_k_self if kind == "k_self" else solve_potential
    problems, sols = [], []
    for r in rows:
        try:
            s = solver(couple_set, unknown, r.partner, r.k_measured, r.k_measured_log10_sd,
                       role=r.role or default_role, conditions=row_conditions(base, r))
        except UnknownCoupleError as exc:
            problems.append(f"{r.path}:{r.line}: field partner: {exc}")
            continue
        except (ConditionsError, ScienceError) as exc:
            problems.append(f"{r.path}:{r.line}: partner {r.partner}: {exc}")
            continue
        sols.append((r, s))
    if problems:
        raise InputFileError("\n".join(problems))
    vals, sds, idx = [], [], []
    for k, (_, s) in enumerate(sols):
        if kind == "k_self" and s.log10_k_self is not None:
            vals.append(s.log10_k_self)
            sds.append(max(s.log10_k_self_sd, 1e-6))
            idx.append(k)
        elif kind == "potential" and not s.diffusion_limited:
            vals.append(s.E_V[0])
            sds.append(max(s.E_sd_V[0], 1e-9))
            idx.append(k)
    if not vals:
        raise ScienceError(
            f"none of the {len(rows)} rows gives a usable value for {unknown}: every measured rate is at the "
            "diffusion limit"
        )
    m, se, spread, chi2_red, z, used = combine(vals, sds)
    zmap = {k: (float(z[j]) if math.isfinite(z[j]) else None, bool(used[j])) for j, k in enumerate(idx)}
    partners = []
    for k, (r, s) in enumerate(sols):
        zk, uk = zmap.get(k, (None, False))
        value = (s.log10_k_self if kind == "k_self" else (None if s.diffusion_limited else s.E_V[0]))
        sd = (s.log10_k_self_sd if kind == "k_self" else (None if s.diffusion_limited else s.E_sd_V[0]))
        partners.append(PartnerEstimate(
            line=r.line, partner=r.partner, role=s.role, value=value, sd=sd, diffusion_limited=s.diffusion_limited,
            lower_bound=getattr(s, "log10_k_self_lower_bound", None), z=zk,
            agrees=zk is None or abs(zk) <= DISAGREE_Z, used=uk,
        ))
    disagreeing = tuple(f"{p.partner} (line {p.line})" for p in partners if not p.agrees)
    unit = "log10 k_self" if kind == "k_self" else f"E (V vs {couple_set[unknown].E_scale})"
    text = (
        f"{unit} of {unknown} = {m:.3f} +- {Z95 * se:.3f} (95 %) from {int(used.sum())} of {len(rows)} partner "
        f"measurements; spread between partners {spread:.3f}"
    )
    if disagreeing:
        text += f"; disagreeing (left out when enough others remain): {', '.join(disagreeing)}"
    limited = [p.partner for p in partners if p.diffusion_limited]
    if limited:
        text += f"; at the diffusion limit, so not used: {', '.join(limited)}"
    return SeveralSolution(
        unknown=unknown, kind=kind, n=len(rows), n_used=int(used.sum()), estimate=m, estimate_se=se,
        estimate_95=(m - Z95 * se, m + Z95 * se), spread_sd=spread, reduced_chi2=chi2_red,
        E_scale=couple_set[unknown].E_scale if kind == "potential" else None,
        partners=tuple(partners), disagreeing=disagreeing, explanation=text,
    )
