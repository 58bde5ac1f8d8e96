"""Every validation rule, with its message: `path:line: couple <id>: field <name>: what; expected ...`."""

import pytest
from library_helpers import BASE, line_of

from crossrate.errors import LibraryError
from crossrate.library.toml_reader import read_library_file


def _in_one(old: str, new: str):
    """A transform replacing the first `old` after [couple.t-one]."""

    def tr(text):
        head, tail = text.split("[couple.t-one]", 1)
        assert old in tail
        return head + "[couple.t-one]" + tail.replace(old, new, 1)

    return tr


def _problems(write_lib, text):
    path = write_lib(text)
    with pytest.raises(LibraryError) as info:
        read_library_file(path)
    return path, text, info.value.problems


# (case, transform, couple, field, text on the expected line (None: the couple's header), wording)
CASES = [
    ("missing", _in_one("radius = 3.5\n", ""), "t-one", "radius", None,
     "missing; expected a finite number from 1 to 30 angstrom"),
    ("text-for-number", _in_one("k_self = 1.0e3", 'k_self = "1e3"'), "t-one", "k_self", 'k_self = "1e3"',
     'got text "1e3"; expected a finite number greater than 0'),
    ("bool-is-not-a-number", _in_one("radius = 3.5", "radius = true"), "t-one", "radius", "radius = true",
     "got true (a boolean); expected a finite number from 1 to 30 angstrom"),
    ("non-finite", _in_one("E = 0.50", "E = nan"), "t-one", "E", "E = nan",
     "got nan, not a finite number; expected a finite number from -5 to 5 V"),
    ("infinite-k", _in_one("k_self = 1.0e3", "k_self = inf"), "t-one", "k_self", "k_self = inf",
     "not a finite number"),
    ("k-self-zero", _in_one("k_self = 1.0e3", "k_self = 0"), "t-one", "k_self", "k_self = 0",
     "got 0; expected a rate constant greater than 0 M^-1 s^-1"),
    ("k-self-negative", _in_one("k_self = 1.0e3", "k_self = -5.0"), "t-one", "k_self", "k_self = -5.0",
     "expected a rate constant greater than 0"),
    ("radius-small", _in_one("radius = 3.5", "radius = 0.5"), "t-one", "radius", "radius = 0.5",
     "got 0.5 angstrom; expected a finite number from 1 to 30 angstrom"),
    ("radius-large", _in_one("radius = 3.5", "radius = 31"), "t-one", "radius", "radius = 31",
     "got 31 angstrom; expected a finite number from 1 to 30 angstrom"),
    ("temperature-low", _in_one("radius = 3.5", "radius = 3.5\ntemperature = 199.0"), "t-one", "temperature",
     "temperature = 199.0", "got 199 K; expected a finite number from 200 to 400 K"),
    ("temperature-high", _in_one("radius = 3.5", "radius = 3.5\ntemperature = 401"), "t-one", "temperature",
     "temperature = 401", "got 401 K; expected a finite number from 200 to 400 K"),
    ("ionic-strength-negative", _in_one("ionic_strength = 0.1", "ionic_strength = -0.01"), "t-one",
     "ionic_strength", "ionic_strength = -0.01", "got -0.01 M; expected a finite number from 0 to 10 M"),
    ("E-too-high", _in_one("E = 0.50", "E = 5.5"), "t-one", "E", "E = 5.5",
     "got 5.5 V; expected a finite number from -5 to 5 V"),
    ("E-too-low", _in_one("E = 0.50", "E = -6"), "t-one", "E", "E = -6", "got -6 V"),
    ("charge-difference", _in_one("charge_red = 2", "charge_red = 1"), "t-one", "charge_ox", "charge_ox = 3",
     "charge_ox - charge_red = 3 - (1) = 2; expected exactly 1"),
    ("charge-as-decimal", _in_one("charge_ox = 3", "charge_ox = 3.0"), "t-one", "charge_ox", "charge_ox = 3.0",
     "written as a decimal; expected a whole number"),
    ("unknown-medium", _in_one("radius = 3.5", 'radius = 3.5\nmedium = "watr"'), "t-one", "medium",
     'medium = "watr"', 'unknown medium "watr" (did you mean "water"?); expected one of acetone, acetonitrile'),
    ("unknown-scale", _in_one("E = 0.50", 'E = 0.50\nE_scale = "SCEE"'), "t-one", "E_scale", 'E_scale = "SCEE"',
     'unknown potential scale "SCEE" (did you mean "SCE"?); expected one of AgCl-3M, AgCl-sat, Fc-MeCN, SCE, SHE'),
    ("unknown-field", _in_one("k_self = 1.0e3", "k_slef = 1.0e3"), "t-one", "k_slef", "k_slef = 1.0e3",
     "unknown field (did you mean k_self?)"),
    ("E00-without-excited-form", _in_one("E = 0.50", "E = 0.50\nE00 = 2.0"), "t-one", "excited_form",
     "E00 = 2.0", 'missing while E00 is given; expected "ox" or "red"'),
    ("excited-form-without-E00", _in_one("E = 0.50", 'E = 0.50\nexcited_form = "ox"'), "t-one", "excited_form",
     'excited_form = "ox"', "given without E00"),
    ("invented-and-verified", _in_one("verified = true", "verified = true\ninvented = true"), "t-one", "verified",
     "verified = true", "true while invented = true; expected verified = false"),
    ("invented-not-boolean", _in_one("verified = true", 'verified = false\ninvented = "yes"'), "t-one", "invented",
     'invented = "yes"', "expected true or false"),
    ("excited-form-bad", _in_one("E = 0.50", 'E = 0.50\nE00 = 2.0\nexcited_form = "both"'), "t-one",
     "excited_form", 'excited_form = "both"', 'got text "both"; expected "ox" or "red"'),
    ("kappa-zero", _in_one("radius = 3.5", "radius = 3.5\nkappa_el = 0"), "t-one", "kappa_el", "kappa_el = 0",
     "got 0; expected a finite number greater than 0 and at most 1"),
    ("kappa-above-one", _in_one("radius = 3.5", "radius = 3.5\nkappa_el = 1.5"), "t-one", "kappa_el",
     "kappa_el = 1.5", "got 1.5; expected a finite number greater than 0 and at most 1"),
    ("bonds-missing-key", _in_one("radius = 3.5", "radius = 3.5\nbonds = [{count = 6, delta_d = 0.1, f_ox = 200.0}]"),
     "t-one", "bonds", "bonds = ", "entry 1: missing f_red; expected a list of inline tables"),
    ("bonds-count-zero", _in_one("radius = 3.5",
                                 "radius = 3.5\nbonds = [{count = 0, delta_d = 0.1, f_ox = 200.0, f_red = 150.0}]"),
     "t-one", "bonds", "bonds = ", "entry 1: count is 0; expected a whole number from 1 to 100"),
    ("bonds-unknown-key", _in_one("radius = 3.5",
                                  "radius = 3.5\nbonds = [{count = 6, delta_dd = 0.1, f_ox = 200.0, f_red = 150.0}]"),
     "t-one", "bonds", "bonds = ", "entry 1: unknown key delta_dd (did you mean delta_d?)"),
    ("bonds-negative-force", _in_one("radius = 3.5",
                                     "radius = 3.5\nbonds = [{count = 6, delta_d = 0.1, f_ox = -2, f_red = 150.0}]"),
     "t-one", "bonds", "bonds = ", "entry 1: f_ox is -2; expected a finite number greater than 0 and at most 5000 N/m"),
    ("bonds-not-a-list", _in_one("radius = 3.5", "radius = 3.5\nbonds = 6"), "t-one", "bonds", "bonds = 6",
     "got 6; expected a list of inline tables"),
    ("tags-not-text", _in_one('tags = ["aqua"]', "tags = [1, 2]"), "t-one", "tags", "tags = [1, 2]",
     "entry 1 is 1; expected a list of text"),
    ("verified-as-text", _in_one("verified = true", 'verified = "yes"'), "t-one", "verified", 'verified = "yes"',
     'got text "yes"; expected true or false'),
    ("source-empty", _in_one('source = "invented for the tests"', 'source = ""'), "t-one", "source", 'source = ""',
     "is empty; expected non-empty text"),
]


@pytest.mark.parametrize("case,transform,couple,field,needle,wording", CASES, ids=[c[0] for c in CASES])
def test_rule_message(write_lib, case, transform, couple, field, needle, wording):
    path, text, problems = _problems(write_lib, transform(BASE))
    expected_line = line_of(text, f"[couple.{couple}]") if needle is None else line_of(
        text, needle, start_after=f"[couple.{couple}]")
    mine = [p for p in problems if p.couple == couple and p.field == field]
    assert mine, [str(p) for p in problems]
    p = mine[0]
    assert p.line == expected_line
    assert str(p).startswith(f"{path}:{expected_line}: couple {couple}: field {field}: ")
    assert wording in str(p)
    assert "; expected" in str(p) or "expected" in p.message


def test_bad_id_characters(write_lib):
    path, text, problems = _problems(write_lib, BASE.replace("[couple.t-one]", "[couple.T-One]"))
    (p,) = [p for p in problems if p.couple == "T-One"]
    assert str(p) == (f"{path}:{line_of(text, '[couple.T-One]')}: couple T-One: bad id 'T-One' (character 'O', "
                      "'T' not allowed); expected lower-case letters, digits, '.', '_' and '-' only")


def test_unquoted_dotted_id_is_explained(write_lib):
    text = BASE.replace("[couple.t-one]", "[couple.t.one]")
    path, text, problems = _problems(write_lib, text)
    assert [str(p) for p in problems] == [
        f"{path}:{line_of(text, '[couple.t.one]')}: couple t.one: an id containing '.' must be quoted; "
        "expected [couple.\"t.one\"]"
    ]


def test_duplicate_id_in_our_words_and_rest_still_checked(write_lib):
    dup = '\n[couple.t-two]\nname = "again"\n'
    text = BASE.replace("E = 0.10", "E = 9.0") + dup
    path, text, problems = _problems(write_lib, text)
    first, again = line_of(text, "[couple.t-two]"), len(text.split("\n")) - 2
    msgs = [str(p) for p in problems]
    assert f"{path}:{again}: couple t-two: duplicate id: already defined at line {first}; expected each id once " \
           "per file" in msgs
    # the other problem of the file is reported too (all problems at once)
    assert any(p.couple == "t-three" and p.field == "E" for p in problems)


def test_toml_syntax_error_has_line_and_column(write_lib):
    text = BASE.replace("E = -0.20", "E = = -0.20")
    path, text, problems = _problems(write_lib, text)
    (p,) = problems
    line = line_of(text, "E = = -0.20")
    assert str(p).startswith(f"{path}:{line}:5: couple t-two: TOML syntax error: ")
    assert "expected valid TOML" in str(p)


def test_not_utf8_has_line_and_column(write_lib, tmp_path):
    p = tmp_path / "latin1.toml"
    p.write_bytes(BASE.replace("test two", "test tw\xf6").encode("latin-1"))
    with pytest.raises(LibraryError) as info:
        read_library_file(p)
    line = line_of(BASE, "test two")
    col = BASE.split("\n")[line - 1].index("test two") + len("test tw") + 1
    assert str(info.value) == f"{p}:{line}:{col}: not UTF-8 text (byte 0xf6); expected a UTF-8 encoded TOML file"


def test_all_problems_at_once(write_lib):
    text = (BASE.replace("radius = 3.5", "radius = 0.1").replace("k_self = 5.0e6", "k_self = -1")
            .replace("E = 0.10", "E = 10"))
    _, _, problems = _problems(write_lib, text)
    assert {(p.couple, p.field) for p in problems} == {("t-one", "radius"), ("t-two", "k_self"), ("t-three", "E")}
    assert [p.line for p in problems] == sorted(p.line for p in problems)


@pytest.mark.parametrize("change,field,wording", [
    (('format = 1\n', ''), "library.format", "missing; expected format = 1"),
    (('format = 1', 'format = 2'), "library.format", "got 2 (a newer crossrate wrote this file?); expected 1"),
    (('medium = "water"', 'medium = "watter"'), "library.medium", 'got text "watter" (did you mean "water"?)'),
    (('temperature = 298.15', 'temperature = 500.0'), "library.temperature", "got 500; expected a finite number"),
    (('temperature = 298.15', 'temperatur = 298.15'), "library.temperatur", "unknown key (did you mean temperature?)"),
    (('offset_V = 0.63', 'offset_V = inf'), "library.scales.Fc-MeCN.offset_V", "got inf; expected a finite number"),
    (('relative_to = "SHE"', 'relative_to = "SHEE"'), "library.scales.Fc-MeCN.relative_to",
     'unknown scale "SHEE" (did you mean "SHE"?)'),
])
def test_library_table_rules(write_lib, change, field, wording):
    text = BASE.replace(*change, 1)
    _, _, problems = _problems(write_lib, text)
    mine = [p for p in problems if p.field == field]
    assert mine, [str(p) for p in problems]
    assert wording in mine[0].message
    assert mine[0].line is not None


def test_missing_library_table(write_lib):
    text = BASE.split("[library]", 1)[0] + BASE.split("# --- aqueous ---", 1)[1]
    path, _, problems = _problems(write_lib, text)
    assert any(str(p).startswith(f"{path}:1: no [library] table; expected [library] with format = 1") for p in problems)


def test_unknown_top_level_table(write_lib):
    text = BASE + '\n[couples.t-x]\nname = "x"\n'
    path, text, problems = _problems(write_lib, text)
    (p,) = problems
    assert str(p).startswith(f"{path}:{line_of(text, '[couples.t-x]')}: unknown top-level key or table 'couples' "
                             "(did you mean [couple]?)")


def test_scale_cycle_refused(write_lib):
    extra = ('\n[library.scales.A]\nname = "a"\nrelative_to = "B"\noffset_V = 0.1\n'
             '\n[library.scales.B]\nname = "b"\nrelative_to = "A"\noffset_V = 0.1\n')
    text = BASE.replace("# --- aqueous ---", extra + "\n# --- aqueous ---")
    _, _, problems = _problems(write_lib, text)
    assert any(p.field == "library.scales.A.relative_to" and "cycle" in p.message for p in problems)


def test_scale_redefining_a_builtin_refused(write_lib):
    text = BASE.replace("[library.scales.Fc-MeCN]", "[library.scales.SCE]")
    _, _, problems = _problems(write_lib, text)
    assert any("redefines the built-in scale SCE" in p.message for p in problems)


def test_missing_and_unreadable_files_name_the_file(tmp_path):
    with pytest.raises(LibraryError) as info:
        read_library_file(tmp_path / "nope.toml")
    assert str(info.value) == f"{tmp_path / 'nope.toml'}: no such file; expected a library TOML file"
    with pytest.raises(LibraryError) as info:
        read_library_file(tmp_path)
    assert str(info.value).startswith(f"{tmp_path}: is a folder")


def test_check_field_for_forms():
    from crossrate.library.schema import parse_field_text
    from crossrate.library.validation import check_field

    assert check_field("radius", 3.5) == (3.5, None)
    assert check_field("radius", 0.5)[1] == "got 0.5 angstrom; expected a finite number from 1 to 30 angstrom"
    assert "did you mean k_self" in check_field("k_slef", 1.0)[1]
    assert parse_field_text("tags", "aqua, spin-change") == ["aqua", "spin-change"]
    assert parse_field_text("verified", "yes") is True
    assert parse_field_text("bonds", "6:0.1:200:150")[0] == {"count": 6, "delta_d": 0.1, "f_ox": 200.0, "f_red": 150.0}
    assert parse_field_text("k_self", "") is None
    with pytest.raises(ValueError, match="is not a number"):
        parse_field_text("k_self", "fast")
