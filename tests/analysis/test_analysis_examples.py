"""The README's analysis examples (libraries/examples/, invented data) run on the bundled demo library and
say what the README says they say."""

from pathlib import Path

import pytest

from crossrate.services.measured_check import check_measured
from crossrate.services.measured_csv import read_measured_csv, read_partner_csv, read_series_csv
from crossrate.services.series_fit import fit_series
from crossrate.services.solving_several import solve_several

EXAMPLES = Path(__file__).resolve().parents[2] / "libraries" / "examples"


@pytest.fixture(scope="module")
def demo_set():
    layers = pytest.importorskip("crossrate.library.layers")
    if not (EXAMPLES.parent / "demo.toml").exists():
        pytest.skip("libraries/demo.toml not present")
    return layers.load_layered(bundled=True, group=False, personal=False, demo=True)


def test_every_example_says_it_is_invented():
    files = sorted(EXAMPLES.glob("*.csv"))
    assert len(files) >= 4
    for f in files:
        assert "INVENTED" in f.read_text(encoding="utf-8").splitlines()[0]


def test_measured_example(demo_set):
    rep = check_measured(demo_set, read_measured_csv(EXAMPLES / "measured_demo.csv"), samples=5000, seed=0)
    assert rep.summary.n == 7
    beyond = [(r.oxidant, r.reductant) for r in rep.rows if r.verdict == "beyond_10x"]
    assert beyond == [("hl-med2", "hl-co-amine"), ("hl-phenothiazine", "hl-med1")]
    assert rep.rows[5].likely_cause_keys[0] == "spin_change"  # hl-co-amine carries the spin-change tag
    assert [r.line for r in rep.rows_over(100.0)] == [12]


def test_partners_example(demo_set):
    res = solve_several(demo_set, "hl-med1", read_partner_csv(EXAMPLES / "partners_demo.csv"))
    assert res.disagreeing == ("hl-phenothiazine (line 9)",)
    lo, hi = res.estimate_95
    assert lo < 3.48 < hi  # the demo library's own k_self of hl-med1, 3.0e3 M^-1 s^-1: log10 = 3.48


def test_series_examples():
    yes = fit_series(read_series_csv(EXAMPLES / "series_demo.csv"))
    assert yes.inverted_region_supported
    lo, hi = yes.lambda_95
    assert lo < 0.85 * 96.485 < hi  # generated with lambda = 0.85 eV (x 96.485 kJ/mol per eV)
    no = fit_series(read_series_csv(EXAMPLES / "series_plateau_demo.csv"))
    assert not no.inverted_region_supported
    assert "plateau" in no.evidence


def test_intramolecular_series_example():
    # Invented demo (generated with lambda_s = 0.30 eV, lambda_v = 0.50 eV, hbar omega = 1500 cm^-1, noise
    # 0.1): a gentle falloff, so the semiclassical model is favoured and the inverted region supported.
    fit = fit_series(read_series_csv(EXAMPLES / "series_intra_demo.csv"))
    assert fit.kind == "unimolecular" and fit.model == "semiclassical"
    assert fit.inverted_region_supported
    lo, hi = fit.lambda_95
    assert lo < 0.80 * 96.485 < hi  # lambda = lambda_s + lambda_v = 0.80 eV (x 96.485 kJ/mol per eV)
