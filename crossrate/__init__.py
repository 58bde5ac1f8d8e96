"""crossrate: predict and check outer-sphere electron-transfer cross rates (Marcus cross relation).

The Python API is the same services the command line and the workbench use::

    import crossrate
    couples = crossrate.load_library()                      # bundled, group and personal layers
    p = crossrate.predict(couples, "oxidant-id", "reductant-id", crossrate.Conditions(temperature_K=298.15))
    p.log10_k_obs, p.log10_k_obs_95, p.to_dict()

Units follow the CLI's JSON keys: energies kJ/mol (and eV where named), rate constants as log10 of
M^-1 s^-1, temperatures K, ionic strengths mol/L. Results are frozen dataclasses with ``to_dict()``;
tables have ``records()`` for ``pandas.DataFrame.from_records``. Errors derive from CrossrateError.
Nothing in the API prints or exits.

``import crossrate`` is cheap: every name below is imported on first use (no numpy, scipy, Rich or
Textual until then).

Predictions are estimates, not a safety assessment; follow your lab's safety rules and local regulations
when handling strong oxidants and reductants.
"""

from importlib import import_module
from typing import TYPE_CHECKING

__version__ = "0.1.0"

#: Public name -> (module, attribute), resolved on first access.
_LAZY = {
    # loading and looking up couples
    "load_library": ("crossrate.api", "load_library"),
    "CoupleSet": ("crossrate.library.couple_set", "CoupleSet"),
    "Couple": ("crossrate.library.couple", "Couple"),
    "BondSet": ("crossrate.library.couple", "BondSet"),
    # conditions and predictions
    "Conditions": ("crossrate.services.conditions", "Conditions"),
    "predict": ("crossrate.services.prediction", "predict"),
    "predict_many": ("crossrate.services.batch_prediction", "predict_many"),
    "screen": ("crossrate.services.screening", "screen"),
    "rate_map": ("crossrate.services.rate_map", "rate_map"),
    # checks, solving, fitting, estimating lambda
    "read_measured_csv": ("crossrate.services.measured_csv", "read_measured_csv"),
    "read_series_csv": ("crossrate.services.measured_csv", "read_series_csv"),
    "check_measured": ("crossrate.services.measured_check", "check_measured"),
    "solve_k_self": ("crossrate.services.solving", "solve_k_self"),
    "solve_potential": ("crossrate.services.solving", "solve_potential"),
    "fit_series": ("crossrate.services.series_fit", "fit_series"),
    "check_pair": ("crossrate.services.measured_check", "check_pair"),
    "read_partner_csv": ("crossrate.services.measured_csv", "read_partner_csv"),
    "solve_several": ("crossrate.services.solving_several", "solve_several"),
    # lambda breakdown (inner + two-sphere outer + work) of a library couple and the k_self it implies
    "estimate_lambda": ("crossrate.services.lambda_estimate", "lambda_breakdown"),
    "lambda_for_structure": ("crossrate.services.lambda_estimate", "lambda_for_structure"),
    # a couple at an electrode: k0 from k_self, k(eta) under Butler-Volmer and Marcus-Hush-Chidsey
    "predict_k0": ("crossrate.services.electrode_rate", "predict_k0"),
    "rate_curves": ("crossrate.services.electrode_kinetics", "rate_curves"),
    "ElectrodeRate": ("crossrate.services.electrode_rate", "ElectrodeRate"),
    "RateCurves": ("crossrate.services.electrode_kinetics", "RateCurves"),
    "CvSetup": ("crossrate.services.voltammogram", "CvSetup"),
    "simulate_voltammogram": ("crossrate.services.voltammogram", "simulate_voltammogram"),
    "scan_rate_series": ("crossrate.services.voltammogram", "scan_rate_series"),
    "CvTrace": ("crossrate.services.voltammogram", "CvTrace"),
    "ScanRateSeries": ("crossrate.services.voltammogram", "ScanRateSeries"),
    "check_electrode": ("crossrate.services.electrode_check", "check_electrode"),
    "read_peak_csv": ("crossrate.services.electrode_check", "read_peak_csv"),
    "ElectrodeCheck": ("crossrate.services.electrode_check", "ElectrodeCheck"),
    # result records
    "Prediction": ("crossrate.services.results", "Prediction"),
    "PredictionTable": ("crossrate.services.prediction_table", "PredictionTable"),
    "UsedConditions": ("crossrate.services.results", "UsedConditions"),
    "WorkTerms": ("crossrate.services.results", "WorkTerms"),
    "CarriedPotential": ("crossrate.services.results", "CarriedPotential"),
    "ScreenResult": ("crossrate.services.screening", "ScreenResult"),
    "RateMap": ("crossrate.services.rate_map", "RateMap"),
    "ProgressCallback": ("crossrate.services.progress", "ProgressCallback"),
    "MeasuredRow": ("crossrate.services.measured_csv", "MeasuredRow"),
    "SeriesData": ("crossrate.services.measured_csv", "SeriesData"),
    "CheckReport": ("crossrate.services.measured_check", "CheckReport"),
    "PairCheck": ("crossrate.services.measured_check", "PairCheck"),
    "KSelfSolution": ("crossrate.services.solving", "KSelfSolution"),
    "PotentialSolution": ("crossrate.services.solving", "PotentialSolution"),
    "SeriesFit": ("crossrate.services.series_fit", "SeriesFit"),
    "LambdaBreakdown": ("crossrate.services.lambda_estimate", "LambdaBreakdown"),
    # errors
    "CrossrateError": ("crossrate.errors", "CrossrateError"),
    "Problem": ("crossrate.errors", "Problem"),
    "LibraryError": ("crossrate.errors", "LibraryError"),
    "UnknownCoupleError": ("crossrate.errors", "UnknownCoupleError"),
    "ConditionsError": ("crossrate.errors", "ConditionsError"),
    "ScienceError": ("crossrate.errors", "ScienceError"),
    "ConflictError": ("crossrate.errors", "ConflictError"),
    "InputFileError": ("crossrate.errors", "InputFileError"),
}

__all__ = [
    "__version__",
    "load_library", "CoupleSet", "Couple", "BondSet",
    "Conditions", "predict", "predict_many", "screen", "rate_map",
    "read_measured_csv", "read_series_csv", "read_partner_csv", "check_measured", "check_pair",
    "solve_k_self", "solve_potential", "solve_several", "fit_series",
    "estimate_lambda", "lambda_for_structure",
    "Prediction", "PredictionTable", "UsedConditions", "WorkTerms", "CarriedPotential", "ScreenResult", "RateMap", "ProgressCallback",
    "MeasuredRow", "SeriesData", "CheckReport", "PairCheck", "KSelfSolution", "PotentialSolution", "SeriesFit",
    "LambdaBreakdown",
    "predict_k0", "rate_curves", "ElectrodeRate", "RateCurves",
    "CvSetup", "simulate_voltammogram", "scan_rate_series", "CvTrace", "ScanRateSeries",
    "check_electrode", "read_peak_csv", "ElectrodeCheck",
    "CrossrateError", "Problem", "LibraryError", "UnknownCoupleError", "ConditionsError", "ScienceError",
    "ConflictError", "InputFileError",
]  # fmt: skip


def __getattr__(name: str):
    """Import a public name on first use (PEP 562) and cache it in the module."""
    try:
        module_name, attr = _LAZY[name]
    except KeyError:
        raise AttributeError(f"module 'crossrate' has no attribute {name!r}") from None
    try:
        module = import_module(module_name)
    except ModuleNotFoundError as exc:
        if exc.name != module_name:
            raise
        raise AttributeError(
            f"crossrate.{name} is not available in this installation ({module_name} is missing)"
        ) from None
    value = getattr(module, attr)
    globals()[name] = value
    return value


def __dir__() -> list[str]:
    return sorted(set(globals()) | set(__all__))


if TYPE_CHECKING:  # static type checkers and IDEs see the real objects
    from .api import load_library
    from .errors import (
        ConditionsError,
        ConflictError,
        CrossrateError,
        InputFileError,
        LibraryError,
        Problem,
        ScienceError,
        UnknownCoupleError,
    )
    from .library.couple import BondSet, Couple
    from .library.couple_set import CoupleSet
    from .services.batch_prediction import predict_many
    from .services.conditions import Conditions
    from .services.electrode_check import ElectrodeCheck, check_electrode, read_peak_csv
    from .services.electrode_kinetics import RateCurves, rate_curves
    from .services.electrode_rate import ElectrodeRate, predict_k0
    from .services.lambda_estimate import LambdaBreakdown, lambda_for_structure
    from .services.lambda_estimate import lambda_breakdown as estimate_lambda
    from .services.measured_check import CheckReport, PairCheck, check_measured, check_pair
    from .services.measured_csv import (
        MeasuredRow,
        SeriesData,
        read_measured_csv,
        read_partner_csv,
        read_series_csv,
    )
    from .services.prediction import predict
    from .services.prediction_table import PredictionTable
    from .services.progress import ProgressCallback
    from .services.rate_map import RateMap, rate_map
    from .services.results import (
        CarriedPotential,
        Prediction,
        UsedConditions,
        WorkTerms,
    )
    from .services.screening import ScreenResult, screen
    from .services.series_fit import SeriesFit, fit_series
    from .services.solving import KSelfSolution, PotentialSolution, solve_k_self, solve_potential
    from .services.solving_several import solve_several
    from .services.voltammogram import (
        CvSetup,
        CvTrace,
        ScanRateSeries,
        scan_rate_series,
        simulate_voltammogram,
    )
