"""Handbook facts: Smoluchowski limit, Debye length in water, reference-electrode offsets vs SHE."""

import math

import numpy as np
import pytest

from crossrate.core.constants import GAS_CONSTANT
from crossrate.core.diffusion import ln_k_diffusion, stokes_einstein_diffusion
from crossrate.core.potential_scales import PotentialScale, ScaleRegistry, builtin_scales
from crossrate.core.solvents import get_solvent
from crossrate.core.work_terms import debye_kappa, work_term

T25 = 298.15


@pytest.mark.parametrize("radius_A", [2.0, 5.0, 12.0])
def test_smoluchowski_limit_equal_neutral_spheres_in_water(radius_A):
    # Source: P. Atkins & J. de Paula, Physical Chemistry (chapter on reactions in solution, from memory):
    # for equal spheres with Stokes-Einstein D, k_D = 4 pi N_A (2D)(2a) = 8RT/(3 eta), independent of a;
    # water at 25 degC (eta = 0.890 mPa s): 8 x 8.3145 x 298.15 / (3 x 0.890e-3) = 7.43e6 m^3 mol^-1 s^-1
    # = 7.4e9 M^-1 s^-1.
    eta = get_solvent("water").viscosity_mPa_s * 1e-3
    a = radius_A * 1e-10
    D = stokes_einstein_diffusion(a, eta, T25)
    k = math.exp(float(ln_k_diffusion(D, D, 2 * a, 0.0, T25)))
    assert k == pytest.approx(8 * GAS_CONSTANT * T25 / (3 * eta) * 1e3, rel=1e-12)
    assert k == pytest.approx(7.4e9, rel=0.01)


def test_smoluchowski_with_water_correlation_at_25C():
    # Same handbook figure (Atkins, from memory) with the Vogel viscosity of water at 298.15 K instead of
    # the table value: within 1 % of 7.4e9 M^-1 s^-1.
    eta = float(get_solvent("water").viscosity_Pa_s(T25))
    D = stokes_einstein_diffusion(4e-10, eta, T25)
    assert math.exp(float(ln_k_diffusion(D, D, 8e-10, 0.0, T25))) == pytest.approx(7.4e9, rel=0.01)


def test_stokes_einstein_value():
    # Source: Stokes-Einstein relation D = k_B T / (6 pi eta a) (Einstein 1905). For a = 3 angstrom in water
    # at 25 degC: 1.380649e-23 x 298.15 / (6 pi x 0.890e-3 x 3e-10) = 8.18e-10 m^2/s.
    assert stokes_einstein_diffusion(3e-10, 0.890e-3, T25) == pytest.approx(8.18e-10, rel=2e-3)


@pytest.mark.parametrize("I", [1e-3, 0.01, 0.1, 1.0])
def test_debye_length_in_water(I):
    # Source: J. Israelachvili, Intermolecular and Surface Forces (Debye length of a 1:1 electrolyte in water
    # at 25 degC, 1/kappa = 0.304 nm / sqrt(I/M), from memory). Tolerance 0.5 %.
    kappa = debye_kappa(I, get_solvent("water").eps_s, T25)
    assert 1.0 / kappa * math.sqrt(I) == pytest.approx(0.304e-9, rel=0.005)


def test_debye_kappa_zero_ionic_strength_and_scaling():
    # Debye-Hueckel theory: kappa^2 is proportional to I / (eps T).
    assert debye_kappa(0.0, 78.36, T25) == 0.0
    k1, k4 = debye_kappa(np.array([0.1, 0.4]), 78.36, T25)
    assert k4 / k1 == pytest.approx(2.0, rel=1e-14)
    assert debye_kappa(0.1, 78.36, T25) / debye_kappa(0.1, 4 * 78.36, T25) == pytest.approx(2.0, rel=1e-14)


def test_coulomb_work_unscreened_value():
    # Source: Coulomb's law with scipy.constants: e^2 N_A / (4 pi eps0 x 1 angstrom) = 1389.35 kJ/mol
    # (common textbook value 1389.35 kJ mol^-1 angstrom). For z1 z2 = +2 at 6 angstrom in water (eps 78.36),
    # I = 0: w = 2 x 1389.35 / (78.36 x 6) = 5.910 kJ/mol.
    w = work_term(1, 2, 6e-10, 78.36, T25, 0.0)
    assert w == pytest.approx(2 * 1389.35e3 / (78.36 * 6), rel=1e-5)
    # Attraction is negative, neutral partners do no work.
    assert work_term(-1, 2, 6e-10, 78.36, T25, 0.0) == pytest.approx(-w, rel=1e-15)
    assert work_term(0, 3, 6e-10, 78.36, T25, 0.5) == 0.0


def test_work_term_screening_factor():
    # Debye-Hueckel-Brønsted form: w(I) / w(0) = 1 / (1 + kappa r).
    r, eps = 7e-10, 78.36
    kappa = debye_kappa(0.5, eps, T25)
    ratio = work_term(2, 3, r, eps, T25, 0.5) / work_term(2, 3, r, eps, T25, 0.0)
    assert ratio == pytest.approx(1.0 / (1.0 + kappa * r), rel=1e-14)


def test_reference_electrodes_vs_SHE():
    # Source: A. J. Bard & L. R. Faulkner, Electrochemical Methods, 2nd ed. (2001), reference-electrode table
    # (from memory): SCE +0.241 V, Ag/AgCl (saturated KCl) +0.197 V vs SHE at 25 degC.
    reg = ScaleRegistry()
    assert reg.resolve("SCE") == ("SHE", pytest.approx(0.241, abs=1e-9))
    assert reg.resolve("AgCl-sat") == ("SHE", pytest.approx(0.197, abs=1e-9))
    assert reg.convert(0.0, "SCE", "SHE") == pytest.approx(0.241, abs=1e-12)
    assert reg.convert(0.0, "AgCl-sat", "SHE") == pytest.approx(0.197, abs=1e-12)
    # SCE vs Ag/AgCl (sat. KCl): 0.241 - 0.197 = 0.044 V.
    assert reg.convert(0.0, "SCE", "AgCl-sat") == pytest.approx(0.044, abs=1e-12)
    assert reg.convert(0.5, "SHE", "SCE") == pytest.approx(0.5 - 0.241, abs=1e-12)


def test_agcl_3M_above_saturated():
    # Source: Bard & Faulkner (from memory): Ag/AgCl in 3 M KCl is about +0.21 V vs SHE, above the saturated
    # electrode (+0.197 V) because a lower chloride activity raises the potential (Nernst equation).
    off = ScaleRegistry().resolve("AgCl-3M")[1]
    assert 0.197 < off <= 0.215


def test_builtin_scales_have_sources():
    scales = builtin_scales()
    assert {"SHE", "SCE", "AgCl-sat", "AgCl-3M"} <= set(scales)
    assert all(s.source.strip() for s in scales.values())


def test_library_scale_chains_and_unrelated_roots_are_refused():
    fc = PotentialScale("Fc-MeCN", "ferrocenium/ferrocene in MeCN", "Fc-MeCN", 0.0, "invented root")
    sce_child = PotentialScale("my-ref", "lab reference", "SCE", 0.1, "invented")
    reg = ScaleRegistry({"Fc-MeCN": fc, "my-ref": sce_child})
    # Offsets add along the chain: E(SHE) = E(my-ref) + 0.1 + 0.241.
    assert reg.resolve("my-ref") == ("SHE", pytest.approx(0.341, abs=1e-12))
    assert reg.convert(0.0, "my-ref", "AgCl-sat") == pytest.approx(0.341 - 0.197, abs=1e-12)
    with pytest.raises(ValueError, match="cannot be related"):
        reg.convert(0.0, "Fc-MeCN", "SHE")
    cyc = ScaleRegistry({
        "a": PotentialScale("a", "a", "b", 0.1, "invented"),
        "b": PotentialScale("b", "b", "a", 0.1, "invented"),
    })
    with pytest.raises(ValueError, match="cycle"):
        cyc.resolve("a")
