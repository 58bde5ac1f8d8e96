"""Seeded generators of hostile library and CSV files, and the checks every such file must pass.

Shared by the quick tests in tests/faults/ (a few hundred files) and the long benchmark
tests/benchmarks/bench_faults_fuzz.py (tens of thousands). Each generator takes a random.Random and returns
(kind, bytes); the checks return a list of failure descriptions (empty: the file was handled as promised).
All couples and numbers are invented.
"""

import io
import math
import random
import traceback
from contextlib import redirect_stderr, redirect_stdout
from pathlib import Path

VALID_LIBRARY = """\
# Invented couples for the fault tests (Halden Lake scenario): not measurements.
[library]
title = "fault test library"
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[library.scales.hl-ref]
name = "invented reference electrode"
relative_to = "SHE"
offset_V = 0.2
source = "invented"

[couple.hl-a]
name = "Halden A 3+/2+"
charge_ox = 3
charge_red = 2
E = 0.74
E_sd = 0.01
k_self = 4.0
k_self_log10_sd = 0.3
radius = 3.4
ionic_strength = 0.1
source = "invented"
tags = ["aqua", "iron"]
verified = true

[couple.hl-b]
name = "Halden B 2+/1+"
charge_ox = 2
charge_red = 1
E = 0.1
E_scale = "hl-ref"
k_self = 1.0e6
radius = 6.5
ionic_strength = 0.5
medium = "acetonitrile"
temperature = 300
lambda_in = 12.5
bonds = [{count = 6, delta_d = 0.05, f_ox = 200.0, f_red = 180.0}]
source = "invented"
notes = "multi-word note"

[couple.hl-c]
name = "Halden C excited"
charge_ox = 1
charge_red = 0
E = -0.5
E00 = 2.1
excited_form = "ox"
radius = 5.0
ionic_strength = 0.0
source = "invented"
"""

NUMERIC_FIELDS = ("E", "E_sd", "k_self", "k_self_log10_sd", "radius", "ionic_strength", "temperature", "lambda_in",
                  "E00", "dH_self", "lambda_total", "kappa_el", "charge_ox", "charge_red")
ODD_NUMBERS = ("nan", "+nan", "-nan", "inf", "-inf", "1" + "0" * 400, "-" + "9" * 400, "1e400", "1e-400", "5e-324",
               "1.7976931348623157e308", "0", "-0.0", "0x10", "0o7", "0b1", "1_000", "1e3", "-1", "1e13", "1.0000001e13",
               "3.0e-7", "99999999999999999999", "0.0000000000000000000001", "30.000001", "0.999999")
ODD_VALUES = ('"text"', "true", "false", "[]", "[1, 2]", "{}", "{a = 1}", "1979-05-27", "07:32:00",
              "1979-05-27T07:32:00Z", '""', '"\\u0000"', '"\\u001b]0;x\\u0007"', "'''multi\nline'''", '"a\\nb"')
UNICODE_BITS = ("é", "Å", "λ", "ΔG°", "\u202e", "\u200b", "\U0001f9ea", "\ufeff", "\u0000", "\x1b", "Ω", "ﬁ", "\ud7ff")


def _lines(text: str) -> list[str]:
    return text.split("\n")


def case_random_bytes(rng: random.Random) -> bytes:
    return bytes(rng.getrandbits(8) for _ in range(rng.randint(0, 600)))


def case_truncated(rng: random.Random) -> bytes:
    data = VALID_LIBRARY.encode()
    return data[:rng.randint(0, len(data))]


def case_wrong_type(rng: random.Random) -> bytes:
    lines = _lines(VALID_LIBRARY)
    idx = [i for i, ln in enumerate(lines) if " = " in ln and not ln.startswith("#")]
    i = rng.choice(idx)
    key = lines[i].split(" = ", 1)[0]
    lines[i] = f"{key} = {rng.choice(ODD_VALUES + ODD_NUMBERS)}"
    return "\n".join(lines).encode()


def case_odd_number(rng: random.Random) -> bytes:
    lines = _lines(VALID_LIBRARY)
    idx = [i for i, ln in enumerate(lines) if ln.split(" = ", 1)[0] in NUMERIC_FIELDS + ("offset_V", "format")]
    for _ in range(rng.randint(1, 3)):
        i = rng.choice(idx)
        key = lines[i].split(" = ", 1)[0]
        lines[i] = f"{key} = {rng.choice(ODD_NUMBERS)}"
    return "\n".join(lines).encode()


def case_unicode(rng: random.Random) -> bytes:
    text = VALID_LIBRARY
    for _ in range(rng.randint(1, 4)):
        at = rng.randint(0, len(text))
        text = text[:at] + rng.choice(UNICODE_BITS) + text[at:]
    return text.encode("utf-8", "surrogatepass")


def case_bom_or_encoding(rng: random.Random) -> bytes:
    choice = rng.randint(0, 3)
    if choice == 0:
        return b"\xef\xbb\xbf" + VALID_LIBRARY.encode()
    if choice == 1:
        return VALID_LIBRARY.encode("utf-16")
    if choice == 2:
        return VALID_LIBRARY.replace("Halden A", "Häldén A").encode("latin-1")
    return b"\xff\xfe" + VALID_LIBRARY.encode()


def case_line_ends(rng: random.Random) -> bytes:
    ends = rng.choice(["\r\n", "\r", "\n\r", "\x0b", "\x0c", "\u2028"])
    text = VALID_LIBRARY.replace("\n", ends) if rng.random() < 0.5 else VALID_LIBRARY.replace("\n", "\r\n", 5)
    return text.encode()


def case_duplicate(rng: random.Random) -> bytes:
    lines = _lines(VALID_LIBRARY)
    what = rng.randint(0, 2)
    if what == 0:  # a duplicated couple id
        return (VALID_LIBRARY + "\n[couple.hl-a]\nname = \"again\"\n").encode()
    if what == 1:  # a duplicated key inside a table
        i = next(i for i, ln in enumerate(lines) if ln.startswith("radius"))
        lines.insert(i + 1, "radius = 9.9")
        return "\n".join(lines).encode()
    return (VALID_LIBRARY + "\n[library]\nformat = 1\n").encode()  # a second [library]


def case_deep_nesting(rng: random.Random) -> bytes:
    depth = rng.choice([10, 100, 1000, 5000, 20000])
    kind = rng.randint(0, 2)
    if kind == 0:
        value = "[" * depth + "]" * depth
    elif kind == 1:
        value = "{a = " * depth + "1" + "}" * depth
    else:
        value = "[" * depth  # unterminated
    return VALID_LIBRARY.replace("source = \"invented\"\ntags", f"source = \"invented\"\nnotes = {value}\ntags", 1).encode()


def case_odd_ids(rng: random.Random) -> bytes:
    cid = rng.choice(['"../x"', '"/etc/passwd"', '"a b"', '"A"', '""', '"x\\u0000"', '"fe.phen3"', "fe.phen3",
                      '"' + "a" * 5000 + '"', '"-x"', '"=cmd"', '"é"'])
    return VALID_LIBRARY.replace("[couple.hl-c]", f"[couple.{cid}]", 1).encode()


def case_structure(rng: random.Random) -> bytes:
    options = [
        'couple = "none"\n[library]\nformat = 1\n',
        "[library]\nformat = 1\n[[couple]]\nname = 'x'\n",
        "[library]\nformat = 2\n",
        "[library]\n",
        "",
        "[library]\nformat = 1\ncouple = {a = {name = 'x'}}\n",
        "[library]\nformat = 1\n[couple.a.b.c]\nname = 'x'\n",
        "[library]\nformat = 1\nunknown = 1\n[other]\nx = 1\n",
        VALID_LIBRARY.replace("[library.scales.hl-ref]", "[library.scales.SHE]"),
        VALID_LIBRARY.replace('relative_to = "SHE"', 'relative_to = "hl-ref"'),
    ]
    return rng.choice(options).encode()


def case_mutated(rng: random.Random) -> bytes:
    data = bytearray(VALID_LIBRARY.encode())
    for _ in range(rng.randint(1, 8)):
        op = rng.randint(0, 2)
        at = rng.randint(0, len(data) - 1)
        if op == 0:
            data[at] = rng.getrandbits(8)
        elif op == 1:
            del data[at]
        else:
            data.insert(at, rng.choice(b"=[]{}\"'#\n.,-+0123456789e"))
    return bytes(data)


LIBRARY_CASES = (case_random_bytes, case_truncated, case_wrong_type, case_odd_number, case_unicode,
                 case_bom_or_encoding, case_line_ends, case_duplicate, case_deep_nesting, case_odd_ids,
                 case_structure, case_mutated)


def library_corpus(n: int, seed: int):
    """n (kind, bytes) library files, the kinds in turn, from one seed."""
    rng = random.Random(seed)
    for i in range(n):
        case = LIBRARY_CASES[i % len(LIBRARY_CASES)]
        yield case.__name__.removeprefix("case_"), case(rng)


def check_library_file(path: Path) -> tuple[str, list[str]]:
    """Read and validate a file as crossrate does; ('valid' | 'invalid', failures).

    Failures: any exception other than LibraryError (a traceback), a problem that does not name the file,
    a couple/field problem without a line, or an accepted couple that breaks the library's own rules
    (checked again, independently, by couple_check) or holds a non-finite number.
    """
    from crossrate.errors import LibraryError
    from crossrate.library.couple_check import built_couple_problems
    from crossrate.library.toml_reader import read_library_file

    failures: list[str] = []
    try:
        lf = read_library_file(path)
    except LibraryError as exc:
        for p in exc.problems:
            text = str(p)
            if not text.startswith(str(path)):
                failures.append(f"problem without the file name: {text[:200]}")
            if p.couple is not None and p.field is not None and p.line is None:
                failures.append(f"couple/field problem without a line: {text[:200]}")
        if not exc.problems:
            failures.append("LibraryError with no problem")
        return "invalid", failures
    except BaseException:  # the point of the test: anything else is a traceback the user would see
        return "crash", [traceback.format_exc(limit=3)]
    for c in lf.couples:
        for p in built_couple_problems(c):
            failures.append(f"invalid value accepted: {p}")
        for name in NUMERIC_FIELDS:
            v = getattr(c, name)
            if v is not None and not math.isfinite(v):
                failures.append(f"non-finite value accepted: couple {c.id} {name} = {v!r}")
    return "valid", failures


def check_validate_command(path: Path, verdict: str) -> list[str]:
    """`crossrate library validate FILE` in-process: exit 2 and one `FILE...` line per problem for an
    invalid file, exit 0 for a valid one (the command may be stricter: it also checks the file's scales
    against the layers under it), never an exception."""
    from crossrate.cli.main import main

    out, err = io.StringIO(), io.StringIO()
    try:
        with redirect_stdout(out), redirect_stderr(err):
            rc = main(["library", "validate", str(path)])
    except BaseException:
        return [f"validate raised: {traceback.format_exc(limit=3)}"]
    failures = []
    if verdict == "invalid" and rc != 2:
        failures.append(f"invalid file, exit {rc}")
    if rc not in (0, 2):
        failures.append(f"exit {rc}")
    if rc == 2:
        lines = err.getvalue().splitlines()
        if not lines or not lines[-1].startswith("crossrate: "):
            failures.append(f"no summary line: {err.getvalue()[-200:]}")
        for ln in lines[:-1]:
            if not ln.startswith(str(path)):
                failures.append(f"message without the file name: {ln[:200]}")
        if "Traceback" in err.getvalue():
            failures.append("traceback on stderr")
    return failures


# --- CSV inputs ---------------------------------------------------------------------------------------

VALID_CSV = {
    "measured": "# invented\noxidant,reductant,k_measured,k_measured_log10_sd,temperature,ionic_strength,medium,label\n"
                "hl-a,hl-c,2.0e5,0.1,298.15,0.1,water,run 1\nhl-a,hl-c,3.0e5,,,,,run 2\n",
    "partner": "partner,k_measured,k_measured_log10_sd,role,temperature,ionic_strength,medium\n"
               "hl-a,1.0e4,0.2,oxidant,298.15,0.1,water\nhl-c,5.0e2,,auto,,,\n",
    "series": "dG0_kJ_per_mol,k_obs,log10_sd,label\n-10,1e4,0.1,a\n-30,1e6,0.1,b\n-60,1e8,0.1,c\n-90,3e9,0.1,d\n",
    "import": "id,name,charge_ox,charge_red,E,E_scale,k_self,radius,medium,ionic_strength,temperature,source,tags\n"
              "hl-x,Halden X,3,2,0.5,SHE,1e3,4.0,water,0.1,298.15,invented,a;b\n"
              "hl-y,'=Halden Y,1,0,-0.2,SHE,,6.5,acetonitrile,0.0,300,invented,\n",
    "candidates": "# computed candidates (invented)\nid,charge_ox,charge_red,E,radius,k_self,name\n"
                  "c-1,3,2,0.5,4.0,1e3,first\nc-2,1,0,-0.3,6.5,2e5,second\nc-3,0,-1,1.2,3.0,5,third\n",
}
CSV_ODD_CELLS = ODD_NUMBERS + ("", " ", "abc", "1e6 M-1s-1", "300 K", "=1+2", "@SUM(1)", "-", "+", "1,5", '"1"',
                               "\x00", "é", "waterr", "oxidant", "reductant", "maybe", "1e-320", "-0", "0")


def csv_case(rng: random.Random, kind: str) -> tuple[str, bytes]:
    base = VALID_CSV[kind]
    pick = rng.randint(0, 7)
    if pick == 0:
        return "random_bytes", case_random_bytes(rng)
    if pick == 1:
        data = base.encode()
        return "truncated", data[:rng.randint(0, len(data))]
    if pick == 2:
        return "bom_crlf", (b"\xef\xbb\xbf" if rng.random() < 0.5 else b"") + base.replace("\n", "\r\n").encode()
    if pick == 3:
        return "utf16", base.encode("utf-16")
    if pick == 4:  # a cell replaced
        lines = base.rstrip("\n").split("\n")
        data_lines = [i for i, ln in enumerate(lines) if not ln.startswith("#")][1:]
        i = rng.choice(data_lines)
        cells = lines[i].split(",")
        cells[rng.randrange(len(cells))] = rng.choice(CSV_ODD_CELLS)
        lines[i] = ",".join(cells)
        return "odd_cell", ("\n".join(lines) + "\n").encode()
    if pick == 5:  # header mangled
        lines = base.split("\n")
        h = 1 if lines[0].startswith("#") else 0
        cols = lines[h].split(",")
        op = rng.randint(0, 2)
        if op == 0:
            cols[rng.randrange(len(cols))] = rng.choice(["K_measured", "k", "", "dG0", "k_obs", "label"])
        elif op == 1:
            cols.append(cols[0])
        else:
            del cols[rng.randrange(len(cols))]
        lines[h] = ",".join(cols)
        return "header", "\n".join(lines).encode()
    if pick == 6:  # ragged rows, quotes
        return "ragged", (base + rng.choice(["a,b\n", '"unclosed,1\n', ",,,,,,,,,,,,\n", "\n\n\n", "x" * 5000 + "\n"])).encode()
    return "unicode", case_unicode_text(rng, base)


def case_unicode_text(rng: random.Random, base: str) -> bytes:
    for _ in range(rng.randint(1, 3)):
        at = rng.randint(0, len(base))
        base = base[:at] + rng.choice(UNICODE_BITS) + base[at:]
    return base.encode("utf-8", "surrogatepass")


def csv_corpus(n: int, seed: int):
    """n (input kind, case kind, bytes) CSV files over the inputs of check, solve, fit and library import."""
    rng = random.Random(seed)
    kinds = tuple(VALID_CSV)
    for i in range(n):
        kind = kinds[i % len(kinds)]
        case, data = csv_case(rng, kind)
        yield kind, case, data


def check_csv_file(path: Path, kind: str) -> tuple[str, list[str]]:
    """Read a CSV input as crossrate does; ('valid' | 'invalid', failures): an exception other than
    InputFileError, a message not naming the file, or an accepted value out of its column's rule."""
    from crossrate.core.solvents import solvent_table
    from crossrate.errors import InputFileError
    from crossrate.services.conditions import IONIC_STRENGTH_MAX_M, TEMPERATURE_RANGE_K
    from crossrate.services.measured_csv import read_measured_csv, read_partner_csv, read_series_csv

    if kind == "import":
        return _check_import_csv(path)
    if kind == "candidates":
        return _check_candidate_table(path)
    reader = {"measured": read_measured_csv, "partner": read_partner_csv, "series": read_series_csv}[kind]
    try:
        out = reader(path)
    except InputFileError as exc:
        text = str(exc)
        bad = [ln for ln in text.splitlines() if ln and not ln.startswith(str(path)) and not ln.startswith("  ")]
        return "invalid", [f"message without the file name: {ln[:200]}" for ln in bad[:3]]
    except BaseException:
        return "crash", [traceback.format_exc(limit=3)]
    failures = []
    media = set(solvent_table())

    def need(ok, what):
        if not ok:
            failures.append(f"accepted {what}")

    if kind == "series":
        need(len(out.k_obs) > 0, "an empty series")
        need(all(math.isfinite(k) and k > 0 for k in out.k_obs.tolist()), f"k_obs {out.k_obs.tolist()}")
        need(all(math.isfinite(g) for g in out.dG0_J_per_mol.tolist()), "a non-finite dG0")
        need(all(math.isnan(s) or s > 0 for s in out.log10_sd.tolist()), "a bad log10_sd")
        return "valid", failures
    for r in out:
        need(math.isfinite(r.k_measured) and r.k_measured > 0, f"k_measured {r.k_measured!r}")
        sd = r.k_measured_log10_sd
        need(sd is None or (math.isfinite(sd) and sd > 0), f"k_measured_log10_sd {sd!r}")
        need(r.temperature is None or TEMPERATURE_RANGE_K[0] <= r.temperature <= TEMPERATURE_RANGE_K[1],
             f"temperature {r.temperature!r}")
        need(r.ionic_strength is None or 0 <= r.ionic_strength <= IONIC_STRENGTH_MAX_M,
             f"ionic strength {r.ionic_strength!r}")
        need(r.medium is None or r.medium in media, f"medium {r.medium!r}")
    return "valid", failures


def _check_import_csv(path: Path) -> tuple[str, list[str]]:
    """`library import`'s reader: LibraryError whose problems name the file, or couples that keep the rules."""
    from crossrate.errors import LibraryError
    from crossrate.library.couple_check import built_couple_problems
    from crossrate.library.couple_import import read_couples_csv

    try:
        couples = read_couples_csv(path)
    except LibraryError as exc:
        bad = [str(p) for p in exc.problems if not str(p).startswith(str(path))]
        return "invalid", [f"problem without the file name: {b[:200]}" for b in bad[:3]]
    except BaseException:
        return "crash", [traceback.format_exc(limit=3)]
    failures = [f"invalid value accepted: {p}" for c in couples for p in built_couple_problems(c)]
    for c in couples:
        for name in NUMERIC_FIELDS:
            v = getattr(c, name)
            if v is not None and not math.isfinite(v):
                failures.append(f"non-finite value accepted: couple {c.id} {name} = {v!r}")
    return "valid", failures


def _check_candidate_table(path: Path) -> tuple[str, list[str]]:
    """`screen --candidates`' reader: LibraryError naming the file, or columns inside the library's ranges."""
    import numpy as np

    from crossrate.errors import LibraryError
    from crossrate.library.candidate_table import read_candidate_table
    from crossrate.library.schema import FIELDS_BY_NAME

    try:
        t = read_candidate_table(path)
    except LibraryError as exc:
        bad = [str(p) for p in exc.problems if not str(p).startswith(str(path))]
        return "invalid", [f"problem without the file name: {b[:200]}" for b in bad[:3]]
    except BaseException:
        return "crash", [traceback.format_exc(limit=3)]
    failures = []
    for name, col in (("E", t.E_V), ("radius", t.radius_A), (t.rate_column, t.rate)):
        v = np.asarray(col, dtype=float)
        spec = FIELDS_BY_NAME[name]
        if not np.all(np.isfinite(v)) or not all(spec.in_range(float(x)) for x in v):
            failures.append(f"accepted {name} out of its range: {v.tolist()[:5]}")
    if not np.all(np.asarray(t.z_ox) - np.asarray(t.z_red) == 1):
        failures.append("accepted charges that do not differ by 1")
    return "valid", failures
