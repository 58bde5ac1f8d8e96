"""k_self at the target conditions from estimated or carried reorganization energies (services/self_exchange)."""

import math

import numpy as np
import pytest
from scipy import constants as sc

from crossrate.core.condition_transfer import carry_ln_k_self
from crossrate.core.solvents import get_solvent
from crossrate.library.couple_set import CoupleSet
from crossrate.services.couple_lambda import (
    DEFAULT_KAPPA_EL_LOG10_SD,
    DEFAULT_KAPPA_EL_NON_ADIABATIC,
)
from crossrate.services.self_exchange import (
    DEFAULT_K_SELF_LOG10_SD,
    DEFAULT_LAMBDA_REL_SD,
    METHOD_LAMBDA_TOTAL,
    METHOD_MEASURED,
    METHOD_MEASURED_OTHER_SOLVENT,
    METHOD_NONE,
    METHOD_STRUCTURE,
    self_exchange_at,
)

T = 298.15
RT = sc.R * T
LN_Z = math.log(1e11)
LN10 = math.log(10.0)
#: e^2 N_A / (4 pi eps0) in kJ/mol * angstrom (scipy.constants; 1389.354, see test_lambda_outer).
C_KJ_A = sc.e**2 * sc.N_A / (4 * math.pi * sc.epsilon_0) / 1e3 * 1e10
P_WATER = 1 / 1.3325**2 - 1 / 78.30334  # 0.550433, solvent table at 298.15 K
P_MECN = 1 / 1.3416**2 - 1 / 35.94  # 0.527765


def _work(z1, z2, r_A, eps, I):
    """Debye-Hueckel-Bronsted work term (issue 2's formula), J/mol, written out independently."""
    r = r_A * 1e-10
    kappa = math.sqrt(2 * sc.N_A * sc.e**2 * I * 1000 / (sc.epsilon_0 * eps * sc.k * T))
    return z1 * z2 * sc.e**2 * sc.N_A / (4 * math.pi * sc.epsilon_0 * eps * r * (1 + kappa * r))


def _at(cs, ids, medium, I=0.1):
    eps = float(get_solvent(medium).permittivity(T))
    return self_exchange_at(cs, cs.index_of(ids), T, I, eps, LN_Z, medium=medium)


def test_structural_estimate_from_bonds(lambda_set):
    se = _at(lambda_set, ["est_bonds"], "water")
    # lambda_in from BONDS (6 bonds, 0.14 A, 250 and 160 N/m), Marcus-Sutin formula over both partners:
    # 250*160/410 = 97.561 N/m; * (0.14e-10)^2 = 1.91220e-20 J; * 12 bonds * N_A = 138.186 kJ/mol.
    # lambda_out (two-sphere, a = 3.5 A, water): 1389.354/7 * 0.550433 = 109.250 kJ/mol. Total 247.436 kJ/mol.
    lam = 138.186e3 + C_KJ_A / 7.0 * P_WATER * 1e3
    assert float(se.lambda_J[0]) == pytest.approx(lam, rel=1e-5)
    # k_self = Z exp(-(w + lambda/4)/RT), adiabatic, w for z = +3/+2 at r = 7 A, I = 0.1 M.
    w = _work(3, 2, 7.0, 78.30334, 0.1)
    assert float(se.ln_k[0]) == pytest.approx(LN_Z - (w + lam / 4) / RT, abs=1e-4)
    # SD: sigma_lnk = sigma_lambda / 4RT with sigma_lambda = 15 % of lambda (the documented default).
    assert float(se.ln_k_sd[0]) == pytest.approx(0.15 * lam / (4 * RT), rel=1e-5)
    assert DEFAULT_LAMBDA_REL_SD == 0.15
    assert bool(se.estimated[0]) and int(se.method[0]) == METHOD_STRUCTURE
    text = se.description(0)
    for part in ("est_bonds", "bond data", "two-sphere", "water", "15 % SD", "247"):
        assert part in text


def test_structural_estimate_uses_the_target_solvent(lambda_set):
    # lambda_in + lambda_out: lambda_out follows the target's Pekar factor; no carrying needed.
    w, m = _at(lambda_set, ["est_lin"], "water"), _at(lambda_set, ["est_lin"], "acetonitrile")
    # a = 4.5 A: lambda_out = 1389.354/9 * P: the difference is 154.373 * (0.550433 - 0.527765) = 3.499 kJ/mol.
    diff = float(w.lambda_J[0] - m.lambda_J[0])
    assert diff / 1e3 == pytest.approx(C_KJ_A / 9.0 * (P_WATER - P_MECN), rel=1e-5)
    assert diff / 1e3 == pytest.approx(3.499, abs=2e-3)
    assert float(w.lambda_in_J[0]) == float(m.lambda_in_J[0]) == 40.0e3


def test_lambda_total_and_kappa_el(lambda_set):
    se = _at(lambda_set, ["est_total", "est_nonad", "est_kappa"], "water")
    assert int(se.method[0]) == METHOD_LAMBDA_TOTAL
    w = _work(2, 1, 7.0, 78.30334, 0.1)
    assert float(se.ln_k[0]) == pytest.approx(LN_Z - (w + 150e3 / 4) / RT, abs=1e-4)
    assert float(se.ln_k_sd[0]) == pytest.approx(0.15 * 150e3 / (4 * RT), rel=1e-9)
    # est_nonad and est_kappa have the same lambda (lambda_in 20 + same lambda_out): they differ by kappa_el only.
    # k_self = kappa_el Z exp(-(w + lambda/4)/RT): ln k differs by ln(0.1) - ln(0.01) = ln 10.
    assert float(se.ln_k[1] - se.ln_k[2]) == pytest.approx(math.log(DEFAULT_KAPPA_EL_NON_ADIABATIC / 0.01), abs=1e-9)
    lam = float(se.lambda_J[1])
    assert float(se.ln_k[1]) == pytest.approx(
        math.log(0.1) + LN_Z - (_work(3, 2, 7.0, 78.30334, 0.1) + lam / 4) / RT, abs=1e-4
    )
    # The defaulted kappa_el adds its SD (0.5 in log10) in quadrature; the given one adds nothing.
    base = 0.15 * lam / (4 * RT)
    assert float(se.ln_k_sd[1]) == pytest.approx(math.hypot(base, DEFAULT_KAPPA_EL_LOG10_SD * LN10), rel=1e-9)
    assert float(se.ln_k_sd[2]) == pytest.approx(base, rel=1e-9)
    assert "non-adiabatic" in se.description(1) and "kappa_el = 0.01 (given)" in se.description(2)


def test_measured_in_its_own_solvent_is_unchanged(lambda_set):
    # Same solvent: exactly the lead's carry_ln_k_self (lambda held fixed), default SD 0.3 in log10.
    a = lambda_set.arrays
    i = lambda_set.index_of(["meas_w"])
    se = _at(lambda_set, ["meas_w"], "water", I=0.5)
    expected = carry_ln_k_self(
        a.ln_k_self[i], a.z_ox[i], a.z_red[i], a.radius_m[i], a.T0_K[i], a.I0_M[i], 78.30334375, T, 0.5,
        78.30334375, LN_Z,
    )
    assert float(se.ln_k[0]) == pytest.approx(float(expected[0]), abs=1e-12)
    assert float(se.ln_k_sd[0]) == pytest.approx(DEFAULT_K_SELF_LOG10_SD * LN10, rel=1e-12)
    assert int(se.method[0]) == METHOD_MEASURED and not se.estimated[0] and se.description(0) == ""


def test_measured_carried_to_another_solvent_hand_calculation(lambda_set):
    # meas_w_plain: k_self 1e3 in water, charges +1/0 (so no work term anywhere), a = 4.0 A, no lambda_in data.
    # lambda_in kept = lambda(measured) - two-sphere lambda_out(water), so only lambda_out moves:
    #   lambda_out(water) = 1389.354/8 * 0.550433 = 173.669 * 0.550433 = 95.593 kJ/mol;
    #   rescaled by P(MeCN)/P(water) = 0.527765/0.550433: shift = 173.669 * (0.527765 - 0.550433) = -3.937 kJ/mol;
    #   ln k changes by -shift/(4RT) = 3937/(4 * 2478.96) = 0.3970, i.e. log10 k_self 3 -> 3.1724.
    se = _at(lambda_set, ["meas_w_plain"], "acetonitrile")
    shift = C_KJ_A / 8.0 * (P_MECN - P_WATER) * 1e3
    assert shift / 1e3 == pytest.approx(-3.937, abs=1e-3)
    assert float(se.lambda_shift_J[0]) == pytest.approx(shift, rel=1e-5)
    assert float(se.ln_k[0]) / LN10 == pytest.approx(3.0 - shift / (4 * RT) / LN10, abs=1e-6)
    assert float(se.ln_k[0]) / LN10 == pytest.approx(3.1724, abs=2e-4)
    # SD: the measured 0.3 (log10, default) and 15 % of the shift, in quadrature.
    sd = math.hypot(0.3 * LN10, 0.15 * abs(shift) / (4 * RT))
    assert float(se.ln_k_sd[0]) == pytest.approx(sd, rel=1e-6)
    assert int(se.method[0]) == METHOD_MEASURED_OTHER_SOLVENT and not se.estimated[0]
    text = se.description(0)
    for part in ("meas_w_plain", "water to acetonitrile", "Pekar", "0.550 -> 0.528", "work term recomputed"):
        assert part in text


def test_carried_with_inner_data_rescales_the_measured_outer_part(lambda_set):
    # meas_w gives bonds (lambda_in 138.186 kJ/mol): the outer part of its measured lambda is
    # lambda(measured) - lambda_in, and that is what the Pekar ratio rescales.
    se_w = _at(lambda_set, ["meas_w"], "water")
    se_m = _at(lambda_set, ["meas_w"], "acetonitrile")
    lam_meas = float(se_w.lambda_J[0])
    # lambda(measured) = 4 (RT ln(Z/k) - w0), k = 4, z = +3/+2, a = 3.5 A, water, 0.1 M.
    w0 = _work(3, 2, 7.0, 78.30334375, 0.1)
    assert lam_meas == pytest.approx(4 * (RT * (LN_Z - math.log(4.0)) - w0), rel=1e-6)
    outer = lam_meas - 138.186e3
    assert float(se_m.lambda_shift_J[0]) == pytest.approx(outer * (P_MECN / P_WATER - 1), rel=1e-4)
    w_t = _work(3, 2, 7.0, 35.94, 0.1)
    expected = LN_Z - (w_t + (lam_meas + outer * (P_MECN / P_WATER - 1)) / 4) / RT
    assert float(se_m.ln_k[0]) == pytest.approx(expected, abs=1e-4)
    assert "bond data" in se_m.description(0)


def test_carrying_there_and_back_returns_the_measurement(lambda_set, make):
    # Consistency (follows from the rescaling rule): carry water -> acetonitrile, enter the result as a
    # measurement in acetonitrile, carry it back: the original k_self comes back.
    there = _at(lambda_set, ["meas_w_plain"], "acetonitrile")
    k_mecn = math.exp(float(there.ln_k[0]))
    back_set = CoupleSet(
        [make("x", k_self=k_mecn, charge_ox=1, charge_red=0, radius=4.0, medium="acetonitrile")]
    )
    back = _at(back_set, ["x"], "water")
    assert float(back.ln_k[0]) == pytest.approx(math.log(1e3), abs=1e-9)


def test_medium_not_given_keeps_each_couple_in_its_own_solvent(lambda_set):
    # Backward compatible: without `medium`, a measured k_self is not carried across solvents.
    idx = lambda_set.index_of(["meas_mecn"])
    se = self_exchange_at(lambda_set, idx, T, 0.1, 35.94, LN_Z)
    assert int(se.method[0]) == METHOD_MEASURED
    assert float(se.ln_k[0]) == pytest.approx(math.log(5e6), abs=1e-9)  # +1/0: no work term, same T and I


def test_no_rate_data_is_nan_with_a_reason(lambda_set):
    se = _at(lambda_set, ["bare", "est_bonds"], "water")
    assert np.isnan(se.ln_k[0]) and np.isnan(se.ln_k_sd[0])
    assert int(se.method[0]) == METHOD_NONE
    assert "bare" in se.reason[0] and "lambda_in" in se.reason[0] and "bonds" in se.reason[0]
    assert se.reason[1] == ""


def test_per_entry_media_and_repeated_indices(lambda_set):
    # The batch path passes one medium per entry and repeats couples: each entry matches its scalar call.
    ids = ["meas_w_plain", "est_bonds", "meas_w_plain", "est_lin"]
    media = np.array(["acetonitrile", "water", "water", "acetonitrile"], dtype=object)
    eps = np.array([float(get_solvent(m).permittivity(T)) for m in media])
    se = self_exchange_at(lambda_set, lambda_set.index_of(ids), T, 0.1, eps, LN_Z, medium=media)
    for k, (cid, m) in enumerate(zip(ids, media, strict=True)):
        one = _at(lambda_set, [cid], m)
        assert float(se.ln_k[k]) == pytest.approx(float(one.ln_k[0]), abs=1e-12)
        assert float(se.ln_k_sd[k]) == pytest.approx(float(one.ln_k_sd[0]), abs=1e-12)


def test_inferred_inner_part_is_never_negative(make):
    # k_self 1e9 (charges +1/0, no work term): lambda(measured) = 4 RT ln(Z/k) = 4 * 2478.96 * ln(100)
    # = 45.664 kJ/mol, below the two-sphere lambda_out in water (1389.354/7 * 0.550433 = 109.25 kJ/mol).
    # Rule: the inferred inner part is 0, so all 45.664 kJ/mol is rescaled by P(MeCN)/P(water):
    # shift = 45.664 * (0.527765/0.550433 - 1) = -1.881 kJ/mol (not 109.25 * (...) = -4.499).
    cs = CoupleSet([make("fast", k_self=1e9, charge_ox=1, charge_red=0)])
    se = _at(cs, ["fast"], "acetonitrile")
    lam_meas = 4 * RT * math.log(100.0)
    assert float(se.lambda_shift_J[0]) == pytest.approx(lam_meas * (P_MECN / P_WATER - 1), rel=1e-5)
    assert float(se.lambda_shift_J[0]) / 1e3 == pytest.approx(-1.881, abs=1e-3)
    assert float(se.lambda_in_J[0]) == pytest.approx(0.0, abs=1e-6)
    assert "at least 0" in se.description(0)
