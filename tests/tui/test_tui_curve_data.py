"""The data behind the two pictures: crossrate.core.energy_surfaces and crossrate.services.curves."""

import math

import numpy as np
import pytest
from tui_fixtures import small_couples

from crossrate.core.energy_surfaces import free_energy_surfaces, surface_crossing
from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.curves import driving_force_curve, energy_surfaces
from crossrate.services.prediction import predict

R = 8.314462618  # J/(mol K), CODATA 2018 molar gas constant (scipy.constants.R)


def test_crossing_of_the_parabolas_worked_example():
    # Marcus parabolic free-energy surfaces (Marcus 1956; e.g. Atkins' Physical Chemistry, electron transfer):
    # G_R = λx², G_P = λ(x-1)² + ΔG. Worked by hand for λ = 100, ΔG = -20 (kJ/mol):
    # λx² = λ(x-1)² + ΔG  ->  0 = -2λx + λ + ΔG  ->  x* = (100 - 20)/200 = 0.4, G* = 100 * 0.16 = 16.
    x, g = surface_crossing(100.0, -20.0)
    assert x == pytest.approx(0.4, rel=0, abs=1e-12)
    assert g == pytest.approx(16.0, rel=0, abs=1e-12)
    gr, gp = free_energy_surfaces(np.array([x]), 100.0, -20.0)
    assert gr[0] == pytest.approx(gp[0], abs=1e-12)


def test_lambda_and_driving_force_read_off_the_surfaces():
    # λ is the reactant surface at the product geometry, ΔG°' the product minimum (definitions, Marcus 1956).
    gr, gp = free_energy_surfaces(np.array([0.0, 1.0]), 150.0, -30.0)
    assert gr.tolist() == pytest.approx([0.0, 150.0], abs=1e-12)
    assert gp.tolist() == pytest.approx([150.0 - 30.0, -30.0], abs=1e-12)


def test_inverted_region_crossing_lies_behind_the_reactant_minimum():
    # -ΔG > λ: x* = (λ + ΔG)/(2λ) = (100 - 150)/200 = -0.25 < 0 (Marcus inverted region).
    x, g = surface_crossing(100.0, -150.0)
    assert x == pytest.approx(-0.25, abs=1e-12)
    assert g == pytest.approx(6.25, abs=1e-12)  # 100 * 0.0625
    with pytest.raises(ValueError):
        surface_crossing(0.0, -1.0)


@pytest.fixture
def pair():
    cs = CoupleSet(small_couples())
    return predict(cs, "hl-osmium", "hl-vanadium", Conditions(), samples=0)


def test_driving_force_curve_passes_through_the_pair(pair):
    c = driving_force_curve(pair)
    assert c.pair_x_kJ == pytest.approx(-pair.dG0_prime_kJ_per_mol, abs=1e-12)
    # The cross relation and its barrier form are the same model (Marcus 1965: with λ12 = (λ11 + λ22)/2 and
    # λii from k_ii, ln k12 = ln Z - ΔG‡/RT), so the drawn curve meets the predicted k_act. Linear interpolation
    # on a 601-point grid of a parabola in ln k: error <= h² max|y''|/8 with h ~ 1 kJ/mol -> well below 1e-3.
    y = np.interp(c.pair_x_kJ, c.minus_dG0_prime_kJ, c.log10_k_act)
    assert y == pytest.approx(pair.log10_k_act, abs=1e-3)
    y_obs = np.interp(c.pair_x_kJ, c.minus_dG0_prime_kJ, c.log10_k_obs)
    assert y_obs == pytest.approx(pair.log10_k_obs, abs=1e-3)


def test_driving_force_curve_top_and_cap(pair):
    c = driving_force_curve(pair)
    T = pair.conditions.temperature_K
    # The activation-controlled maximum is at -ΔG°' = λ12 where ΔG‡ = w12: log10 k = log10 Z - w12/(RT ln 10).
    i = int(np.argmax(c.log10_k_act))
    h = c.minus_dG0_prime_kJ[1] - c.minus_dG0_prime_kJ[0]
    assert abs(c.minus_dG0_prime_kJ[i] - pair.lambda_kJ_per_mol) <= h
    top = math.log10(pair.conditions.Z) - pair.work_kJ_per_mol.w12 * 1e3 / (R * T * math.log(10))
    assert c.log10_k_act[i] == pytest.approx(top, abs=1e-4)
    # 1/k_obs = 1/k_act + 1/k_D puts k_obs below both (diffusion cap, Noyes 1961).
    assert np.all(c.log10_k_obs < c.log10_k_act + 1e-12)
    assert np.all(c.log10_k_obs < c.log10_k_diff + 1e-12)


def test_regions_follow_the_regime_rule(pair):
    c = driving_force_curve(pair)
    assert [r.name for r in c.regions] == ["endergonic", "normal", "activationless", "inverted"]
    h = c.minus_dG0_prime_kJ[1] - c.minus_dG0_prime_kJ[0]
    lam, RT = pair.lambda_kJ_per_mol, R * pair.conditions.temperature_K / 1e3
    # Band of 1 RT around the top: (λ/4)(1 + ΔG/λ)² <= RT  <=>  |ΔG + λ| <= 2 sqrt(λ RT) (crossrate.core.regime).
    half = 2.0 * math.sqrt(lam * RT)
    assert c.regions[0].high_kJ == pytest.approx(0.0, abs=h)
    assert c.regions[2].low_kJ == pytest.approx(lam - half, abs=h)
    assert c.regions[2].high_kJ == pytest.approx(lam + half, abs=h)
    assert c.regions[0].low_kJ == c.minus_dG0_prime_kJ[0] and c.regions[-1].high_kJ == c.minus_dG0_prime_kJ[-1]


def test_energy_surfaces_of_a_prediction(pair):
    s = energy_surfaces(pair)
    lam, dG = pair.lambda_kJ_per_mol, pair.dG0_prime_kJ_per_mol
    assert s.x_cross == pytest.approx((lam + dG) / (2 * lam), abs=1e-12)
    # ΔG‡ = w12 + (λ/4)(1 + ΔG°'/λ)² (Marcus quadratic barrier) is what the prediction reports.
    assert s.dG_act_kJ == pytest.approx(pair.dG_act_kJ_per_mol, abs=1e-9)
    assert s.x[0] < min(0.0, s.x_cross) and s.x[-1] > max(1.0, s.x_cross)


def test_measured_mark_beside_the_pair_mark_when_they_share_a_cell(pair):
    from crossrate.tui.widgets.rate_curve_plot import curve_lines

    curve = driving_force_curve(pair)
    # a measured value equal to the prediction falls in the pair's own cell: both marks must stay visible
    lines = curve_lines(curve, 80, 20, "kJ/mol", measured=pair.log10_k_obs).plain.splitlines()
    row = next(ln for ln in lines if "●" in ln)
    assert "●x" in row
    # six decades below: the x sits lower in the plot than the dot (rows below the title, above the axis)
    lines = curve_lines(curve, 80, 20, "kJ/mol", measured=pair.log10_k_obs - 6).plain.splitlines()[1:-3]
    dot_row = next(i for i, ln in enumerate(lines) if "●" in ln)
    x_rows = [i for i, ln in enumerate(lines) if "x" in ln[7:]]
    assert x_rows and all(i > dot_row for i in x_rows)
