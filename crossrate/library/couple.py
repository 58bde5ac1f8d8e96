"""The Couple record as stored in a library file (user units), and where it came from."""

import datetime
from dataclasses import MISSING, dataclass, field, fields


@dataclass(frozen=True)
class Origin:
    """Where a couple was read: file path, line of its [couple.<id>] table, layer name, and field lines."""

    path: str
    line: int
    layer: str = "cli"
    field_lines: tuple[tuple[str, int], ...] = ()

    def line_of(self, name: str) -> int:
        """Line of a field in the file (the table's line when the field is absent)."""
        return dict(self.field_lines).get(name, self.line)

    def __str__(self) -> str:
        return f"{self.path}:{self.line}"


@dataclass(frozen=True)
class BondSet:
    """A set of equivalent bonds that change length on electron transfer (inner-sphere reorganization).

    count: number of bonds; delta_d: bond-length change between ox and red forms, angstrom;
    f_ox, f_red: force constants of the bond in the two forms, N/m.
    """

    count: int
    delta_d: float
    f_ox: float
    f_red: float


@dataclass(frozen=True)
class Couple:
    """One redox couple Ox/Red, in the units of the library format.

    E, E_sd in V on scale E_scale; E_ionic_strength (ionic strength E was measured at; None: ionic_strength)
    in mol/L; dE_dT (temperature coefficient of E) in mV/K; k_self in M^-1 s^-1; k_self_log10_sd in log10
    units; dH_self, lambda_in, lambda_total in kJ/mol; radius in angstrom; molar_mass in g/mol; ionic_strength
    in mol/L; temperature in K; E00 in eV; hbar_omega (the high-frequency mode of the semiclassical model) in
    cm^-1.
    doi: DOI of the source ("10.NNNN/suffix"); date: when the values were entered or last checked.
    """

    id: str
    name: str
    charge_ox: int
    charge_red: int
    E: float
    E_scale: str
    radius: float
    medium: str
    ionic_strength: float
    temperature: float
    source: str
    E_sd: float | None = None
    E_ionic_strength: float | None = None
    dE_dT: float | None = None
    k_self: float | None = None
    k_self_log10_sd: float | None = None
    dH_self: float | None = None
    E00: float | None = None
    excited_form: str | None = None
    lambda_in: float | None = None
    lambda_total: float | None = None
    bonds: tuple[BondSet, ...] = ()
    hbar_omega: float | None = None
    kappa_el: float | None = None
    molar_mass: float | None = None
    doi: str | None = None
    date: datetime.date | None = None
    notes: str = ""
    tags: tuple[str, ...] = ()
    verified: bool = False
    invented: bool = False
    origin: Origin | None = field(default=None, compare=False)

    def __post_init__(self):
        # A couple made in code is held to the library's rules (LibraryError listing every problem).
        from .couple_check import check_built_couple

        check_built_couple(self)

    @classmethod
    def trusted(cls, **values) -> "Couple":
        """A Couple from values validation.validate_couple has just checked (no second check: a 10,000-couple
        file builds 10,000 of them). Not for values from anywhere else."""
        obj = cls.__new__(cls)
        d = obj.__dict__
        d.update(_DEFAULTS)
        d.update(values)
        return obj

    @property
    def effective_E(self) -> float:
        """Potential (V, on E_scale) of the form that reacts: ground state, or excited state when E00 is given.

        Excited oxidized form: E(*Ox/Red) = E + E00; excited reduced form: E(Ox/*Red) = E - E00 (with E00 in eV,
        numerically volts for one electron; Rehm-Weller style estimate, entropy and work terms neglected).
        """
        if self.E00 is None:
            return self.E
        return self.E + self.E00 if self.excited_form == "ox" else self.E - self.E00

    @property
    def provenance(self) -> str:
        """'invented' (made-up values), 'unverified' (recalled or estimated) or 'verified'."""
        if self.invented:
            return "invented"
        return "verified" if self.verified else "unverified"

    @property
    def has_rate_data(self) -> bool:
        """True when the couple gives a self-exchange rate or enough to estimate its reorganization energy."""
        return self.k_self is not None or self.lambda_total is not None or self.lambda_in is not None or bool(self.bonds)


_DEFAULTS = {f.name: f.default for f in fields(Couple) if f.default is not MISSING}

#: Field names in file order (id and origin are not fields of the TOML table).
COUPLE_FIELDS = tuple(f.name for f in fields(Couple) if f.name not in ("id", "origin"))
