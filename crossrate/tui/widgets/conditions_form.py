"""Conditions editable in place: each field is checked as it is typed; a bad value is marked and explained,
and only a complete, valid set of conditions is passed on (so the last good prediction stays)."""

from textual.app import ComposeResult
from textual.containers import Vertical
from textual.message import Message
from textual.widgets import Checkbox, Input, Label, Select, Static

from ...errors import ConditionsError
from .field_input import FieldInput
from .field_select import FieldSelect
from .plain_checkbox import PlainCheckbox

OWN = "couples' own"
#: Quiet time after the last keystroke in a field before the conditions are read and passed on, s: a burst of
#: keys gives one recompute, and the field is never judged (or the prediction redone) half-typed.
DEBOUNCE_S = 0.12


class ConditionsForm(Vertical):
    """Temperature, ionic strength, medium, Z, diffusion cap, mixed media and the rate model (classical, or
    semiclassical when its box is ticked)."""

    class Changed(Message):
        """Valid conditions were entered."""

        def __init__(self, conditions):
            self.conditions = conditions
            super().__init__()

    class Invalid(Message):
        """A field holds a bad value: `problem` says which and what was expected."""

        def __init__(self, problem: str):
            self.problem = problem
            super().__init__()

    _timer = None

    @property
    def pending(self) -> bool:
        """True while typed text waits for the quiet time before it is read."""
        return self._timer is not None

    def flush(self) -> None:
        """Read the fields now (a pending debounce is dropped)."""
        if self._timer is not None:
            self._timer.stop()
            self._timer = None
        self._changed()

    def compose(self) -> ComposeResult:
        yield Label("temperature (K)")
        yield FieldInput("298.15", id="cond-T", compact=True)
        yield Label("ionic strength (M)")
        yield FieldInput("", placeholder=OWN, id="cond-I", compact=True)
        yield Label("medium")
        yield FieldSelect([], prompt=OWN, id="cond-medium", compact=True)
        yield Label("Z (M⁻¹ s⁻¹)")
        yield FieldInput("1e11", id="cond-Z", compact=True)
        yield PlainCheckbox("diffusion cap", True, id="cond-diffusion", compact=True)
        yield PlainCheckbox("allow mixed media", False, id="cond-mixed", compact=True)
        yield PlainCheckbox("semiclassical model", False, id="cond-model", compact=True)
        yield Static("", id="cond-message", markup=False)

    def set_media(self, keys: list[str]) -> None:
        self.query_one("#cond-medium", Select).set_options((k, k) for k in keys)

    def _number(self, wid: str, label: str, unit: str, blank_ok: bool) -> float | None:
        box = self.query_one(wid, Input)
        s = box.value.strip()
        if not s and blank_ok:
            return None
        if not s:
            box.add_class("-bad")
            raise ConditionsError(f"{label}: empty; expected a number ({unit})")
        try:
            v = float(s)
        except ValueError:
            box.add_class("-bad")
            raise ConditionsError(f"{label}: {s!r} is not a number ({unit})") from None
        return v

    def read(self):
        """The conditions in the form (services.conditions.Conditions); ConditionsError when one is bad."""
        from ...services.conditions import Conditions

        for box in self.query(Input):
            box.remove_class("-bad")
        T = self._number("#cond-T", "temperature", "K", False)
        I = self._number("#cond-I", "ionic strength", "M", True)
        Z = self._number("#cond-Z", "Z", "M^-1 s^-1", False)
        medium = self.query_one("#cond-medium", Select).value
        try:
            return Conditions(
                temperature_K=T,
                ionic_strength_M=I,
                medium=None if medium is Select.NULL else str(medium),
                Z=Z,
                diffusion=self.query_one("#cond-diffusion", Checkbox).value,
                allow_mixed_media=self.query_one("#cond-mixed", Checkbox).value,
                rate_model="semiclassical" if self.query_one("#cond-model", Checkbox).value else "classical",
            )
        except ConditionsError as exc:
            text = str(exc)
            wid = "#cond-T" if text.startswith("temperature") else "#cond-I" if text.startswith("ionic") else "#cond-Z"
            self.query_one(wid, Input).add_class("-bad")
            raise

    def _changed(self) -> None:
        msg = self.query_one("#cond-message", Static)
        try:
            cond = self.read()
        except ConditionsError as exc:
            msg.update(f"! {exc}; the last good prediction is kept")
            msg.add_class("-bad")
            self.post_message(self.Invalid(str(exc)))
            return
        msg.update("")
        msg.remove_class("-bad")
        self.post_message(self.Changed(cond))

    def on_input_changed(self, event: Input.Changed) -> None:
        event.stop()
        if self._timer is not None:
            self._timer.stop()
        self._timer = self.set_timer(DEBOUNCE_S, self.flush)

    def on_input_submitted(self, event: Input.Submitted) -> None:
        event.stop()
        self.flush()

    def on_select_changed(self, event: Select.Changed) -> None:
        event.stop()
        self.flush()

    def on_checkbox_changed(self, event: Checkbox.Changed) -> None:
        event.stop()
        self.flush()
