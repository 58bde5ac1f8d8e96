"""Checking measured cross rates against the cross-relation prediction: one pair (TUI) or a file (CLI).

The verdict ladder (documented in the README):
1. ``within_interval``: log10(k_measured / k_predicted) lies inside the combined 95 % interval of the
   prediction (its Monte Carlo interval) and of the measurement (+-1.96 SD of log10 k_measured);
2. ``within_10x``: outside that interval but within a factor of 10, the usual agreement for well-behaved
   outer-sphere pairs (common practice);
3. ``beyond_10x``: further off; the simple outer-sphere picture does not describe the pair as it stands,
   and the likely causes worth checking are listed, most suggestive first.
"""

import math
from collections.abc import Callable
from dataclasses import asdict, dataclass, field, replace

import numpy as np

from ..errors import (
    ArgumentError,
    ConditionsError,
    InputFileError,
    ScienceError,
    UnknownCoupleError,
)
from ..library.couple import Couple
from ..library.couple_set import CoupleSet
from .arguments import require_conditions, require_couple_set
from .conditions import Conditions, row_conditions
from .likely_causes import likely_causes
from .measured_csv import MeasuredRow
from .prediction import predict
from .results import Prediction, json_safe

#: SD of log10 k_measured when none is given: +-25 %, a typical reproducibility of a rate constant
#: (common practice); stated in the output whenever it is used.
DEFAULT_MEASURED_LOG10_SD = 0.1
#: Factor-of-ten rung of the ladder (common practice for well-behaved outer-sphere pairs).
WITHIN_FACTOR = 10.0
Z95 = 1.959963984540054  # two-sided 95 % point of the standard normal (scipy.stats.norm.ppf(0.975))

VERDICTS = {
    "within_interval": "consistent with a simple outer-sphere path: inside the combined 95 % interval",
    "within_10x": (
        "outside the combined interval but within a factor of 10, the usual agreement for well-behaved "
        "outer-sphere pairs"
    ),
    "beyond_10x": "more than a factor of 10 off: the simple outer-sphere cross relation does not describe this pair",
}


@dataclass(frozen=True)
class PairCheck:
    """A measured rate compared with its prediction.

    log10 values of rate constants in M^-1 s^-1. combined_95: (low, high) of log10 k within which the
    measurement would count as consistent (prediction and measurement uncertainty combined). position:
    'inside', 'above' or 'below' that interval. verdict: a rung of VERDICTS; verdict_text: plain words.
    likely_causes: what to check, most suggestive first (keys in likely_cause_keys).
    """

    oxidant: str
    reductant: str
    k_measured: float
    log10_k_measured: float
    k_measured_log10_sd: float
    measured_sd_defaulted: bool
    log10_k_pred: float
    log10_k_pred_95: tuple[float, float]
    log10_k_diff: float
    log10_ratio: float
    combined_95: tuple[float, float]
    position: str
    verdict: str
    verdict_text: str
    likely_causes: tuple[str, ...]
    likely_cause_keys: tuple[str, ...]
    regime: str
    dG0_kJ_per_mol: float
    diffusion_controlled: bool
    above_diffusion_limit: bool
    line: int | None = None
    label: str | None = None
    prediction: Prediction | None = field(default=None, compare=False, repr=False)
    #: "invented", "unverified" or "verified" for each couple of the pair (from the prediction).
    oxidant_provenance: str = ""
    reductant_provenance: str = ""

    @property
    def factor(self) -> float:
        """k_measured / k_predicted as a plain factor (> 1: measured faster)."""
        return 10.0**self.log10_ratio

    def to_dict(self) -> dict:
        d = asdict(self)
        d.pop("prediction")
        return json_safe(d)


def require_positive(value, what: str, expected: str) -> float:
    """value as a finite float > 0, else ScienceError naming what was expected (numpy scalars accepted)."""
    try:
        x = float(value)
    except (TypeError, ValueError):
        raise ScienceError(f"{what} {value!r}: expected {expected}") from None
    if not (math.isfinite(x) and x > 0):
        raise ScienceError(f"{what} {value!r}: expected {expected}")
    return x


def _prediction_interval(p: Prediction) -> tuple[float, float]:
    if p.log10_k_obs_95 is not None:
        return float(p.log10_k_obs_95[0]), float(p.log10_k_obs_95[1])
    half = Z95 * p.log10_k_obs_sd_linear
    return p.log10_k_obs - half, p.log10_k_obs + half


def check_pair(
    prediction: Prediction,
    k_measured: float,
    k_measured_log10_sd: float | None = None,
    *,
    couples: tuple[Couple, Couple] | None = None,
) -> PairCheck:
    """Compare a measured rate constant with the prediction for the same pair and conditions.

    Args:
        prediction: the pair's Prediction (crossrate.services.prediction.predict).
        k_measured: measured cross rate constant, M^-1 s^-1 (> 0).
        k_measured_log10_sd: its SD in log10 units; None uses DEFAULT_MEASURED_LOG10_SD (said in the result).
        couples: (oxidant, reductant) Couple records, when at hand, so tags, kappa_el, charges and the
            measurement conditions of the couples can order the likely causes.

    Returns:
        PairCheck. Raises ScienceError for a non-positive or non-finite k_measured or SD.
    """
    k_measured = require_positive(k_measured, "measured rate", "a rate constant greater than 0 in M^-1 s^-1")
    defaulted = k_measured_log10_sd is None
    sd = DEFAULT_MEASURED_LOG10_SD if defaulted else require_positive(
        k_measured_log10_sd, "measured SD", "a positive number in log10 units"
    )
    log_meas = math.log10(k_measured)
    pred = prediction.log10_k_obs
    lo, hi = _prediction_interval(prediction)
    # Combine the two sources of spread side by side (independent errors add in quadrature).
    below = math.hypot(pred - lo, Z95 * sd)
    above = math.hypot(hi - pred, Z95 * sd)
    combined = (pred - below, pred + above)
    ratio = log_meas - pred
    position = "inside" if combined[0] <= log_meas <= combined[1] else ("above" if log_meas > combined[1] else "below")
    if position == "inside":
        verdict = "within_interval"
    elif abs(ratio) <= math.log10(WITHIN_FACTOR):
        verdict = "within_10x"
    else:
        verdict = "beyond_10x"
    above_kd = log_meas > prediction.log10_k_diff
    causes = () if verdict == "within_interval" else likely_causes(prediction, ratio, log_meas, couples)
    return PairCheck(
        oxidant=prediction.oxidant,
        reductant=prediction.reductant,
        oxidant_provenance=prediction.oxidant_provenance,
        reductant_provenance=prediction.reductant_provenance,
        k_measured=float(k_measured),
        log10_k_measured=log_meas,
        k_measured_log10_sd=sd,
        measured_sd_defaulted=defaulted,
        log10_k_pred=pred,
        log10_k_pred_95=(lo, hi),
        log10_k_diff=prediction.log10_k_diff,
        log10_ratio=ratio,
        combined_95=combined,
        position=position,
        verdict=verdict,
        verdict_text=_verdict_text(verdict, ratio, log_meas - (combined[0] if position == "below" else combined[1]),
                                   position, defaulted),
        likely_causes=tuple(c.text for c in causes),
        likely_cause_keys=tuple(c.key for c in causes),
        regime=prediction.regime,
        dG0_kJ_per_mol=prediction.dG0_kJ_per_mol,
        diffusion_controlled=prediction.diffusion_controlled,
        above_diffusion_limit=above_kd,
        prediction=prediction,
    )


def _verdict_text(verdict: str, ratio: float, outside: float, position: str, defaulted: bool) -> str:
    factor = 10.0 ** abs(ratio)
    if verdict == "within_interval":
        how = f"measured {'faster' if ratio >= 0 else 'slower'} by a factor of {factor:.2g}"
    else:
        how = (
            f"measured {factor:.3g} times {'faster' if ratio > 0 else 'slower'} than predicted, "
            f"{abs(outside):.2f} log10 units {position} the combined interval"
        )
    text = f"{VERDICTS[verdict]} ({how})"
    if defaulted:
        text += f"; measurement SD not given, {DEFAULT_MEASURED_LOG10_SD:g} in log10 assumed"
    return text


@dataclass(frozen=True)
class CheckSummary:
    """n rows; median and largest |log10 ratio|; fractions within the interval and within 10x; worst rows
    as (line, oxidant, reductant, log10_ratio), largest |log10 ratio| first."""

    n: int
    median_abs_log10_ratio: float
    max_abs_log10_ratio: float
    fraction_within_interval: float
    fraction_within_10x: float
    worst: tuple[tuple[int | None, str, str, float], ...]


@dataclass(frozen=True)
class CheckReport:
    """The check of a file of measured rates: one PairCheck per row and the summary."""

    path: str | None
    rows: tuple[PairCheck, ...]
    summary: CheckSummary

    def rows_over(self, factor: float) -> tuple[PairCheck, ...]:
        """Rows further off than `factor` (a plain factor, e.g. 10) in either direction."""
        limit = math.log10(factor)
        return tuple(r for r in self.rows if abs(r.log10_ratio) > limit)

    def to_dict(self) -> dict:
        return json_safe(
            {"path": self.path, "rows": [r.to_dict() for r in self.rows], "summary": asdict(self.summary)}
        )


def summarize(rows, n_worst: int = 3) -> CheckSummary:
    """Summary over PairChecks (count, median |log10 ratio|, fractions, worst rows)."""
    rows = list(rows)
    a = np.abs(np.array([r.log10_ratio for r in rows], dtype=float))
    order = np.argsort(-a, kind="stable")[:n_worst]
    return CheckSummary(
        n=len(rows),
        median_abs_log10_ratio=float(np.median(a)) if len(a) else float("nan"),
        max_abs_log10_ratio=float(a.max()) if len(a) else float("nan"),
        fraction_within_interval=float(np.mean([r.verdict == "within_interval" for r in rows])) if rows else 0.0,
        fraction_within_10x=float(np.mean(a <= math.log10(WITHIN_FACTOR))) if len(a) else 0.0,
        worst=tuple((rows[i].line, rows[i].oxidant, rows[i].reductant, rows[i].log10_ratio) for i in order.tolist()),
    )


def check_measured(
    couple_set: CoupleSet,
    rows: list[MeasuredRow],
    conditions: Conditions | None = None,
    samples: int = 5000,
    seed: int | None = 0,
    progress: Callable[[int, int], None] | None = None,
) -> CheckReport:
    """Check every row of a measured-rates file (read_measured_csv) against its prediction.

    Args:
        couple_set: the loaded couples.
        rows: MeasuredRow records; each row's temperature, ionic strength and medium override `conditions`.
        conditions: defaults for the rows (the command's options).
        samples, seed: Monte Carlo draws per row for the prediction interval, and the RNG seed.
        progress: called as progress(done, total) after each row.

    Returns:
        CheckReport. Raises InputFileError listing every row that names an unknown couple or cannot be
        predicted (file:line: field: message), before any result is returned.
    """
    require_couple_set(couple_set)
    require_conditions(conditions, classical_only="the measured-rate check")
    if not isinstance(rows, list | tuple):
        raise ArgumentError(f"rows: got {type(rows).__name__}; expected a list of MeasuredRow (from read_measured_csv)")
    base = conditions or Conditions()
    problems = []
    for r in rows:
        for name in ("oxidant", "reductant"):
            cid = getattr(r, name)
            if cid not in couple_set:
                problems.append(f"{r.path}:{r.line}: field {name}: {UnknownCoupleError(cid, couple_set.suggest(cid))}")
    if problems:
        raise InputFileError("\n".join(problems))
    out = []
    for k, r in enumerate(rows):
        try:
            cond = row_conditions(base, r)
            p = predict(couple_set, r.oxidant, r.reductant, cond, samples=samples, seed=seed)
        except (ConditionsError, ScienceError) as exc:
            problems.append(f"{r.path}:{r.line}: {r.oxidant} + {r.reductant}: {exc}")
            continue
        c = check_pair(p, r.k_measured, r.k_measured_log10_sd, couples=(couple_set[r.oxidant], couple_set[r.reductant]))
        out.append(replace(c, line=r.line, label=r.label))
        if progress is not None:
            progress(k + 1, len(rows))
    if problems:
        raise InputFileError("\n".join(problems))
    path = rows[0].path if rows else None
    return CheckReport(path=path, rows=tuple(out), summary=summarize(out))
