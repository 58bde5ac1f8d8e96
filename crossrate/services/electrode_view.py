"""Everything the workbench's electrode view shows for one couple, from the electrode services: the predicted
k0 with its interval, k(eta) under Butler-Volmer and Marcus-Hush-Chidsey kinetics, and Delta Ep against scan
rate from simulated voltammograms (with the reversible limit)."""

from dataclasses import dataclass

from ..errors import CrossrateError
from ..library.couple_set import CoupleSet
from .conditions import Conditions
from .electrode_kinetics import RateCurves, rate_curves
from .electrode_rate import ElectrodeRate, couple_diffusion_cm2_s, predict_k0
from .voltammogram import CvSetup, ScanRateSeries, scan_rate_series

#: Scan rates of the view's Delta Ep line, V/s (a decade apart, the range of a usual potentiostat).
VIEW_SCAN_RATES = (0.01, 0.1, 1.0, 10.0, 100.0)


@dataclass(frozen=True)
class ElectrodeView:
    """k0 of a couple (rate), its k(eta) curves (curves, eta within +-0.5 V), Delta Ep against scan rate
    (series; Butler-Volmer, alpha 1/2, Stokes-Einstein D, no resistance); problem: why nothing could be had."""

    couple: str
    rate: ElectrodeRate | None
    curves: RateCurves | None
    series: ScanRateSeries | None
    problem: str = ""


def electrode_view(couple_set: CoupleSet, couple_id: str, conditions: Conditions | None = None,
                   scan_rates=VIEW_SCAN_RATES) -> ElectrodeView:
    """The electrode view of one couple at the conditions (temperature K, ionic strength M, medium); a
    CrossrateError (no rate data, unknown couple, conditions out of range) becomes the view's problem."""
    cond = conditions or Conditions()
    try:
        rate = predict_k0(couple_set, couple_id, cond)
        lam = rate.lambda_el_kJ_per_mol
        lam = lam if lam == lam and lam > 0 else None  # NaN: no lambda, Butler-Volmer only
        curves = rate_curves(rate.log10_k0, lam, 0.5, rate.temperature_K, 0.5, 81)
        D = couple_diffusion_cm2_s(couple_set, couple_id, cond)
        setup = CvSetup(log10_k0=rate.log10_k0, D_ox_cm2_s=D, D_red_cm2_s=D, temperature_K=rate.temperature_K)
        series = scan_rate_series(setup, scan_rates)
    except CrossrateError as exc:
        return ElectrodeView(couple_id, None, None, None, str(exc))
    return ElectrodeView(couple_id, rate, curves, series)
