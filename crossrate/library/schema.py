"""The library format's field specifications: the single source of truth for validation, docs and forms.

Each couple field has a kind (text, integer, number, boolean, choice, text list, bonds, medium, scale),
a unit, a help text, whether it is required (and whether the `[library]` table may supply a default),
and its accepted range. The validator, `libraries/README.md` and the TUI's editing form all read
`FIELD_SPECS`, so a field is described in one place only.
"""

import difflib
import math
from dataclasses import dataclass

#: Current version of the file format (`format = 1` in the `[library]` table).
FORMAT_VERSION = 1

#: Characters allowed in a couple id (and the rule in words, for messages).
ID_CHARS = frozenset("abcdefghijklmnopqrstuvwxyz0123456789._-")
ID_RULE = "lower-case letters, digits, '.', '_' and '-' only"
#: Characters allowed in a custom scale key (mixed case allowed: Fc-MeCN).
SCALE_KEY_CHARS = frozenset("ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789._-+")


@dataclass(frozen=True)
class FieldSpec:
    """One field of a `[couple.<id>]` table.

    kind: "text", "integer", "number", "boolean", "choice", "text list", "bonds", "medium", "scale", "doi" or
    "date".
    unit: unit text for labels and messages ("" when dimensionless or not a number).
    low, high: accepted range for numbers/integers (None: unbounded); low_open/high_open exclude the bound.
    library_default: the `[library]` table may give a default (medium, temperature, E_scale).
    choices: accepted values of a "choice" field.
    """

    name: str
    kind: str
    unit: str
    help: str
    required: bool = False
    low: float | None = None
    high: float | None = None
    low_open: bool = False
    high_open: bool = False
    library_default: bool = False
    choices: tuple[str, ...] = ()

    @property
    def label(self) -> str:
        """Form label: name with its unit, e.g. 'radius (Å)'."""
        return f"{self.name} ({self.unit})" if self.unit else self.name

    def in_range(self, value: float) -> bool:
        """True when a finite number lies in the field's accepted range."""
        lo, hi = self.low, self.high
        if lo is not None and (value <= lo if self.low_open else value < lo):
            return False
        if hi is not None and (value >= hi if self.high_open else value > hi):
            return False
        return True

    def range_text(self) -> str:
        """The accepted range in words, e.g. 'from 1 to 30 angstrom' or 'greater than 0 M^-1 s^-1'."""
        unit = f" {self.unit}" if self.unit else ""
        lo, hi = self.low, self.high
        if lo is not None and hi is not None:
            if self.low_open and not self.high_open:
                return f"greater than {lo:g} and at most {hi:g}{unit}"
            if not self.low_open and not self.high_open:
                return f"from {lo:g} to {hi:g}{unit}"
            return f"between {lo:g} and {hi:g}{unit}"
        if lo is not None:
            return f"{'greater than' if self.low_open else 'at least'} {lo:g}{unit}"
        if hi is not None:
            return f"{'less than' if self.high_open else 'at most'} {hi:g}{unit}"
        return f"in {self.unit}" if self.unit else ""

    def expected(self) -> str:
        """What a valid value looks like, for the 'expected ...' half of a message."""
        if self.kind == "number":
            return f"a finite number {self.range_text()}".rstrip()
        if self.kind == "integer":
            return f"a whole number {self.range_text()}".rstrip()
        if self.kind == "text":
            return "non-empty text in quotes" if self.required else "text in quotes"
        if self.kind == "boolean":
            return "true or false"
        if self.kind == "choice":
            return " or ".join(f'"{c}"' for c in self.choices)
        if self.kind == "text list":
            return 'a list of text, e.g. ["aqua", "spin-change"]'
        if self.kind == "bonds":
            return BONDS_EXPECTED
        if self.kind == "medium":
            return "a solvent key of the solvent table"
        if self.kind == "scale":
            return "a potential scale key (built in, or defined under [library.scales])"
        if self.kind == "doi":
            return DOI_EXPECTED
        if self.kind == "date":
            return DATE_EXPECTED
        return "a valid value"


BONDS_EXPECTED = (
    "a list of inline tables {count = <whole number 1-100>, delta_d = <angstrom, -1 to 1>, "
    "f_ox = <N/m, >0 to 5000>, f_red = <N/m, >0 to 5000>}"
)

DOI_EXPECTED = 'a DOI "10.NNNN/suffix" in quotes, e.g. "10.1021/ja00000a000" (without https://doi.org/)'
DATE_EXPECTED = "a date YYYY-MM-DD, not in the future (a TOML date such as 2024-05-17, or the same in quotes)"

_S = FieldSpec
#: Every couple field, in the order crossrate writes them (and documents them).
FIELD_SPECS: tuple[FieldSpec, ...] = (
    _S("name", "text", "", "name of the couple, e.g. 'Fe(H2O)6 3+/2+'", required=True),
    _S("charge_ox", "integer", "", "charge of the oxidized form", required=True, low=-10, high=10),
    _S("charge_red", "integer", "", "charge of the reduced form (charge_ox - 1)", required=True, low=-10, high=10),
    _S("E", "number", "V", "formal potential of Ox/Red under the listed conditions, on E_scale",
       required=True, low=-5, high=5),
    _S("E_sd", "number", "V", "standard uncertainty of E", low=0, high=1),
    _S("E_ionic_strength", "number", "M",
       "ionic strength at which E was measured, when it differs from ionic_strength", low=0, high=10),
    _S("dE_dT", "number", "mV/K", "temperature coefficient of E (reaction entropy / F); carries E to other T",
       low=-10, high=10),
    _S("E_scale", "scale", "", "potential scale (reference electrode) E is given on",
       required=True, library_default=True),
    _S("k_self", "number", "M^-1 s^-1", "self-exchange rate constant (leave out when unknown)",
       low=0, high=1e13, low_open=True),
    _S("k_self_log10_sd", "number", "log10 units", "standard uncertainty of log10 k_self", low=0, high=5),
    _S("dH_self", "number", "kJ/mol", "activation enthalpy of the self-exchange", low=-100, high=300),
    _S("radius", "number", "angstrom", "effective radius for work terms and diffusion",
       required=True, low=1, high=30),
    _S("medium", "medium", "", "solvent in which E and k_self were measured", required=True,
       library_default=True),
    _S("ionic_strength", "number", "M", "ionic strength of the measurement", required=True, low=0, high=10),
    _S("temperature", "number", "K", "temperature of the measurement", required=True, low=200, high=400,
       library_default=True),
    _S("E00", "number", "eV", "excited-state energy: the couple is an excited state's (needs excited_form)",
       low=0, high=5, low_open=True),
    _S("excited_form", "choice", "", "which form is excited when E00 is given", choices=("ox", "red")),
    _S("lambda_in", "number", "kJ/mol", "inner-sphere reorganization energy", low=0, high=1000),
    _S("lambda_total", "number", "kJ/mol", "total reorganization energy of the self-exchange (instead of k_self)",
       low=0, high=1000, low_open=True),
    _S("bonds", "bonds", "", "bond sets that change on electron transfer (inner-sphere reorganization)"),
    _S("hbar_omega", "number", "cm^-1", "wavenumber of the couple's high-frequency (inner-sphere) mode, for the "
       "semiclassical model", low=100, high=5000),
    _S("kappa_el", "number", "", "electronic transmission factor of a non-adiabatic couple",
       low=0, high=1, low_open=True),
    _S("molar_mass", "number", "g/mol", "molar mass of the couple's oxidized form (sets the electrode collision "
       "factor of k0)", low=1, high=100000),
    _S("source", "text", "", "citation of the values (author, journal, year), or 'invented'", required=True),
    _S("doi", "doi", "", "DOI of the source, e.g. 10.1021/ja00000a000 (without https://doi.org/)"),
    _S("date", "date", "", "date the values were entered or last checked against the source (YYYY-MM-DD)"),
    _S("notes", "text", "", "free notes"),
    _S("tags", "text list", "", "labels such as 'aqua' or 'spin-change'"),
    _S("verified", "boolean", "", "true once the values were checked against the primary source"),
    _S("invented", "boolean", "", "true for made-up values (demos, teaching): never measurements, never verified"),
)
del _S

FIELDS_BY_NAME: dict[str, FieldSpec] = {s.name: s for s in FIELD_SPECS}
REQUIRED_FIELDS = frozenset(s.name for s in FIELD_SPECS if s.required)
LIBRARY_DEFAULT_FIELDS = ("medium", "temperature", "E_scale")


@dataclass(frozen=True)
class BondFieldSpec:
    """One key of a bonds entry: count (whole number), delta_d (angstrom), f_ox/f_red (N/m)."""

    name: str
    unit: str
    help: str
    integer: bool
    low: float
    high: float
    low_open: bool = False


BOND_FIELDS: tuple[BondFieldSpec, ...] = (
    BondFieldSpec("count", "", "number of equivalent bonds", True, 1, 100),
    BondFieldSpec("delta_d", "angstrom", "bond-length change between the ox and red forms", False, -1, 1),
    BondFieldSpec("f_ox", "N/m", "force constant of the bond in the oxidized form", False, 0, 5000, True),
    BondFieldSpec("f_red", "N/m", "force constant of the bond in the reduced form", False, 0, 5000, True),
)

#: Keys of the [library] table: name -> (kind, help).
LIBRARY_KEYS: dict[str, tuple[str, str]] = {
    "title": ("text", "title of the library"),
    "format": ("integer", f"file format version; must be {FORMAT_VERSION}"),
    "medium": ("medium", "default medium of the couples"),
    "temperature": ("number", "default temperature of the couples, K"),
    "E_scale": ("scale", "default potential scale of the couples"),
    "description": ("text", "free description of the library"),
    "scales": ("table", "custom potential scales, one [library.scales.<key>] table each"),
}

#: Keys of a [library.scales.<key>] table: name -> help.
SCALE_KEYS: dict[str, str] = {
    "name": "display name of the scale",
    "relative_to": "scale the offset is measured against (built-in or defined in this file)",
    "offset_V": "E(vs relative_to) = E(vs this scale) + offset_V, in V; leave out for an unrelated scale",
    "source": "where the offset comes from",
}


def closest(name: str, known) -> str | None:
    """The known name closest to a mistyped one (difflib ratio >= 0.6), else None."""
    hits = difflib.get_close_matches(name, list(known), n=1, cutoff=0.6)
    if hits:
        return hits[0]
    lowered = {k.lower(): k for k in known}
    return lowered.get(name.lower())


def parse_field_text(name: str, text: str):
    """Turn what a user typed in a form into a field value (before validation).

    Numbers accept plain decimal or exponent notation; booleans accept true/false/yes/no; text lists
    accept comma-separated words; bonds accept COUNT:DELTA_D:F_OX:F_RED sets (library.bond_text), the form
    `crossrate lambda --bonds` takes (the file's inline-table form, as a CSV export writes it, is read too). Empty text gives None.
    Raises ValueError with an 'expected ...' message for text that cannot be read at all.
    """
    spec = FIELDS_BY_NAME[name]
    s = text.strip()
    if s == "":
        return None
    if spec.kind == "number":
        try:
            value = float(s)
        except ValueError:
            raise ValueError(f"{s!r} is not a number; expected {spec.expected()}") from None
        if not math.isfinite(value):
            raise ValueError(f"{s!r}: expected {spec.expected()}")
        return value
    if spec.kind == "integer":
        try:
            return int(s)
        except ValueError:
            raise ValueError(f"{s!r} is not a whole number; expected {spec.expected()}") from None
    if spec.kind == "boolean":
        low = s.lower()
        if low in ("true", "yes", "y", "1"):
            return True
        if low in ("false", "no", "n", "0"):
            return False
        raise ValueError(f"{s!r}: expected true or false")
    if spec.kind == "text list":
        return [t.strip() for t in s.split(",") if t.strip()]
    if spec.kind == "bonds":
        if s.startswith(("[", "{")):  # the file's own inline-table form (a CSV export writes it so)
            from .toml_loads import loads  # local: only forms and imports need TOML snippets parsed

            try:
                return loads(f"bonds = {s}")["bonds"]
            except ValueError:
                raise ValueError(f"{s!r}: expected {BONDS_EXPECTED}") from None
        from .bond_text import parse_bonds_text

        return parse_bonds_text(s)
    return s
