"""Simulated cyclic voltammograms of a one-electron couple at a planar electrode, in laboratory units, and
the peak separation Delta Ep against scan rate.

The solver is crossrate.core.voltammetry (semi-infinite diffusion, implicit finite differences on an
expanding grid). Kinetics: Butler-Volmer (k0, alpha) or Marcus-Hush-Chidsey (k0, lambda_el). The scan starts
at E0' + window with only Ox present, turns at E0' - window and comes back; the window widens by itself until
the cathodic peak lies at least SWITCH_MARGIN_V before the turn. Currents follow the anodic-positive
convention; potentials are relative to E0'.

Where a couple stops looking reversible: the Matsuda-Ayabe criterion (Z. Elektrochem. 1955, as quoted by
Bard & Faulkner; from memory) puts the reversible/quasi-reversible boundary at
Lambda = k0 / (D f v)^1/2 = 15, i.e. above v_rev = k0^2 / (225 D f) the peaks begin to separate.
"""

import math
from dataclasses import dataclass

import numpy as np

from ..core.butler_volmer import butler_volmer_ln_rates
from ..core.constants import FARADAY, GAS_CONSTANT, KJ
from ..core.marcus_hush_chidsey import mhc_ln_rates
from ..core.voltammetry import find_peaks, simulate_cv
from ..errors import ConditionsError
from .electrode_kinetics import check_kinetics

#: Half-width of the first potential window about E0', V; the largest allowed; the margin after the peak.
DEFAULT_WINDOW_V = 0.2
MAX_WINDOW_V = 1.5
SWITCH_MARGIN_V = 0.1
#: Matsuda-Ayabe boundary of reversible behaviour, Lambda = k0/(D f v)^1/2 (from memory, see docstring).
REVERSIBLE_LAMBDA = 15.0
#: Randles-Sevcik coefficient (common practice; Bard & Faulkner): i_p = 0.4463 n F A C (n F v D / RT)^1/2.
RANDLES_SEVCIK = 0.4463
#: Default electrode area (cm^2, a 3 mm disc) and concentration (mM) for absolute currents.
DEFAULT_AREA_CM2 = 0.0707
DEFAULT_CONC_MM = 1.0
#: Default diffusion coefficient when neither a couple nor a value gives one, cm^2/s (common practice).
DEFAULT_D_CM2_S = 1.0e-5


@dataclass(frozen=True)
class CvSetup:
    """A couple at an electrode for simulation. log10_k0 in log10(cm/s); alpha (Butler-Volmer); lambda_el in
    kJ/mol (needed for kinetics 'mhc'); kinetics 'bv' or 'mhc'; D_ox, D_red in cm^2/s; temperature in K;
    area in cm^2; conc: bulk concentration of Ox in mM; Ru: uncompensated resistance in ohm; window: half-width
    of the first potential window, V (None: DEFAULT_WINDOW_V, widened as needed)."""

    log10_k0: float
    D_ox_cm2_s: float = DEFAULT_D_CM2_S
    D_red_cm2_s: float = DEFAULT_D_CM2_S
    alpha: float = 0.5
    lambda_el_kJ_per_mol: float | None = None
    kinetics: str = "bv"
    temperature_K: float = 298.15
    area_cm2: float = DEFAULT_AREA_CM2
    conc_mM: float = DEFAULT_CONC_MM
    Ru_ohm: float = 0.0
    window_V: float | None = None

    def __post_init__(self):
        if self.kinetics not in ("bv", "mhc"):
            raise ConditionsError(f"kinetics {self.kinetics!r}: expected 'bv' (Butler-Volmer) or 'mhc'")
        check_kinetics(self.alpha, self.lambda_el_kJ_per_mol)
        if self.kinetics == "mhc" and self.lambda_el_kJ_per_mol is None:
            raise ConditionsError("Marcus-Hush-Chidsey kinetics need the reorganization energy at the electrode "
                                  "(lambda_el, kJ/mol)")
        checks = (
            ("log10 k0", self.log10_k0, -12.0, 6.0, "log10 cm/s"),
            ("D_ox", self.D_ox_cm2_s, 1e-10, 1e-2, "cm^2/s"),
            ("D_red", self.D_red_cm2_s, 1e-10, 1e-2, "cm^2/s"),
            ("temperature", self.temperature_K, 200.0, 400.0, "K"),
            ("area", self.area_cm2, 1e-8, 1e3, "cm^2"),
            ("concentration", self.conc_mM, 1e-6, 1e4, "mM"),
            ("uncompensated resistance", self.Ru_ohm, 0.0, 1e7, "ohm"),
        )
        for name, value, lo, hi, unit in checks:
            if not (isinstance(value, int | float) and math.isfinite(value) and lo <= value <= hi):
                raise ConditionsError(f"{name} {value!r} {unit}: expected a finite number from {lo:g} to {hi:g}")
        if self.window_V is not None and not (math.isfinite(self.window_V) and 0.05 <= self.window_V <= MAX_WINDOW_V):
            raise ConditionsError(f"window {self.window_V!r} V: expected from 0.05 to {MAX_WINDOW_V:g} V")

    @property
    def f(self) -> float:
        """F/RT, 1/V."""
        return FARADAY / (GAS_CONSTANT * self.temperature_K)

    def psi(self, scan_rate_V_s):
        """Nicholson's kinetic parameter psi = k0 (D_O/D_R)^(alpha/2) / (pi D_O f v)^1/2 (Anal. Chem. 1965)."""
        D = self.D_ox_cm2_s
        ratio = (D / self.D_red_cm2_s) ** (self.alpha / 2.0)
        return 10.0**self.log10_k0 * ratio / np.sqrt(np.pi * D * self.f * np.asarray(scan_rate_V_s, dtype=float))

    def reversible_scan_rate(self) -> float:
        """Scan rate (V/s) above which the couple stops looking reversible: Lambda = k0/(D_O f v)^1/2 = 15."""
        return (10.0**self.log10_k0) ** 2 / (REVERSIBLE_LAMBDA**2 * self.D_ox_cm2_s * self.f)


@dataclass(frozen=True)
class CvTrace:
    """One simulated voltammogram. E_V: applied potential minus E0' (V) per step (forward, then reverse);
    current_uA: current in microampere, anodic positive; Ep_c_V, Ep_a_V: peak potentials vs E0' (V);
    dEp_mV: their separation; ip_c_uA, ip_a_uA: peak currents; psi: Nicholson's parameter;
    ip_randles_sevcik_uA: the reversible peak current; window_V: half-width used."""

    scan_rate_V_s: float
    E_V: np.ndarray
    current_uA: np.ndarray
    Ep_c_V: float
    Ep_a_V: float
    dEp_mV: float
    ip_c_uA: float
    ip_a_uA: float
    psi: float
    ip_randles_sevcik_uA: float
    window_V: float

    def to_dict(self, every: int = 1) -> dict:
        """JSON-ready dict; the trace thinned to every n-th point."""
        return {
            "scan_rate_V_s": self.scan_rate_V_s, "Ep_c_V": self.Ep_c_V, "Ep_a_V": self.Ep_a_V,
            "dEp_mV": self.dEp_mV, "ip_c_uA": self.ip_c_uA, "ip_a_uA": self.ip_a_uA, "psi": self.psi,
            "ip_randles_sevcik_uA": self.ip_randles_sevcik_uA, "window_V": self.window_V,
            "E_V": self.E_V[::every].tolist(), "current_uA": self.current_uA[::every].tolist(),
        }


def _ln_rates(setup: CvSetup, scan_rate: float):
    """ln_rates(theta) for the core solver: rate constants over (D_O f v)^1/2."""
    f = setup.f
    ln_scale = setup.log10_k0 * math.log(10.0) - 0.5 * math.log(setup.D_ox_cm2_s * f * scan_rate)
    if setup.kinetics == "mhc":
        lam = setup.lambda_el_kJ_per_mol * KJ
        return lambda th: mhc_ln_rates(np.asarray(th) / f, ln_scale, lam, setup.temperature_K)
    return lambda th: butler_volmer_ln_rates(np.asarray(th) / f, ln_scale, setup.alpha, setup.temperature_K)


def simulate_voltammogram(setup: CvSetup, scan_rate_V_s: float) -> CvTrace:
    """One cyclic voltammogram at scan rate v (V/s): trace, peaks, Delta Ep, psi and the Randles-Sevcik peak."""
    v = float(scan_rate_V_s)
    if not (math.isfinite(v) and 1e-5 <= v <= 1e6):
        raise ConditionsError(f"scan rate {scan_rate_V_s!r} V/s: expected a number from 1e-05 to 1e+06 V/s")
    f = setup.f
    D = setup.D_ox_cm2_s * 1e-4
    # Current scale n F A C (D_O f v)^1/2, in A: A in m^2, C in mol/m^3 (= mM).
    scale = FARADAY * setup.area_cm2 * 1e-4 * setup.conc_mM * math.sqrt(D * f * v)
    rho = setup.Ru_ohm * scale * f
    ln_rates = _ln_rates(setup, v)
    window = setup.window_V or DEFAULT_WINDOW_V
    while True:
        sim = simulate_cv(window * f, -window * f, ln_rates, setup.D_red_cm2_s / setup.D_ox_cm2_s, rho)
        pk = find_peaks(sim)
        near_turn = not math.isfinite(pk.theta_cathodic) or pk.theta_cathodic / f < -window + SWITCH_MARGIN_V
        if not near_turn or window >= MAX_WINDOW_V:
            break
        window = min(MAX_WINDOW_V, window + 0.15)
    to_uA = scale * 1e6
    return CvTrace(
        scan_rate_V_s=v,
        E_V=sim.theta / f,
        current_uA=-sim.chi * to_uA,
        Ep_c_V=pk.theta_cathodic / f,
        Ep_a_V=pk.theta_anodic / f,
        dEp_mV=pk.separation / f * 1e3,
        ip_c_uA=-pk.chi_cathodic * to_uA,
        ip_a_uA=-pk.chi_anodic * to_uA,
        psi=float(setup.psi(v)),
        ip_randles_sevcik_uA=-RANDLES_SEVCIK * to_uA,
        window_V=window,
    )


@dataclass(frozen=True)
class ScanRateSeries:
    """Delta Ep (mV) and the peak currents against scan rate (V/s), with the reversible limit (V/s)."""

    setup: CvSetup
    traces: tuple[CvTrace, ...]
    reversible_scan_rate_V_s: float

    def records(self) -> list[dict]:
        """One dict per scan rate (no traces)."""
        return [{"scan_rate_V_s": t.scan_rate_V_s, "psi": t.psi, "dEp_mV": t.dEp_mV, "Ep_c_V": t.Ep_c_V,
                 "Ep_a_V": t.Ep_a_V, "ip_c_uA": t.ip_c_uA, "ip_a_uA": t.ip_a_uA} for t in self.traces]

    def to_dict(self, every: int = 10) -> dict:
        from dataclasses import asdict

        return {"setup": asdict(self.setup), "reversible_scan_rate_V_s": self.reversible_scan_rate_V_s,
                "scan_rates": self.records(), "traces": [t.to_dict(every) for t in self.traces]}


def scan_rate_series(setup: CvSetup, scan_rates_V_s) -> ScanRateSeries:
    """Simulated voltammograms at each scan rate (V/s) and the Matsuda-Ayabe reversible limit."""
    rates = [float(x) for x in scan_rates_V_s]
    if not rates:
        raise ConditionsError("no scan rates: expected at least one, in V/s")
    return ScanRateSeries(setup, tuple(simulate_voltammogram(setup, v) for v in rates), setup.reversible_scan_rate())
