"""The optional provenance fields doi and date: their form is checked with the usual file:line messages, and
they are shown by `library show`, in the JSON export and in the workbench's detail panel (the DOI as a link)."""

import datetime
import json

from library_helpers import BASE, line_of

from crossrate.cli.main import main
from crossrate.errors import LibraryError
from crossrate.library.couple_set import CoupleSet
from crossrate.library.toml_reader import parse_library_text

WITH = BASE.replace('source = "invented for the tests"\ntags = ["aqua"]',
                    'source = "invented for the tests"\ndoi = "10.1021/ja00000a001"\ndate = 2024-05-17\n'
                    'tags = ["aqua"]', 1)


def _problems(text):
    try:
        parse_library_text(text, "lib.toml")
    except LibraryError as exc:
        return [str(p) for p in exc.problems]
    return []


def test_doi_and_date_read_back():
    c = parse_library_text(WITH, "lib.toml").couples[0]
    assert c.doi == "10.1021/ja00000a001"
    assert c.date == datetime.date(2024, 5, 17)
    quoted = WITH.replace("date = 2024-05-17", 'date = "2024-05-17"')
    assert parse_library_text(quoted, "lib.toml").couples[0].date == datetime.date(2024, 5, 17)


def test_bad_doi_forms_name_the_line():
    line = line_of(WITH, "doi =")
    for bad, expected in (('"https://doi.org/10.1021/ja00000a001"', 'expected the DOI alone: "10.1021/ja00000a001"'),
                          ('"10.10/x"', 'expected a DOI "10.NNNN/suffix"'),
                          ('"10.1021/has space"', 'expected a DOI "10.NNNN/suffix"'),
                          ("1021", 'expected a DOI "10.NNNN/suffix"')):
        (msg,) = _problems(WITH.replace('"10.1021/ja00000a001"', bad))
        assert msg.startswith(f"lib.toml:{line}: couple t-one: field doi: ") and expected in msg, msg


def test_bad_dates_name_the_line():
    line = line_of(WITH, "date =")
    future = (datetime.date.today() + datetime.timedelta(days=2)).isoformat()
    for bad, expected in ((future, "in the future"), ('"2024-02-30"', "day is out of range"),
                          ('"17.05.2024"', "expected a date YYYY-MM-DD"),
                          ("2024-05-17T10:00:00", "expected a date YYYY-MM-DD")):
        (msg,) = _problems(WITH.replace("date = 2024-05-17", f"date = {bad}"))
        assert msg.startswith(f"lib.toml:{line}: couple t-one: field date: ") and expected in msg, msg


def test_show_and_json_carry_doi_and_date(tmp_path, capsys, monkeypatch):
    monkeypatch.setenv("COLUMNS", "100")
    path = tmp_path / "lib.toml"
    path.write_text(WITH, encoding="utf-8")
    assert main(["library", "show", "t-one", "--no-bundled", "--library", str(path)]) == 0
    out = capsys.readouterr().out
    assert "doi             10.1021/ja00000a001" in out and "date            2024-05-17" in out
    assert main(["library", "show", "t-one", "--no-bundled", "--library", str(path), "--format", "json"]) == 0
    (rec,) = json.loads(capsys.readouterr().out)
    assert rec["doi"] == "10.1021/ja00000a001" and rec["date"] == "2024-05-17"


def test_detail_panel_links_the_doi():
    from rich.console import Console

    from crossrate.tui.widgets.couple_detail import detail_text

    lf = parse_library_text(WITH, "lib.toml")
    cs = CoupleSet(lf.couples)
    console = Console(width=100, record=True, color_system="truecolor", force_terminal=True)
    console.print(detail_text(cs, cs["t-one"]))
    text = console.export_text()
    assert "doi" in text and "10.1021/ja00000a001" in text and "2024-05-17" in text
    segments = list(console.render(detail_text(cs, cs["t-one"])))
    links = {s.style.link for s in segments if s.style is not None and s.style.link}
    assert links == {"https://doi.org/10.1021/ja00000a001"}
