"""The help screen: keys, what each quantity means with the name of its equation, and the caution."""

from rich.table import Table
from rich.text import Text
from textual.app import ComposeResult
from textual.binding import Binding
from textual.containers import Vertical, VerticalScroll
from textual.screen import ModalScreen
from textual.widgets import Static

from ..commands import ACTIONS

CAUTION = (
    "Predictions are estimates, not a safety assessment; follow your lab's safety rules and local "
    "regulations when handling strong oxidants and reductants."
)

QUANTITIES = (
    ("ΔG°", "reaction free energy -F(E1 - E2) from the two formal potentials (Nernst relation, n = 1)"),
    ("ΔG°'", "ΔG° + w21 - w12: free energy between precursor and successor complexes (work-corrected)"),
    ("K12", "equilibrium constant exp(-ΔG°/RT)"),
    ("w11 w22 w12 w21", "electrostatic work terms (Debye-Hückel screened Coulomb work, Marcus work term)"),
    ("λ11 λ22", "reorganization energy of each self-exchange, from k_ii = Z exp(-(w_ii + λ/4)/RT)"),
    ("λ12", "(λ11 + λ22)/2 (Marcus additivity postulate)"),
    ("ΔG‡", "w12 + (λ/4)(1 + ΔG°'/λ)²  (Marcus quadratic barrier)"),
    ("f12, W12", "terms of the Marcus cross relation k12 = (k11 k22 K12 f12)^½ W12"),
    ("k_act", "activation-controlled rate from the Marcus cross relation with work terms"),
    ("k_D", "diffusion limit (Debye-Smoluchowski with Stokes-Einstein diffusion coefficients)"),
    ("k_obs", "1/k_obs = 1/k_act + 1/k_D (diffusion cap), with a Monte Carlo 95 % interval"),
    ("regime", "endergonic, normal, activationless or inverted (Marcus driving-force regions)"),
    ("energy curves", "Marcus parabolic free-energy surfaces G_R = λx², G_P = λ(x-1)² + ΔG°'"),
    ("rate map", "log10 k_obs for every ordered pair of the couples in view (rows oxidants)"),
)


def help_table() -> Table:
    """Keys and quantities as a two-column table that wraps inside its columns."""
    t = Table.grid(padding=(0, 2))
    t.add_column(style="bold", no_wrap=True)
    t.add_column()
    t.add_row(Text("Keys", style="bold underline"), "")
    for title, help_, _action, key in ACTIONS:
        t.add_row(key, f"{title}: {help_}")
    t.add_row("ctrl+p", "command palette: every action above, searchable")
    t.add_row("ctrl+q", "quit (asks first when a form has unsaved edits)")
    t.add_row("tab / esc", "into the next field / out of a field (then the keys above work)")
    t.add_row("↑ ↓ PgUp PgDn", "move in the table and the map; scroll the prediction and the check")
    t.add_row("Home End", "first / last couple of the table")
    t.add_row("mouse", "click a row to highlight it, then o / r (or click them in the footer); a "
              "second click on a map cell sets its pair")
    t.add_row("", "")
    t.add_row(Text("Quantities", style="bold underline"), "")
    for q, text in QUANTITIES:
        t.add_row(q, text)
    t.add_row("", "")
    t.add_row("?", "in the table's first column: values not verified (recalled or estimated)")
    t.add_row("!", "in the table's first column: invented values (the demo library, made up; never measurements)")
    t.add_row("Caution", CAUTION)
    t.add_row("", Text("esc or q closes this screen", style="dim"))
    return t


class HelpScreen(ModalScreen[None]):
    CSS_PATH = "dialogs.tcss"
    BINDINGS = [Binding("escape,q,question_mark,f1", "close", "close")]

    def compose(self) -> ComposeResult:
        with Vertical(classes="dialog"):
            with VerticalScroll(id="help-scroll"):
                yield Static(help_table(), id="help-text")

    def on_mount(self) -> None:
        self.query_one("#help-scroll").focus()

    def action_close(self) -> None:
        self.dismiss(None)
