"""Every workbench action with its title and help: the command palette and the help screen both read this."""

#: (title, help, action on the workbench screen, key)
ACTIONS = (
    ("Show couples", "the couples table, filter and detail", "view('couples')", "1"),
    ("Show prediction", "conditions and the full prediction", "view('predict')", "2"),
    ("Show rate curve", "log10 k against the driving force, regions marked", "view('curve')", "3"),
    ("Show energy curves", "reactant and product free-energy parabolas", "view('energy')", "4"),
    ("Show measured check", "compare a measured k with the prediction", "view('check')", "5"),
    ("Show rate map", "heat map of log10 k_obs for the couples in view", "view('map')", "6"),
    ("Show electrode view", "k0 of the highlighted couple, k(eta) and Delta Ep against scan rate", "view('electrode')",
     "7"),
    ("Toggle couple detail", "enlarge the detail panel (enter; esc gives it back)", "toggle_detail", "enter"),
    ("Search couples", "filter the table as you type", "search", "/"),
    ("Set oxidant", "the highlighted couple takes the electron (couple 1)", "set_oxidant", "o"),
    ("Set reductant", "the highlighted couple gives the electron (couple 2)", "set_reductant", "r"),
    ("Swap pair", "exchange oxidant and reductant", "swap", "x"),
    ("Switch energy units", "kJ/mol, kcal/mol, eV", "cycle_unit", "u"),
    ("Sort table", "sort by the next column", "sort_table", "s"),
    ("Reverse sort", "reverse the order of the sorted column", "reverse_sort", "S"),
    ("Edit couple", "edit the highlighted couple in its library file", "edit", "e"),
    ("Add couple", "a new couple in a library file", "add", "a"),
    ("Duplicate couple", "a copy of the highlighted couple under a new id", "duplicate", "d"),
    ("Delete couple", "remove the highlighted couple from its file (asks first)", "delete", "delete"),
    ("Save result", "save what the view shows (prediction, check, map) as text, Markdown or JSON", "save_result",
     "w"),
    ("Copy result", "copy what the view shows, as text, to the clipboard (works over SSH)", "copy_result", "c"),
    ("Reload library", "read the library files again", "reload", "ctrl+r"),
    ("Library problems", "what is wrong in the library files that were left out", "problems", "p"),
    ("Help", "keys, quantities and their equations", "help", "? / f1"),
)

COMMANDS = tuple((title, help_text, action) for title, help_text, action, _key in ACTIONS)
