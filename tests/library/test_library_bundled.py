"""The bundled libraries validate clean and say what they are; the format docs cover every field."""

import re
from pathlib import Path

import pytest

from crossrate.library.couple import COUPLE_FIELDS
from crossrate.library.schema import FIELD_SPECS
from crossrate.library.toml_reader import parse_library_text, read_library_file

LIBS = Path(__file__).resolve().parents[2] / "libraries"


@pytest.mark.parametrize("name", ["demo.toml", "starter.toml"])
def test_bundled_library_validates(name):
    lf = read_library_file(LIBS / name, "bundled")
    assert len(lf.couples) >= 20


def test_demo_is_invented_and_covers_the_cases_the_examples_need():
    lf = read_library_file(LIBS / "demo.toml")
    assert "INVENTED FOR THE CROSSRATE DEMO" in lf.text and "Halden Lake" in lf.title
    assert all("invented for the crossrate demo" in c.source for c in lf.couples)
    assert 20 <= len(lf.couples) <= 30
    ks = [c.k_self for c in lf.couples if c.k_self is not None]
    assert min(ks) <= 1e-2 * 1.0001 and max(ks) >= 5e8  # a spread over ten decades
    assert {c.medium for c in lf.couples} >= {"water", "acetonitrile"}
    assert {c.E_scale for c in lf.couples} >= {"SHE", "Fc-MeCN"}
    assert lf.scales["Fc-MeCN"].relative_to == "SHE" and lf.scales["Fc-MeCN"].offset_V == pytest.approx(0.63)
    assert sum("spin-change" in c.tags for c in lf.couples) >= 2
    assert any(c.E00 is not None and c.excited_form for c in lf.couples)
    assert any(c.bonds and c.k_self is None for c in lf.couples)
    # invented, never verified: every couple says so and none claims verified = true
    assert all(c.invented and not c.verified for c in lf.couples)
    assert not re.search(r"^verified *= *true", lf.text, re.M)
    assert {c.charge_ox - c.charge_red for c in lf.couples} == {1}
    assert len({(c.charge_ox, c.charge_red) for c in lf.couples}) >= 5
    assert lf.text.count("\n#") >= 10  # a commented file, as a group would keep it


def test_starter_values_are_all_marked_recalled():
    lf = read_library_file(LIBS / "starter.toml")
    for c in lf.couples:
        assert c.verified is False and c.invented is False, c.id
        assert "from memory" in c.source, c.id
    ids = {c.id for c in lf.couples}
    assert {"fe-aq", "ru-nh3-6", "co-nh3-6", "co-phen3", "fe-phen3", "ru-bpy3", "ircl6", "fe-cn6", "fc-mecn",
            "me10fc-mecn", "mno4", "mo-cn8", "w-cn8", "os-bpy3"} <= ids
    assert "spin-change" in lf.couple("co-nh3-6").tags


def test_starter_proteins_and_organic_mediators_carry_their_cautions():
    lf = read_library_file(LIBS / "starter.toml")
    proteins = [c for c in lf.couples if "protein" in c.tags]
    assert {c.id for c in proteins} >= {"cyt-c", "azurin"}
    section = lf.text.split("# --- Electron-transfer proteins", 1)[1].split("[couple.", 1)[0]
    assert "ionic strength" in section and "pH" in section  # the cautions protein couples need
    for c in proteins:
        assert "pH" in c.notes and c.medium == "water" and not c.verified, c.id
        assert c.k_self_log10_sd is not None and c.k_self_log10_sd >= 0.7, c.id  # uncertain: said by a wide SD
    mediators = {c.id for c in lf.couples if "mediator" in c.tags and "organic" in c.tags}
    assert mediators >= {"mv", "bq", "fc-meoh"}
    for cid in mediators | {c.id for c in proteins}:
        c = lf.couple(cid)
        # unsure values say so in the note; one electron, outer sphere (charge_ox - charge_red = 1)
        assert "Not sure" in c.notes and "from memory" in c.source and c.charge_ox - c.charge_red == 1, cid


def _readme():
    return (LIBS / "README.md").read_text(encoding="utf-8")


def test_readme_documents_every_field():
    text = _readme()
    for s in FIELD_SPECS:
        assert f"| `{s.name}` |" in text, s.name
    for key in ("count", "delta_d", "f_ox", "f_red", "relative_to", "offset_V", "CROSSRATE_GROUP_LIBRARY",
                "CROSSRATE_PERSONAL_LIBRARY", "XDG_CONFIG_HOME", ".bak", ".lock"):
        assert key in text, key
    assert "predictions made from these values are estimates, not a safety assessment" in text.lower()


def test_readme_complete_example_validates():
    text = _readme()
    section = text.split("## A complete example file", 1)[1]
    example = re.search(r"```toml\n(.*?)```", section, re.S).group(1)
    lf = parse_library_text(example, "README example")
    assert len(lf.couples) == 4


def test_field_specs_cover_the_couple_record():
    assert {s.name for s in FIELD_SPECS} == set(COUPLE_FIELDS)
    for s in FIELD_SPECS:
        assert s.help and (s.kind != "number" or (s.low is not None and s.high is not None))
