"""Reading library files: couples, defaults, origins and line numbers, scales, the sha256 of the bytes."""

import hashlib

import pytest
from library_helpers import BASE, line_of

from crossrate.errors import LibraryError
from crossrate.library.line_index import LineIndex
from crossrate.library.toml_reader import parse_library_text, read_library_file


def test_reads_couples_in_file_order_with_defaults(base_file):
    lf = read_library_file(base_file, layer="group")
    assert [c.id for c in lf.couples] == ["t-one", "t-two", "t-three"]
    one = lf.couple("t-one")
    # medium, temperature and E_scale come from the [library] defaults
    assert (one.medium, one.temperature, one.E_scale) == ("water", 298.15, "SHE")
    assert one.k_self == 1.0e3 and one.radius == 3.5 and one.tags == ("aqua",) and one.verified is True
    three = lf.couple("t-three")
    assert (three.medium, three.E_scale) == ("acetonitrile", "Fc-MeCN")
    assert lf.title == "test library" and lf.defaults == {"medium": "water", "temperature": 298.15, "E_scale": "SHE"}
    assert lf.scales["Fc-MeCN"].offset_V == 0.63 and lf.scales["Fc-MeCN"].relative_to == "SHE"


def test_sha256_is_of_the_bytes_read(base_file):
    lf = read_library_file(base_file)
    assert lf.sha256 == hashlib.sha256(base_file.read_bytes()).hexdigest()
    assert lf.text == BASE


def test_origin_names_file_layer_table_line_and_field_lines(base_file):
    lf = read_library_file(base_file, layer="personal")
    two = lf.couple("t-two")
    assert two.origin.path == str(base_file)
    assert two.origin.layer == "personal"
    assert two.origin.line == line_of(BASE, "[couple.t-two]")
    assert two.origin.line_of("k_self") == line_of(BASE, "k_self = 5.0e6")
    assert two.origin.line_of("charge_ox") == line_of(BASE, "charge_ox = 2")
    # a field the table does not have: the table's own line
    assert two.origin.line_of("E00") == two.origin.line
    names = [k for k, _ in two.origin.field_lines]
    assert names == ["name", "charge_ox", "charge_red", "E", "k_self", "radius", "ionic_strength", "source", "verified"]


def test_origin_compares_and_pickles_like_a_plain_origin(base_file):
    import pickle

    from crossrate.library.couple import Origin

    o = read_library_file(base_file).couple("t-one").origin
    plain = Origin(o.path, o.line, o.layer, o.field_lines)
    assert o == plain and plain == o and hash(o) == hash(plain)
    assert pickle.loads(pickle.dumps(o)) == plain


def test_line_index_fast_and_slow_paths_agree():
    # The slow path (taken when the text has multi-line strings) must find the same lines as the fast one.
    fast = LineIndex.scan(BASE)
    slow = LineIndex._scan_slow(BASE)
    assert fast.tables == slow.tables
    assert fast.top_fields == slow.top_fields


def test_multiline_string_hides_header_like_lines(write_lib):
    text = BASE.replace(
        'source = "invented for the tests"\ntags = ["aqua"]',
        'source = "invented for the tests"\nnotes = """measured twice\n[couple.not-a-table]\nk_self = 1\n"""\ntags = ["aqua"]',
    )
    lf = read_library_file(write_lib(text))
    assert [c.id for c in lf.couples] == ["t-one", "t-two", "t-three"]
    one = lf.couple("t-one")
    assert "[couple.not-a-table]" in one.notes
    assert one.origin.line_of("tags") == line_of(text, 'tags = ["aqua"]')
    assert "not-a-table" not in lf.index.couples


def test_quoted_ids_and_crlf_line_ends(write_lib):
    text = BASE.replace("[couple.t-one]", '[couple."t.one"]').replace("\n", "\r\n")
    lf = read_library_file(write_lib(text))
    c = lf.couple("t.one")
    assert c is not None and c.origin.line == line_of(text, '[couple."t.one"]')
    assert c.origin.line_of("E") == line_of(text, "E = 0.50")


def test_bonds_inline_array_read_as_bondsets(write_lib):
    text = BASE.replace("k_self = 1.0e3  # invented\n",
                        "bonds = [{count = 6, delta_d = 0.14, f_ox = 255, f_red = 161.0}]\n")
    one = read_library_file(write_lib(text)).couple("t-one")
    assert one.k_self is None
    (b,) = one.bonds
    assert (b.count, b.delta_d, b.f_ox, b.f_red) == (6, 0.14, 255.0, 161.0)
    assert isinstance(b.f_ox, float)


def test_scales_from_an_earlier_layer_may_be_used(write_lib):
    base = read_library_file(write_lib(BASE, "a.toml"))
    later = (
        '[library]\nformat = 1\n\n[couple.t-four]\nname = "four"\ncharge_ox = 1\ncharge_red = 0\nE = 0.2\n'
        'E_scale = "Fc-MeCN"\nradius = 4\nmedium = "acetonitrile"\nionic_strength = 0.1\ntemperature = 298.15\n'
        'source = "invented"\n'
    )
    p = write_lib(later, "b.toml")
    with pytest.raises(LibraryError, match="unknown potential scale"):
        read_library_file(p)
    lf = read_library_file(p, known_scales=base.scales)
    assert lf.couple("t-four").E_scale == "Fc-MeCN"


def test_parse_library_text_without_a_file():
    lf = parse_library_text(BASE, "<form>")
    assert len(lf.couples) == 3 and lf.couples[0].origin.path == "<form>"
