"""Physical constants of the core are the CODATA values scipy.constants ships (written in the core so a cold
start does not import scipy; these tests keep the two the same)."""

import math

import pytest
import scipy.constants as sc

from crossrate.core import constants as C


def test_constants_are_scipy_codata_values():
    # Source: scipy.constants (CODATA recommended values, as shipped with scipy). Identity, not closeness, for
    # the constants the 2019 SI makes exact (e, N_A, k, h) and those defined from them (F = e N_A, R = N_A k).
    assert C.GAS_CONSTANT == sc.R
    assert C.AVOGADRO == sc.N_A
    assert C.ELEMENTARY_CHARGE == sc.e
    assert C.BOLTZMANN == sc.k
    assert C.PLANCK == sc.h
    assert C.FARADAY == sc.physical_constants["Faraday constant"][0]
    # epsilon_0 is measured: CODATA 2022 (scipy >= 1.15) 8.8541878188e-12 F/m, CODATA 2018 8.8541878128e-12 F/m,
    # 6.8e-10 apart relative; identical with a CODATA 2022 scipy, within that step with an older one.
    assert C.VACUUM_PERMITTIVITY == pytest.approx(sc.epsilon_0, rel=1e-9)
    if sc.physical_constants["vacuum electric permittivity"][0] == 8.8541878188e-12:
        assert C.VACUUM_PERMITTIVITY == sc.epsilon_0


def test_cold_import_of_the_core_does_not_load_scipy():
    # The constants are written in the core so `crossrate predict` starts without importing scipy (issue 12).
    import subprocess
    import sys
    from pathlib import Path

    code = "import sys, crossrate.core.constants, crossrate.services.prediction; print('scipy' in sys.modules)"
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, check=True,
                         cwd=Path(__file__).resolve().parents[2])
    assert out.stdout.strip() == "False"


def test_faraday_is_e_times_avogadro():
    # Source: scipy.constants (CODATA); F = e N_A by definition of the Faraday constant.
    assert C.FARADAY == pytest.approx(sc.e * sc.N_A, rel=1e-12)


def test_gas_constant_is_boltzmann_times_avogadro():
    # Source: scipy.constants (CODATA); R = k_B N_A.
    assert C.GAS_CONSTANT == pytest.approx(sc.k * sc.N_A, rel=1e-12)


def test_electronvolt_per_molecule_in_joule_per_mole():
    # Source: scipy.constants; 1 eV per molecule = e (J) x N_A (1/mol) = 96485.33 J/mol (CODATA 2018: e and
    # N_A are exact in the 2019 SI, so e N_A = 1.602176634e-19 x 6.02214076e23 = 96485.33212... J/mol).
    assert C.EV == pytest.approx(sc.e * sc.N_A, rel=1e-12)
    assert C.EV == pytest.approx(1.602176634e-19 * 6.02214076e23, rel=1e-12)


def test_calorie_and_unit_factors():
    # Source: scipy.constants.calorie (thermochemical calorie, 4.184 J exactly).
    assert C.KCAL == pytest.approx(1000.0 * sc.calorie, rel=1e-15)
    # Source: scipy.constants.angstrom (1e-10 m) and scipy.constants.litre (1e-3 m^3).
    assert C.ANGSTROM == pytest.approx(sc.angstrom, rel=1e-15)
    assert C.LITRES_PER_M3 == pytest.approx(1.0 / sc.litre, rel=1e-15)
    assert C.KJ == 1000.0


def test_standard_temperature_and_default_Z():
    # Source: scipy.constants.zero_Celsius (273.15 K); 25 degC = 298.15 K.
    assert C.STANDARD_TEMPERATURE == pytest.approx(sc.zero_Celsius + 25.0, abs=1e-12)
    # Common practice: Z = 1e11 M^-1 s^-1 for bimolecular outer-sphere steps (issue 2, item 5).
    assert math.log10(C.DEFAULT_Z) == pytest.approx(11.0, abs=1e-12)


def test_RT_at_25C_in_kJ_per_mol():
    # Source: scipy.constants; RT at 298.15 K = 8.314462618 x 298.15 = 2478.957 J/mol (CODATA 2018 R).
    assert C.GAS_CONSTANT * 298.15 == pytest.approx(2478.957, abs=1e-3)
