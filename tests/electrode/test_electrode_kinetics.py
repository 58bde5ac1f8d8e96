"""k(eta) under Butler-Volmer and Marcus-Hush-Chidsey kinetics, against the formulas and mpmath quadrature."""

import json
import math

import mpmath
import numpy as np
import pytest
from scipy import constants

from crossrate.core.marcus_hush_chidsey import ln_fermi_integral, mhc_ln_rates
from crossrate.errors import ConditionsError
from crossrate.services.electrode_kinetics import rate_curves

F_RT = constants.physical_constants["Faraday constant"][0] / (constants.R * 298.15)


def _chidsey_ln_J(c, lam):
    """ln of the Marcus-Hush-Chidsey integral J(c) = int exp(-(x-c)^2/(4 lam)) / (1 + e^x) dx by mpmath
    quadrature (Chidsey 1991 form, from memory), split at the peak of the integrand so tiny values stay exact."""
    mpmath.mp.dps = 30
    peak = c + min(max(-c, -2 * lam), 0.0)  # where exp(-(x-c)^2/4lam) / (1 + e^x) is largest
    w = 10 * mpmath.sqrt(2 * lam)
    pts = [-mpmath.inf] + [peak - w + k * w / 10 for k in range(21)] + [mpmath.inf]
    return float(mpmath.log(mpmath.quad(lambda x: mpmath.exp(-(x - c) ** 2 / (4 * lam)) / (1 + mpmath.exp(x)), pts)))


@pytest.mark.parametrize("lam", [0.5, 8.0, 40.0])
@pytest.mark.parametrize("c", [-50.0, -3.0, 0.0, 7.0, 60.0])
def test_fermi_integral_matches_mpmath(lam, c):
    # The trapezoidal rule's error bound (module docstring) is far below 1e-9 in ln J.
    assert float(ln_fermi_integral(np.array(c), lam)) == pytest.approx(_chidsey_ln_J(c, lam), abs=1e-8)


def test_mhc_rates_match_the_integral_and_detailed_balance():
    lam_kJ = 50.0
    eta = np.array([-0.6, -0.2, 0.0, 0.15, 0.7])
    red, ox = mhc_ln_rates(eta, 0.0, lam_kJ * 1e3, 298.15)
    lam = lam_kJ * 1e3 / (constants.R * 298.15)
    for k, e in enumerate(eta):
        u = F_RT * e
        # k_red/k0 = J(lam + u)/J(lam), k_ox/k0 = J(lam - u)/J(lam) (reduction favoured at negative eta).
        assert red[k] == pytest.approx(_chidsey_ln_J(lam + u, lam) - _chidsey_ln_J(lam, lam), abs=1e-8)
        assert ox[k] == pytest.approx(_chidsey_ln_J(lam - u, lam) - _chidsey_ln_J(lam, lam), abs=1e-8)
    # Detailed balance (common practice): k_ox/k_red = exp(F eta/RT) for any kinetics consistent with E0'.
    np.testing.assert_allclose(ox - red, F_RT * eta, atol=1e-9)


def test_butler_volmer_formula_and_mhc_levels_off():
    c = rate_curves(-1.0, 40.0, alpha=0.4, eta_max_V=1.5, points=31)
    # Butler-Volmer (common practice): log10 k_red = log10 k0 - alpha f eta / ln 10, k_ox with (1 - alpha).
    np.testing.assert_allclose(c.log10_k_red_bv, -1.0 - 0.4 * F_RT * c.eta_V / math.log(10), atol=1e-12)
    np.testing.assert_allclose(c.log10_k_ox_bv, -1.0 + 0.6 * F_RT * c.eta_V / math.log(10), atol=1e-12)
    # MHC k_red never falls as eta goes negative (no inverted region at a metal) and ends at the plateau
    # k0 sqrt(4 pi lam)/J(lam): the Gaussian then lies wholly over occupied levels, J -> sqrt(4 pi lam).
    assert np.all(np.diff(c.log10_k_red_mhc) <= 1e-12)
    lam = 40e3 / (constants.R * 298.15)
    plateau = -1.0 + (0.5 * math.log(4 * math.pi * lam) - _chidsey_ln_J(lam, lam)) / math.log(10)
    assert c.log10_plateau_mhc == pytest.approx(plateau, abs=1e-8)
    assert c.log10_k_red_mhc[0] == pytest.approx(plateau, abs=0.05)
    # Near eta = 0 MHC and Butler-Volmer with alpha = 1/2 agree (MHC's symmetry factor there is 1/2).
    mid = len(c.eta_V) // 2
    assert c.log10_k_red_mhc[mid] == pytest.approx(-1.0, abs=1e-12)


def test_inputs_are_checked():
    with pytest.raises(ConditionsError, match="alpha"):
        rate_curves(0.0, 40.0, alpha=1.0)
    with pytest.raises(ConditionsError, match="reorganization"):
        rate_curves(0.0, -5.0)
    with pytest.raises(ConditionsError, match="points"):
        rate_curves(0.0, 40.0, points=2)


def test_cli_rates_table_json_and_plot(run_electrode, tmp_path):
    rc, out, err = run_electrode("rates", "hl-el-neutral", "--points", "5")
    assert rc == 0 and "MHC red" in out and "inverted region" in out
    rc, out, _ = run_electrode("rates", "--k0", "0.01", "--lambda-el", "40", "--format", "json", "--points", "3")
    d = json.loads(out)
    assert d["log10_k0"] == pytest.approx(-2.0) and len(d["points"]) == 3
    pytest.importorskip("matplotlib")
    fig = tmp_path / "rates.svg"
    rc, _, err = run_electrode("rates", "--k0", "0.01", "--lambda-el", "40", "--plot", str(fig))
    assert rc == 0 and fig.stat().st_size > 1000
    rc, _, err = run_electrode("rates", library=False)
    assert rc == 2 and "--k0" in err
