"""Edits change only the edited couple's table: every other byte stays, comments inside the table too."""

import dataclasses

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from library_helpers import BASE

from crossrate.errors import ConflictError, LibraryError
from crossrate.library.couple import BondSet
from crossrate.library.couple_edits import add_couple, remove_couple, rename_couple, update_couple
from crossrate.library.table_editor import TableEditError, TableEditor, format_value
from crossrate.library.toml_reader import read_library_file


def _split_around(text: str, start_marker: str, end_marker: str | None):
    """(before, table, after) of text around the region [start_marker, end_marker)."""
    a = text.index(start_marker)
    b = text.index(end_marker) if end_marker else len(text)
    return text[:a], text[a:b], text[b:]


def test_update_changes_only_the_changed_lines(base_file):
    lf = read_library_file(base_file)
    two = lf.couple("t-two")
    new = dataclasses.replace(two, k_self=7.5e6, notes="re-measured", tags=("aqua", "checked"))
    sha = update_couple(base_file, new, lf.sha256)
    text = base_file.read_text()
    before, table, after = _split_around(text, "[couple.t-two]", "# --- acetonitrile ---")
    b0, t0, a0 = _split_around(BASE, "[couple.t-two]", "# --- acetonitrile ---")
    assert before == b0 and after == a0  # every other byte identical
    assert "# a comment line inside the table\n" in table  # comment inside the edited table kept
    assert table.count("\n") == t0.count("\n") + 2  # k_self changed in place; notes and tags added
    assert "k_self = 7.5e6\n" in table
    assert 'notes = "re-measured"\ntags = ["aqua", "checked"]\nverified = false\n' in table
    again = read_library_file(base_file)
    assert again.sha256 == sha
    assert again.couple("t-two") == new
    assert again.couple("t-one") == lf.couple("t-one") and again.couple("t-three") == lf.couple("t-three")


def test_update_keeps_the_trailing_comment_of_a_changed_line(base_file):
    lf = read_library_file(base_file)
    update_couple(base_file, dataclasses.replace(lf.couple("t-one"), k_self=2.0e3), lf.sha256)
    text = base_file.read_text()
    assert "k_self = 2000.0  # invented\n" in text
    assert text.replace("k_self = 2000.0  # invented", "k_self = 1.0e3  # invented") == BASE


def test_update_with_equal_values_changes_nothing(base_file):
    lf = read_library_file(base_file)
    update_couple(base_file, lf.couple("t-three"), lf.sha256)
    assert base_file.read_text() == BASE


def test_removing_an_optional_field_drops_its_line_only(base_file):
    lf = read_library_file(base_file)
    update_couple(base_file, dataclasses.replace(lf.couple("t-one"), k_self=None, tags=()), lf.sha256)
    text = base_file.read_text()
    assert "k_self = 1.0e3  # invented\n" not in text
    assert 'tags = []\n' in text  # a field the table had stays, now empty
    assert text.replace("tags = []", 'tags = ["aqua"]') == BASE.replace("k_self = 1.0e3  # invented\n", "")


def test_new_field_goes_to_its_place_in_field_order(base_file):
    lf = read_library_file(base_file)
    bonds = (BondSet(6, 0.1, 200.0, 150.0),)
    update_couple(base_file, dataclasses.replace(lf.couple("t-one"), E_sd=0.01, bonds=bonds), lf.sha256)
    lines = base_file.read_text().split("\n")
    i = lines.index("E = 0.50")
    assert lines[i + 1] == "E_sd = 0.01"
    j = lines.index("ionic_strength = 0.1")
    assert lines[j + 1] == "bonds = [{count = 6, delta_d = 0.1, f_ox = 200.0, f_red = 150.0}]"
    assert read_library_file(base_file).couple("t-one").bonds == bonds


def test_add_appends_and_keeps_everything_else(base_file):
    lf = read_library_file(base_file)
    new = dataclasses.replace(lf.couple("t-one"), id="t-four", name="test four")
    add_couple(base_file, new, lf.sha256)
    text = base_file.read_text()
    assert text.startswith(BASE)
    tail = text[len(BASE):]
    # defaults of the file are not spelled out again; verified always is
    assert tail.startswith('\n[couple.t-four]\nname = "test four"\n')
    assert "medium" not in tail and "E_scale" not in tail and "verified = true" in tail
    assert read_library_file(base_file).couple("t-four") == new


def test_add_creates_a_missing_file(tmp_path, base_file):
    c = read_library_file(base_file).couple("t-two")
    p = tmp_path / "mine.toml"
    add_couple(p, c, None)
    lf = read_library_file(p)
    assert lf.couple("t-two") == c and lf.title == "mine"
    # a file that appeared meanwhile is not overwritten
    with pytest.raises(ConflictError, match="exists already"):
        add_couple(p, dataclasses.replace(c, id="t-x"), None)


def test_add_refuses_a_taken_id(base_file):
    lf = read_library_file(base_file)
    with pytest.raises(TableEditError, match="already in the file"):
        add_couple(base_file, lf.couple("t-one"), lf.sha256)
    assert base_file.read_text() == BASE


def test_rename_changes_the_header_only(base_file):
    lf = read_library_file(base_file)
    rename_couple(base_file, "t-two", "t-2.b", lf.sha256)
    assert base_file.read_text() == BASE.replace("[couple.t-two]", '[couple."t-2.b"]')
    assert read_library_file(base_file).couple("t-2.b").name == "test two 2+/1+"


def test_rename_refuses_bad_or_taken_ids(base_file):
    lf = read_library_file(base_file)
    with pytest.raises(TableEditError, match="bad id"):
        rename_couple(base_file, "t-two", "T two", lf.sha256)
    with pytest.raises(TableEditError, match="already in the file"):
        rename_couple(base_file, "t-two", "t-one", lf.sha256)
    assert base_file.read_text() == BASE


def test_remove_deletes_the_table_and_one_blank_line(base_file):
    lf = read_library_file(base_file)
    remove_couple(base_file, "t-two", lf.sha256)
    before, table, after = _split_around(BASE, "[couple.t-two]", "# --- acetonitrile ---")
    assert base_file.read_text() == before + after
    assert [c.id for c in read_library_file(base_file).couples] == ["t-one", "t-three"]


def test_remove_last_table(base_file, write_lib):
    lf = read_library_file(base_file)
    remove_couple(base_file, "t-three", lf.sha256)
    text = base_file.read_text()
    # the comment above the table is not part of it and stays
    assert text == BASE[: BASE.index("[couple.t-three]")]
    assert read_library_file(base_file).couple("t-two") is not None
    # a last table after a blank line: the blank line goes with it
    p = write_lib(BASE + '\n[couple.t-four]\nname = "x"\ncharge_ox = 1\ncharge_red = 0\nE = 0.1\nradius = 3\n'
                  'ionic_strength = 0\nsource = "s"\n', "four.toml")
    remove_couple(p, "t-four", read_library_file(p).sha256)
    assert p.read_text() == BASE


def test_crlf_file_stays_crlf(write_lib):
    p = write_lib(BASE.replace("\n", "\r\n"))
    lf = read_library_file(p)
    update_couple(p, dataclasses.replace(lf.couple("t-one"), k_self=3.0e3, notes="x"), lf.sha256)
    data = p.read_bytes()
    assert b"\n" not in data.replace(b"\r\n", b"")
    assert b"k_self = 3000.0  # invented\r\nradius" in data


def test_multiline_value_replaced_whole(write_lib):
    text = BASE.replace('tags = ["aqua"]', 'tags = [\n  "aqua",  # first\n  "x",\n]')
    p = write_lib(text)
    lf = read_library_file(p)
    update_couple(p, dataclasses.replace(lf.couple("t-one"), tags=("aqua", "y")), lf.sha256)
    assert p.read_text() == text.replace('tags = [\n  "aqua",  # first\n  "x",\n]', 'tags = ["aqua", "y"]')


def test_couple_with_subtables_is_not_edited_in_place(write_lib):
    text = BASE.replace("[couple.t-two]", "[[couple.t-one.bonds]]\ncount = 6\ndelta_d = 0.1\nf_ox = 200.0\n"
                        "f_red = 150.0\n\n[couple.t-two]")
    p = write_lib(text)
    lf = read_library_file(p)  # a valid file
    assert lf.couple("t-one").bonds == (BondSet(6, 0.1, 200.0, 150.0),)
    with pytest.raises(TableEditError, match="sub-table"):
        update_couple(p, dataclasses.replace(lf.couple("t-one"), k_self=5.0), lf.sha256)
    assert p.read_text() == text


def test_edit_producing_an_invalid_file_is_refused(base_file):
    lf = read_library_file(base_file)
    with pytest.raises(LibraryError, match="field radius: got 0.5 angstrom"):
        update_couple(base_file, dataclasses.replace(lf.couple("t-one"), radius=0.5), lf.sha256)
    assert base_file.read_text() == BASE
    assert not base_file.with_name("lib.toml.bak").exists()


def test_safety_net_refuses_an_edit_that_would_touch_other_couples(base_file, monkeypatch):
    # If the text-level editor ever misjudged a table's extent, the parsed rest of the file would differ:
    # simulate that and check the edit is refused with the file untouched.
    lf = read_library_file(base_file)
    real = TableEditor.replace

    def sloppy(self, couple_id, values):
        return real(self, couple_id, values).replace("E = 0.10", "E = 0.11")

    monkeypatch.setattr(TableEditor, "replace", sloppy)
    with pytest.raises(TableEditError, match="would also change other parts"):
        update_couple(base_file, dataclasses.replace(lf.couple("t-one"), k_self=2.0), lf.sha256)
    assert base_file.read_text() == BASE


def test_format_value_round_trips_through_toml():
    from crossrate.library.toml_loads import loads

    for v in (1e-15, 4.2e13, 0.1, -0.26, 3, "a \"quoted\" # text", True, ["a", "b"],
              [{"count": 6, "delta_d": 0.14, "f_ox": 255.0, "f_red": 161.0}]):
        assert loads(f"v = {format_value(v)}")["v"] == v


_notes = st.text(alphabet=st.characters(blacklist_categories=("Cs",), blacklist_characters="\x7f"), max_size=30)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(E=st.floats(-5, 5), k=st.one_of(st.none(), st.floats(1e-12, 1e12)), radius=st.floats(1, 30),
       notes=_notes, tags=st.lists(st.text(alphabet="abc-# \"'", min_size=1, max_size=6).filter(str.strip), max_size=3))
def test_round_trip_of_random_values(write_lib, E, k, radius, notes, tags):
    # read -> edit -> write -> read: the edited couple reads back as written, every other byte stays
    p = write_lib(BASE)
    lf = read_library_file(p)
    new = dataclasses.replace(lf.couple("t-two"), E=E, k_self=k, radius=radius, notes=notes, tags=tuple(tags))
    update_couple(p, new, lf.sha256)
    text = p.read_text(encoding="utf-8")
    before, _, after = _split_around(text, "[couple.t-two]", "# --- acetonitrile ---")
    b0, _, a0 = _split_around(BASE, "[couple.t-two]", "# --- acetonitrile ---")
    assert (before, after) == (b0, a0)
    again = read_library_file(p)
    assert again.couple("t-two") == new
    assert "# a comment line inside the table" in text


def test_large_and_small_floats_are_written_as_chemists_write_them():
    # Rate constants span decades: 2.5e8 reads better than 250000000.0 in a hand-edited file, and the text
    # must read back as exactly the same float (TOML 1.0 float syntax allows a signed exponent).
    import tomllib

    from crossrate.library.table_editor import format_value

    for value, text in [(2.5e8, "2.5e8"), (1e-15, "1e-15"), (-2.5e-7, "-2.5e-7"), (0.5, "0.5"), (3000.0, "3000.0")]:
        assert format_value(value) == text
        assert tomllib.loads(f"v = {text}")["v"] == value
