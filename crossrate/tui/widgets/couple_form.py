"""The couple form: one labelled field per library field (units shown), each checked as it is typed."""

from textual.app import ComposeResult
from textual.containers import Horizontal, VerticalScroll
from textual.message import Message
from textual.widgets import Input, Label, Static

from ...library.couple import Couple
from ...library.schema import FIELD_SPECS, FIELDS_BY_NAME, parse_field_text
from .field_input import FieldInput


def field_text(c: Couple | None, name: str) -> str:
    """What the form shows for a field of a couple (empty when absent)."""
    if c is None:
        return ""
    v = getattr(c, name)
    if v is None or v == () or v == "":
        return "false" if name == "verified" else ""
    if name == "bonds":
        from ...library.bond_text import bonds_text

        return bonds_text(v)
    if name == "tags":
        return ", ".join(v)
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, float):
        if v != 0 and not (1e-3 <= abs(v) < 1e5):
            mant, exp = f"{v:.15e}".split("e")
            return f"{mant.rstrip('0').rstrip('.')}e{int(exp)}"
        return repr(v)
    return str(v)


#: Short placeholders of empty fields by kind (the full help is shown under the form: field_help).
PLACEHOLDERS = {"bonds": "(empty) e.g. 6:0.13:230:160", "text list": "(empty) e.g. aqua, cage"}
ID_HELP = "the couple's key in the file: lower-case letters, digits, '.', '_' and '-'"


def field_help(name: str) -> str:
    """The help line of a form field: label, meaning, and what a valid value looks like."""
    if name == "id":
        return f"*id: {ID_HELP} (required)"
    spec = FIELDS_BY_NAME[name]
    if spec.kind == "bonds":
        from ...library.bond_text import BOND_FORM

        expected = BOND_FORM
    else:
        expected = spec.expected()
    need = " (required)" if spec.required and not spec.library_default else (
        " (the file's [library] default when empty)" if spec.library_default else "")
    return f"{spec.label}: {spec.help}{need}; {expected}"


def check_text_value(name: str, text: str):
    """(TOML value, None) or (None, message) for what the user typed into one field."""
    from ...library.validation import check_field

    try:
        value = parse_field_text(name, text)
    except ValueError as exc:
        return None, str(exc)
    if value is None:
        return None, None
    _converted, msg = check_field(name, value)
    return (None, msg) if msg else (value, None)


class CoupleForm(VerticalScroll):
    """Fields of one couple. `values()` gives the raw table to write; `problems()` what is wrong.
    Up and down move between fields (as do tab and shift+tab): bindings of the editor screen."""

    class Dirty(Message):
        """A field changed (the form may or may not differ from what it opened with: see is_dirty)."""

    def __init__(self, couple: Couple | None, new_id: str, **kwargs):
        super().__init__(**kwargs)
        self._couple = couple
        self._new_id = new_id
        self._initial = {"id": new_id, **{spec.name: field_text(couple, spec.name) for spec in FIELD_SPECS}}

    def compose(self) -> ComposeResult:
        with Horizontal(classes="form-row"):
            yield Label("*id", classes="form-label")
            yield FieldInput(self._new_id, id="f-id", compact=True)
        yield Static("", id="m-id", classes="form-message", markup=False)
        for spec in FIELD_SPECS:
            with Horizontal(classes="form-row"):
                mark = "*" if spec.required and not spec.library_default else " "
                yield Label(f"{mark}{spec.label}", classes="form-label")
                # The field's whole help is on the line under the form while the field has the focus (it
                # wraps there); the placeholder stays short so nothing is cut at 80 columns.
                yield FieldInput(field_text(self._couple, spec.name), id=f"f-{spec.name}", compact=True,
                                 placeholder=PLACEHOLDERS.get(spec.kind, "(empty)"), tooltip=spec.help)
            yield Static("", id=f"m-{spec.name}", classes="form-message", markup=False)

    def _field_of(self, input_id: str) -> str:
        return input_id[2:]

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        if event.input.id:
            self._mark(self._field_of(event.input.id), event.value)
        self.post_message(self.Dirty())

    def _mark(self, name: str, text: str) -> str | None:
        if name == "id":
            from ...library.validation import bad_id_message

            msg = bad_id_message(text.strip())
        else:
            _v, msg = check_text_value(name, text)
            spec = FIELDS_BY_NAME[name]
            if msg is None and not text.strip() and spec.required and not spec.library_default:
                msg = f"required: {spec.help}"
        box = self.query_one(f"#f-{name}", Input)
        note = self.query_one(f"#m-{name}", Static)
        box.set_class(bool(msg), "-bad")
        note.update(f"! {msg}" if msg else "")
        note.display = bool(msg)
        return msg

    def is_dirty(self) -> bool:
        """True when any field differs from what the form opened with."""
        return any(self.query_one(f"#f-{name}", Input).value != text for name, text in self._initial.items())

    @property
    def couple_id(self) -> str:
        return self.query_one("#f-id", Input).value.strip()

    def values(self) -> dict:
        """The fields the user filled in, as TOML values (empty fields left out)."""
        out = {}
        for spec in FIELD_SPECS:
            v, msg = check_text_value(spec.name, self.query_one(f"#f-{spec.name}", Input).value)
            if msg is None and v is not None:
                out[spec.name] = v
        return out

    def problems(self) -> list[str]:
        """Every field's problem as 'field: message' (empty when the form is fine field by field)."""
        out = []
        for name in ("id", *(s.name for s in FIELD_SPECS)):
            msg = self._mark(name, self.query_one(f"#f-{name}", Input).value)
            if msg:
                out.append(f"{name}: {msg}")
        return out
