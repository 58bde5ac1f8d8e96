"""Fuzzing the loader: random bytes, random TOML, random field values. Never a traceback: either a valid
file or a LibraryError whose every message names the file."""

import math

import tomli_w
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st
from library_helpers import BASE

from crossrate.errors import LibraryError
from crossrate.library.schema import FIELD_SPECS
from crossrate.library.toml_loads import loads
from crossrate.library.toml_reader import read_library_file

SETTINGS = settings(max_examples=120, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])


def _load(path):
    """Read the file; fail the test on anything but success or a LibraryError naming the file."""
    try:
        lf = read_library_file(path)
    except LibraryError as exc:
        assert exc.problems
        for p in exc.problems:
            assert str(p).startswith(str(path)), str(p)
        return None
    return lf


@SETTINGS
@given(data=st.binary(max_size=400))
def test_random_bytes(tmp_path, data):
    p = tmp_path / "fuzz.toml"
    p.write_bytes(data)
    _load(p)


@SETTINGS
@given(data=st.binary(max_size=60), at=st.integers(min_value=0, max_value=len(BASE)))
def test_random_bytes_inside_a_valid_file(tmp_path, data, at):
    p = tmp_path / "fuzz.toml"
    raw = BASE.encode()
    p.write_bytes(raw[:at] + data + raw[at:])
    _load(p)


_scalars = st.one_of(
    st.none(), st.booleans(), st.integers(min_value=-(10**20), max_value=10**20),
    st.floats(allow_nan=True, allow_infinity=True), st.text(max_size=12),
    st.dates(), st.datetimes(), st.times(),
)
_values = st.recursive(_scalars, lambda kids: st.one_of(
    st.lists(kids, max_size=4),
    st.dictionaries(st.text(max_size=8), kids, max_size=4)), max_leaves=12)
_keys = st.one_of(st.sampled_from(["library", "couple", "format", "title", "name"]), st.text(max_size=10))


def _strip_none(v):
    if isinstance(v, dict):
        return {k: _strip_none(x) for k, x in v.items() if x is not None}
    if isinstance(v, list):
        return [_strip_none(x) for x in v if x is not None]
    return v


@SETTINGS
@given(doc=st.dictionaries(_keys, _values, max_size=5))
def test_random_toml_documents(tmp_path, doc):
    doc = _strip_none(doc)
    p = tmp_path / "fuzz.toml"
    p.write_text(tomli_w.dumps(doc), encoding="utf-8")
    _load(p)


@SETTINGS
@given(doc=st.dictionaries(st.text(max_size=10), _values, max_size=4),
       couple_id=st.text(max_size=10))
def test_random_couple_tables(tmp_path, doc, couple_id):
    text = tomli_w.dumps({"library": {"format": 1}, "couple": {couple_id: _strip_none(doc)}})
    p = tmp_path / "fuzz.toml"
    p.write_text(text, encoding="utf-8")
    _load(p)


_field_names = [s.name for s in FIELD_SPECS]


@SETTINGS
@given(changes=st.dictionaries(st.sampled_from(_field_names + ["k_slef", "extra"]), _values, max_size=5))
def test_random_field_values_in_a_valid_couple(tmp_path, changes):
    doc = loads(BASE)
    one = doc["couple"]["t-one"]
    for k, v in _strip_none(changes).items():
        one[k] = v
    p = tmp_path / "fuzz.toml"
    p.write_text(tomli_w.dumps(doc), encoding="utf-8")
    lf = _load(p)
    if lf is not None:
        c = lf.couple("t-one")
        # whatever got through is what the format allows
        assert c.charge_ox - c.charge_red == 1
        assert 1 <= c.radius <= 30 and 200 <= c.temperature <= 400 and abs(c.E) <= 5
        assert c.k_self is None or (c.k_self > 0 and math.isfinite(c.k_self))
        assert c.kappa_el is None or 0 < c.kappa_el <= 1
        assert (c.E00 is None) == (c.excited_form is None)
