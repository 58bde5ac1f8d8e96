"""Checking a measured k0, or measured peak separations at several scan rates, against the k0 predicted
from the couple's self-exchange rate.

Peak separations are turned into k0 row by row through the simulated working curve
(crossrate.services.peak_separation_curve): psi from Delta Ep, k0 = psi (pi D_O f v)^1/2 / (D_O/D_R)^(alpha/2).
A row at or below the reversible separation gives only a lower bound. The rows' log10 k0 are averaged with
weights 1/SD^2 (SD from the Delta Ep reading, default DEFAULT_DEP_SD_MV); the SD of the mean is the larger
of the propagated one and the rows' scatter over sqrt(n). The verdict follows the ladder of `crossrate check`:
within the combined 95 % interval, within a factor of 10, or beyond it, with the likely causes.
"""

import math
from dataclasses import dataclass

import numpy as np

from ..errors import InputFileError, ScienceError
from .electrode_rate import Z95, ElectrodeRate
from .measured_check import WITHIN_FACTOR
from .measured_csv import Column, read_table
from .peak_separation_curve import working_curve
from .voltammogram import CvSetup

#: Reading uncertainty of a peak separation when none is given, mV (common practice).
DEFAULT_DEP_SD_MV = 2.0
#: SD of a measured k0 (log10) when none is given (common practice: k0 from one method is good to ~2x).
DEFAULT_K0_LOG10_SD = 0.3
#: Separations below this (mV, one electron, 25 degC) are narrower than diffusion allows: adsorption.
ADSORPTION_DEP_MV = 55.0
#: Slope of log10 k0 against log10 v below which the implied k0 is said to fall with scan rate.
FALLING_SLOPE = -0.15


def _positive(unit):
    def parse(text: str) -> float:
        try:
            value = float(text)
        except ValueError:
            raise ValueError(f"a number greater than 0 in {unit}") from None
        if not (math.isfinite(value) and value > 0):
            raise ValueError(f"a finite number greater than 0 in {unit}")
        return value

    return parse


PEAK_COLUMNS = (
    Column("scan_rate", _positive("V/s"), True),
    Column("dEp_mV", _positive("mV"), True),
    Column("dEp_sd_mV", _positive("mV")),
)


@dataclass(frozen=True)
class PeakRow:
    """One measured peak separation and the k0 it implies. scan_rate in V/s; dEp_mV and its SD in mV; psi;
    log10_k0 (cm/s) and its SD (log10), or the lower bound when bound == 'lower'; line in the file."""

    line: int
    scan_rate_V_s: float
    dEp_mV: float
    dEp_sd_mV: float
    psi: float | None
    log10_k0: float | None
    log10_k0_sd: float | None
    bound: str | None
    label: str


def read_peak_csv(path) -> list[tuple[int, float, float, float | None, str]]:
    """(line, scan rate V/s, Delta Ep mV, SD mV or None, label) per row; InputFileError on bad input."""
    rows = read_table(path, PEAK_COLUMNS)
    out = []
    for r in rows:
        v = r.values
        if v["dEp_mV"] > 2000.0:
            raise InputFileError(f"{path}:{r.line}: field dEp_mV: got {v['dEp_mV']:g}, expected at most 2000 mV")
        out.append((r.line, v["scan_rate"], v["dEp_mV"], v.get("dEp_sd_mV"), v.get("label") or ""))
    return out


@dataclass(frozen=True)
class ElectrodeCheck:
    """A measured k0 (given, or implied by peak separations) against the prediction.

    log10_k0_measured, its SD and 95 % interval in log10 cm/s (None when the rows give only a lower bound:
    then log10_k0_lower_bound); log10_ratio = measured - predicted; verdict on the ladder within_interval,
    within_10x, beyond_10x (or 'lower_bound_only', 'consistent_lower_bound'); likely causes in words and keys.
    """

    couple: str
    prediction: ElectrodeRate
    source: str
    rows: tuple[PeakRow, ...]
    log10_k0_measured: float | None
    log10_k0_measured_sd: float | None
    log10_k0_lower_bound: float | None
    log10_ratio: float | None
    slope_log10_k0_vs_log10_v: float | None
    verdict: str
    verdict_text: str
    likely_causes: tuple[str, ...]
    likely_cause_keys: tuple[str, ...]

    def to_dict(self) -> dict:
        from dataclasses import asdict

        d = asdict(self)
        d["prediction"] = self.prediction.to_dict()
        return d


def k0_from_peaks(rows, setup: CvSetup) -> tuple[PeakRow, ...]:
    """Each measured separation turned into k0 through the working curve of the setup's alpha, D ratio and T.

    rows: (line, scan rate V/s, Delta Ep mV, SD mV or None, label) as read_peak_csv gives them."""
    curve = working_curve(round(setup.alpha, 6), round(setup.D_red_cm2_s / setup.D_ox_cm2_s, 9),
                          round(setup.temperature_K, 6))
    D, f = setup.D_ox_cm2_s, setup.f
    factor = (D / setup.D_red_cm2_s) ** (setup.alpha / 2.0)
    out = []
    for line, v, dep, sd, label in rows:
        sd_used = DEFAULT_DEP_SD_MV if sd is None else sd
        scale = math.sqrt(math.pi * D * f * v) / factor
        if dep <= curve.reversible_mV:
            lower = math.log10(20.0 * scale)
            out.append(PeakRow(line, v, dep, sd_used, None, lower, None, "lower", label))
            continue
        psi = float(curve.psi_of(dep))
        if not math.isfinite(psi):
            raise ScienceError(f"line {line}: Delta Ep {dep:g} mV lies beyond the working curve "
                               f"(above {float(curve.dEp_mV[0]):.0f} mV); expected a quasi-reversible separation")
        # SD of log10 psi from the curve's slope at this separation.
        lo, hi = curve.psi_of([max(dep - sd_used, curve.reversible_mV + 1e-6), dep + sd_used])
        hi = hi if math.isfinite(hi) else float(curve.psi[0])
        sd_log = abs(math.log10(lo) - math.log10(hi)) / 2.0 if math.isfinite(lo) else 1.0
        out.append(PeakRow(line, v, dep, sd_used, psi, math.log10(psi * scale), sd_log, None, label))
    return tuple(out)


def _combine(rows):
    exact = [r for r in rows if r.bound is None]
    if not exact:
        return None, None, max(r.log10_k0 for r in rows), None
    x = np.array([r.log10_k0 for r in exact])
    w = 1.0 / np.array([r.log10_k0_sd for r in exact]) ** 2
    mean = float(np.sum(w * x) / np.sum(w))
    sd = float(1.0 / math.sqrt(np.sum(w)))
    if len(exact) >= 3:
        sd = max(sd, float(np.std(x, ddof=1)) / math.sqrt(len(exact)))
    slope = None
    if len(exact) >= 3:
        lv = np.log10([r.scan_rate_V_s for r in exact])
        if np.ptp(lv) > 0:
            slope = float(np.polyfit(lv, x, 1)[0])
    return mean, sd, None, slope


def check_electrode(
    prediction: ElectrodeRate,
    *,
    k0_measured_cm_s: float | None = None,
    k0_log10_sd: float | None = None,
    peak_rows=None,
    setup: CvSetup | None = None,
    source: str = "",
    charges: tuple[int, int] | None = None,
) -> ElectrodeCheck:
    """Compare a measured k0 (cm/s), or the k0 implied by peak separations, with the predicted one.

    Args:
        prediction: the couple's ElectrodeRate (crossrate.services.electrode_rate.predict_k0).
        k0_measured_cm_s, k0_log10_sd: a measured k0 and its SD in log10 (default DEFAULT_K0_LOG10_SD); or
        peak_rows: rows as read_peak_csv gives them, with setup: CvSetup for D_ox, D_red, alpha, temperature.
        source: where the measurement came from (file name), for the report.
        charges: (z_ox, z_red) of the couple, to weigh double-layer effects.
    """
    rows: tuple[PeakRow, ...] = ()
    if (k0_measured_cm_s is None) == (peak_rows is None):
        raise ScienceError("give either a measured k0 or peak separations, not both or neither")
    if k0_measured_cm_s is not None:
        if not (math.isfinite(k0_measured_cm_s) and k0_measured_cm_s > 0):
            raise ScienceError(f"measured k0 {k0_measured_cm_s!r} cm/s: expected a number greater than 0")
        sd_in = DEFAULT_K0_LOG10_SD if k0_log10_sd is None else k0_log10_sd
        if not (math.isfinite(sd_in) and sd_in > 0):
            raise ScienceError(f"SD {k0_log10_sd!r} of log10 k0: expected a number greater than 0")
        mean, sd, lower, slope = math.log10(k0_measured_cm_s), sd_in, None, None
        source = source or "given k0"
    else:
        if setup is None:
            raise ScienceError("peak separations need the cell setup (diffusion coefficients, alpha)")
        rows = k0_from_peaks(peak_rows, setup)
        mean, sd, lower, slope = _combine(rows)
    pred, sd_p = prediction.log10_k0, prediction.log10_k0_sd
    narrow = any(r.dEp_mV < ADSORPTION_DEP_MV for r in rows)
    if mean is None:
        ratio = None
        if lower <= prediction.log10_k0_95[1]:
            verdict = "consistent_lower_bound"
            text = (f"every separation is at the reversible value: k0 >= {10**lower:.3g} cm/s, consistent with the "
                    f"prediction {10**pred:.3g} cm/s; faster scans or a smaller electrode would measure it")
        else:
            verdict = "lower_bound_only"
            text = (f"k0 >= {10**lower:.3g} cm/s, above the predicted 95 % range (up to "
                    f"{10**prediction.log10_k0_95[1]:.3g} cm/s)")
        causes = _causes(+1.0, slope, narrow, charges, prediction) if verdict == "lower_bound_only" or narrow else ()
    else:
        ratio = mean - pred
        half = Z95 * math.hypot(sd, sd_p)
        factor = 10.0 ** abs(ratio)
        way = "faster" if ratio > 0 else "slower"
        if abs(ratio) <= half:
            verdict = "within_interval"
            text = f"within the combined 95 % interval (measured {way} by a factor of {factor:.2g})"
        elif factor <= WITHIN_FACTOR:
            verdict = "within_10x"
            text = f"outside the combined 95 % interval but within a factor of 10 ({factor:.3g} times {way})"
        else:
            verdict = "beyond_10x"
            text = f"{factor:.3g} times {way} than predicted, beyond a factor of 10"
        causes = () if verdict == "within_interval" and not narrow else _causes(ratio, slope, narrow, charges,
                                                                                prediction)
    return ElectrodeCheck(
        couple=prediction.couple, prediction=prediction, source=source, rows=rows, log10_k0_measured=mean,
        log10_k0_measured_sd=sd, log10_k0_lower_bound=lower, log10_ratio=ratio,
        slope_log10_k0_vs_log10_v=slope, verdict=verdict, verdict_text=text,
        likely_causes=tuple(c[1] for c in causes), likely_cause_keys=tuple(c[0] for c in causes),
    )


def _causes(ratio, slope, narrow, charges, prediction):
    """(key, text, weight) of the causes worth checking, most suggestive first (a ranking aid, common practice)."""
    slower = ratio < 0
    falling = slope is not None and slope < FALLING_SLOPE
    out = [
        ("uncompensated_resistance",
         "uncompensated resistance: the iR drop widens the peaks as the current grows with scan rate"
         + (f", and the implied k0 falls with scan rate here (slope {slope:+.2f} in log-log)" if falling else "")
         + "; compensate it or measure R_u and simulate with --Ru",
         4.0 if falling else (2.0 if slower else 0.5)),
        ("film_on_electrode",
         "a film or contamination on the electrode (adsorbed impurities, oxide, polymer) blocks sites and slows "
         "the transfer; polish, clean and measure again, or compare another electrode material",
         2.5 if slower else 0.3),
        ("adsorption",
         "adsorption of the couple or its partner: separations below the diffusive limit (about 59 mV), sharp "
         "symmetric peaks or peak currents growing with v rather than v^1/2 point to it",
         4.5 if narrow else 1.0),
        ("non_outer_sphere",
         "a non-outer-sphere path at the surface (a bridging ligand, specifically adsorbed halide, catalysis by "
         "the electrode material) makes the couple faster than the outer-sphere estimate",
         3.0 if not slower else 0.8),
    ]
    z = max(abs(charges[0]), abs(charges[1])) if charges else 0
    out.append(("double_layer",
                "double-layer (Frumkin) effects: the work of bringing the charged couple to the reaction plane was "
                "taken as zero; at low supporting electrolyte it shifts the apparent k0 either way",
                2.0 if z >= 2 else 0.7))
    if any("lambda" in n or "carried" in n for n in prediction.notes):
        out.append(("estimated_self_exchange",
                    "the self-exchange rate behind the prediction is estimated or carried to other conditions "
                    "(see the notes of the prediction)", 1.5))
    out.sort(key=lambda c: -c[2])
    return out
