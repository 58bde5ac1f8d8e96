"""Warnings where a prediction leaves the range its parts were made for (water correlations, Debye-Hueckel
screening, large W12), and the statement that Z is held constant in temperature."""

import math

import pytest
from scipy import constants as sc

from crossrate.core.solvents import get_solvent
from crossrate.library.couple import Couple
from crossrate.library.couple_set import CoupleSet
from crossrate.services.conditions import Conditions
from crossrate.services.prediction import predict


def _c(cid, zox, E, k, radius=5.0):
    return Couple(id=cid, name=cid, charge_ox=zox, charge_red=zox - 1, E=E, E_scale="SHE", radius=radius,
                  medium="water", ionic_strength=0.1, temperature=298.15, source="invented for a test", k_self=k,
                  verified=True, dE_dT=0.0)


@pytest.fixture
def cs():
    return CoupleSet([_c("p1", 1, 0.5, 1e5), _c("p0", 1, 0.2, 1e5), _c("tri", 3, 0.4, 1e3, 6.0),
                      _c("ani", -3, 0.2, 1e4, 6.0)])


def _has(p, start):
    return any(w.startswith(start) for w in p.warnings)


def test_water_correlations_outside_their_fitted_range(cs):
    # Malmberg & Maryott (1956) fitted water's permittivity on 0-100 degC (from memory); the Vogel viscosity fit
    # is used over the same range (README). 380 K is outside, 360 K and 275 K inside, 270 K outside.
    for T, outside in ((380.0, True), (360.0, False), (275.0, False), (270.0, True)):
        p = predict(cs, "p1", "p0", Conditions(temperature_K=T), samples=0)
        assert _has(p, "water: the permittivity (Malmberg-Maryott) and viscosity (Vogel)") == outside


def test_debye_huckel_screening_far_past_its_range(cs):
    start = "Debye-Hueckel screening of the work terms used far past its range"
    # Dilute solutions, I up to about 0.1 M (common practice): 1+/0 couples are warned only past 0.5 M ...
    assert not _has(predict(cs, "p1", "p0", Conditions(ionic_strength_M=0.3), samples=0), start)
    assert _has(predict(cs, "p1", "p0", Conditions(ionic_strength_M=1.0), samples=0), start)
    # ... a 3+/2+ with a 3-/4- couple (|z1 z2| up to 12) already past 0.1 M.
    assert not _has(predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.1), samples=0), start)
    p = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.2), samples=0)
    assert _has(p, start) and "|z1 z2| = 12" in next(w for w in p.warnings if w.startswith(start))


def test_large_work_term_factor(cs):
    # Debye-Hueckel-Bronsted work terms, w = z1 z2 e^2 N_A / (4 pi eps0 eps r (1 + kappa r)) (textbook form,
    # scipy.constants), at I = 0 (kappa = 0): ln W12 = -(w12 + w21 - w11 - w22) / 2RT. For 3+/2+ (a = 6 A) with
    # 3-/4- (a = 6 A): z products 3 x -4, 2 x -3 (r12 = 12 A) and 3 x 2, -3 x -4 (r = 12 A): ln W12 = +36 u / 2RT
    # with u = e^2 N_A / (4 pi eps0 eps 12 A), about 11: far past ln 10.
    T = 298.15
    eps = float(get_solvent("water").permittivity(T))
    u = sc.e**2 * sc.N_A / (4 * math.pi * sc.epsilon_0 * eps * 12e-10)
    expected = 36 * u / (2 * sc.R * T)
    p = predict(cs, "tri", "ani", Conditions(ionic_strength_M=0.0), samples=0)
    assert p.ln_W12 == pytest.approx(expected, rel=1e-9)
    warn = [w for w in p.warnings if w.startswith("ln W12 = ")]
    assert len(warn) == 1 and "the answer rests mostly on them" in warn[0]
    assert not _has(predict(cs, "p1", "p0", samples=0), "ln W12 = ")


def test_help_and_readme_say_Z_is_constant_in_temperature(capsys):
    from pathlib import Path

    from crossrate.cli.main import main

    with pytest.raises(SystemExit):
        main(["predict", "--help"])
    text = " ".join(capsys.readouterr().out.split())
    assert "Z is held constant in temperature" in text
    readme = (Path(__file__).resolve().parents[2] / "README.md").read_text(encoding="utf-8")
    assert "held constant in temperature" in readme
