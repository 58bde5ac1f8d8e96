"""Layering: bundled -> group -> personal -> --library, shadowing recorded, scales merged."""

import os

import pytest
from library_helpers import BASE

from crossrate.errors import LibraryError, UnknownCoupleError
from crossrate.library.layers import config_path, layer_files, load_layered

ONE = """\
[library]
format = 1
medium = "water"
temperature = 298.15
E_scale = "SHE"

[couple.t-one]
name = "test one, {who}"
charge_ox = 3
charge_red = 2
E = {E}
radius = 3.5
ionic_strength = 0.1
source = "invented for the tests"
"""


def _one(write_lib, name, who, E):
    return write_lib(ONE.format(who=who, E=E), name)


def test_bundled_layer_alone():
    cs = load_layered(group=False, personal=False)
    ids = cs.ids()
    assert "fe-aq" in ids and "hl-med3" not in ids  # the starter; the invented demo only when asked for
    assert {c.origin.layer for c in cs} == {"bundled"}
    assert "Fc-MeCN" in cs.scales
    assert cs.file_layers and set(cs.file_layers.values()) == {"bundled"}
    assert all(len(sha) == 64 for sha in cs.file_sha256.values())


def test_demo_layer_only_when_asked_and_each_bundled_layer_apart():
    both = load_layered(group=False, personal=False, demo=True)
    assert "fe-aq" in both and "hl-med3" in both
    assert both["hl-med3"].origin.layer == "demo" and both["hl-med3"].provenance == "invented"
    assert all(c.invented and not c.verified for c in both if c.id.startswith("hl-"))
    assert not any(c.invented for c in both if not c.id.startswith("hl-"))
    demo = load_layered(group=False, personal=False, demo=True, starter=False)
    assert len(demo) and all(c.origin.layer == "demo" for c in demo)
    assert len(load_layered(group=False, personal=False, demo=True, bundled=False)) == 0


def test_empty_set_names_the_layers_searched(write_lib):
    cs = load_layered(group=False, personal=False, bundled=False)
    assert len(cs) == 0 and "every layer was left out" in cs.empty_reason()
    empty = write_lib('[library]\nformat = 1\ntitle = "empty"\n', "empty.toml")
    cs = load_layered(extra_paths=(str(empty),), group=False, bundled=False)
    why = cs.empty_reason()
    assert why.startswith("no couples loaded: searched the personal layer (") and "no such file" in why
    assert f"the cli layer ({empty}: no couple in it)" in why
    with pytest.raises(UnknownCoupleError, match="unknown couple 'hl-med2': no couples loaded: searched"):
        cs["hl-med2"]


def test_order_and_shadowing_through_all_layers(write_lib, monkeypatch):
    g = _one(write_lib, "group.toml", "group", 0.50)
    p = _one(write_lib, "personal.toml", "personal", 0.60)
    c = _one(write_lib, "cli.toml", "cli", 0.70)
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", str(g))
    monkeypatch.setenv("CROSSRATE_PERSONAL_LIBRARY", str(p))
    cs = load_layered(extra_paths=(str(c),), bundled=False)
    one = cs["t-one"]
    assert (one.E, one.origin.layer, one.origin.path) == (0.70, "cli", str(c))
    hidden = [(s.hidden.layer, s.winner.layer) for s in cs.shadowed if s.couple_id == "t-one"]
    assert hidden == [("group", "personal"), ("personal", "cli")]
    assert cs.files == [str(g), str(p), str(c)]
    assert cs.file_layers == {str(g): "group", str(p): "personal", str(c): "cli"}


def test_group_from_config_file_relative_to_it_and_env_wins(write_lib, monkeypatch, tmp_path):
    cfg = config_path()
    assert cfg == tmp_path / "config" / "crossrate" / "config.toml"  # XDG_CONFIG_HOME honoured
    cfg.parent.mkdir(parents=True)
    _one(write_lib, "config/crossrate/g.toml", "config group", 0.41)
    cfg.write_text('group_library = "g.toml"\ntheme = "other settings are left alone"\n')
    cs = load_layered(bundled=False)
    assert cs["t-one"].name == "test one, config group" and cs["t-one"].origin.layer == "group"
    env = _one(write_lib, "env.toml", "env group", 0.42)
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", str(env))
    assert load_layered(bundled=False)["t-one"].name == "test one, env group"


def test_personal_from_config_and_default_file(write_lib, tmp_path):
    cfg = config_path()
    cfg.parent.mkdir(parents=True)
    _one(write_lib, "config/crossrate/personal.toml", "default personal", 0.3)
    cs = load_layered(bundled=False)
    assert cs["t-one"].origin.layer == "personal" and cs["t-one"].name == "test one, default personal"
    _one(write_lib, "mine.toml", "configured personal", 0.31)
    cfg.write_text(f'personal_library = "{tmp_path / "mine.toml"}"\n')
    assert load_layered(bundled=False)["t-one"].name == "test one, configured personal"


def test_missing_group_file_is_an_error_missing_personal_is_not(monkeypatch, tmp_path):
    monkeypatch.setenv("CROSSRATE_PERSONAL_LIBRARY", str(tmp_path / "not-yet.toml"))
    assert len(load_layered(bundled=False)) == 0
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", str(tmp_path / "share" / "couples.toml"))
    with pytest.raises(LibraryError) as info:
        load_layered(bundled=False)
    assert str(info.value) == (f"{tmp_path / 'share' / 'couples.toml'}: no such file (set by "
                               "CROSSRATE_GROUP_LIBRARY); expected a library TOML file there")


def test_several_group_paths_in_the_variable(write_lib, monkeypatch):
    a = _one(write_lib, "a.toml", "a", 0.1)
    b = _one(write_lib, "b.toml", "b", 0.2)
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", f"{a}{os.pathsep}{b}")
    assert [f.path for f in layer_files(bundled=False, personal=False)] == [a, b]
    assert load_layered(bundled=False)["t-one"].name == "test one, b"


def test_same_file_twice_is_read_once(base_file, monkeypatch):
    monkeypatch.setenv("CROSSRATE_GROUP_LIBRARY", str(base_file))
    cs = load_layered(extra_paths=(str(base_file),), bundled=False)
    assert cs.shadowed == [] and cs.files == [str(base_file)]
    assert cs["t-one"].origin.layer == "group"


def test_problems_of_every_file_reported_together(write_lib):
    a = write_lib(BASE.replace("radius = 3.5", "radius = 0.2"), "a.toml")
    b = write_lib(BASE.replace("E = -0.20", "E = = -0.20"), "b.toml")
    with pytest.raises(LibraryError) as info:
        load_layered(extra_paths=(str(a), str(b)), bundled=False)
    paths = {p.path for p in info.value.problems}
    assert paths == {str(a), str(b)}


def test_scale_defined_differently_in_two_files_is_refused(write_lib):
    a = write_lib(BASE, "a.toml")
    b = write_lib(BASE.replace("offset_V = 0.63", "offset_V = 0.40"), "b.toml")
    with pytest.raises(LibraryError) as info:
        load_layered(extra_paths=(str(a), str(b)), bundled=False)
    (p,) = info.value.problems
    assert p.path == str(b) and p.field == "library.scales.Fc-MeCN"
    assert f"defined differently in {a} (relative_to SHE, offset_V 0.63)" in p.message
    # the same definition twice is fine (the bundled files both define Fc-MeCN)
    load_layered(extra_paths=(str(a), str(write_lib(BASE, "c.toml"))), bundled=False)


def test_later_file_may_use_an_earlier_files_scale(write_lib):
    a = write_lib(BASE, "a.toml")
    b = write_lib(
        '[library]\nformat = 1\n\n[couple.t-mecn]\nname = "x"\ncharge_ox = 1\ncharge_red = 0\nE = 0.2\n'
        'E_scale = "Fc-MeCN"\nradius = 4\nmedium = "acetonitrile"\nionic_strength = 0.1\ntemperature = 298.15\n'
        'source = "invented"\n', "b.toml")
    cs = load_layered(extra_paths=(str(a), str(b)), bundled=False)
    E, root = cs.E_on_root(cs["t-mecn"])
    assert root == "SHE" and E == pytest.approx(0.2 + 0.63, abs=1e-12)  # E(SHE) = E(Fc) + offset


def test_unrelated_scale_is_its_own_root_and_never_converted(write_lib):
    text = BASE.replace("# --- aqueous ---", '[library.scales.QRE]\nname = "uncalibrated quasi-reference"\n\n'
                        "# --- aqueous ---").replace('E_scale = "Fc-MeCN"', 'E_scale = "QRE"')
    cs = load_layered(extra_paths=(str(write_lib(text)),), bundled=False)
    E, root = cs.E_on_root(cs["t-three"])
    assert (E, root) == (0.10, "QRE")
    assert cs.E_on_root(cs["t-one"])[1] == "SHE"
    with pytest.raises(ValueError, match="cannot be related"):
        cs.scales.convert(0.1, "QRE", "SHE")


def test_malformed_config_file_is_reported_with_position(tmp_path):
    cfg = config_path()
    cfg.parent.mkdir(parents=True)
    cfg.write_text("group_library = \n")
    with pytest.raises(LibraryError) as info:
        load_layered(bundled=False)
    assert str(info.value).startswith(f"{cfg}:1:")
    cfg.write_text("group_library = 5\n")
    with pytest.raises(LibraryError, match="field group_library: expected a file path in quotes"):
        load_layered(bundled=False)
