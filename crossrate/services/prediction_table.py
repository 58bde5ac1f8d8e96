"""The result record of many predictions at once (predict_many, screen): one column per quantity.

Its own module, apart from the single Prediction's records in results.py: a cold `crossrate predict` then
never defines it (a frozen dataclass costs about 1 ms to define in Python 3.11).
"""

from dataclasses import dataclass, fields

from .results import _Record, json_safe


@dataclass(frozen=True)
class PredictionTable(_Record):
    """Vectorized predictions for many pairs: parallel lists, same units as Prediction.

    Entries of a pair that cannot be computed (unrelated scales, mixed media, no self-exchange data) are NaN
    in the numeric columns and give the reason in `problem` (empty string when the pair is fine).
    """

    oxidant: tuple[str, ...]
    reductant: tuple[str, ...]
    dG0_kJ_per_mol: tuple[float, ...]
    dG0_prime_kJ_per_mol: tuple[float, ...]
    lambda_kJ_per_mol: tuple[float, ...]
    log10_k_act: tuple[float, ...]
    log10_k_diff: tuple[float, ...]
    log10_k_obs: tuple[float, ...]
    log10_k_obs_sd_linear: tuple[float, ...]
    regime: tuple[str, ...]
    diffusion_controlled: tuple[bool, ...]
    problem: tuple[str, ...]

    def __len__(self) -> int:
        return len(self.oxidant)

    def records(self) -> list[dict]:
        """One dict per pair (JSON-safe), e.g. for pandas.DataFrame.from_records."""
        names = [f.name for f in fields(self)]
        cols = [getattr(self, n) for n in names]
        return [json_safe(dict(zip(names, row, strict=True))) for row in zip(*cols, strict=True)]
