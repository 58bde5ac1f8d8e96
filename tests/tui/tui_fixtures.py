"""Helpers of the workbench tests: invented couple sets built in code (Halden Lake demo style) and an
asyncio runner for async tests. A module of its own (not conftest) so `import` finds exactly this file."""

from crossrate.library.couple import Couple, Origin


def _c(cid, name, zox, zred, E, k, radius, medium="water", I=0.1, verified=True, tags=(), line=1, **kw):
    return Couple(
        id=cid,
        name=name,
        charge_ox=zox,
        charge_red=zred,
        E=E,
        E_scale="SHE",
        radius=radius,
        medium=medium,
        ionic_strength=I,
        temperature=298.15,
        source="invented for the tests",
        k_self=k,
        verified=verified,
        tags=tuple(tags),
        origin=Origin(path="tests/tui/invented.toml", line=line, layer="test"),
        **kw,
    )


def small_couples() -> list[Couple]:
    """Eight invented couples in water at 0.1 M, plus one in acetonitrile (a different medium)."""
    return [
        _c("hl-osmium", "Halden osmium mediator", 3, 2, 0.85, 2.0e5, 6.5, line=3, tags=("mediator",)),
        _c("hl-iron", "Halden iron aqua", 3, 2, 0.74, 4.0, 3.4, line=15, verified=False, notes="recalled"),
        _c("hl-cobalt", "Halden cobalt cage", 3, 2, -0.30, 5.0, 4.5, line=27, tags=("cage",)),
        _c("hl-ruthenium", "Halden ruthenium amine", 3, 2, 0.05, 3.0e3, 3.3, line=39),
        _c("hl-cyano", "Halden cyano iron", -3, -4, 0.41, 2.0e4, 4.5, line=51),
        _c("hl-vanadium", "Halden vanadium aqua", 3, 2, -0.26, 1.0e-2, 3.4, line=63),
        _c("hl-quinone", "Halden quinone mediator", 0, -1, -0.60, 1.0e8, 3.8, line=75, tags=("organic",)),
        _c("hl-zinc-porph", "Halden zinc porphyrin cation", 1, 0, 1.10, 5.0e8, 6.0, line=87),
        _c("hl-ferrocene-mecn", "Halden ferrocene in MeCN", 1, 0, 0.63, 5.0e6, 3.8, medium="acetonitrile", line=99),
    ]


def many_couples(n: int) -> list[Couple]:
    """n invented couples in water (for table and map size tests)."""
    out = []
    for i in range(n):
        out.append(
            _c(f"gen-{i:05d}", f"generated couple {i}", 3, 2, -0.8 + 1.6 * (i % 97) / 96, 10.0 ** (i % 9), 3.0 + (i % 7) * 0.5, line=1 + 12 * i)
        )
    return out


def run_async(fn):
    """Run an async test function with asyncio (no async pytest plugin is installed here)."""
    import asyncio
    import functools

    @functools.wraps(fn)
    def wrapper(*args, **kwargs):
        return asyncio.run(fn(*args, **kwargs))

    return wrapper


async def settle(pilot):
    """Wait until text typed into the conditions or the check has been read (their quiet time has passed) and
    no worker runs any more, then one more refresh."""
    app = pilot.app
    await pilot.pause(0.05)  # keys sent in a burst are handled first (they start the quiet time)
    for _ in range(1000):
        pending = any(getattr(w, "pending", False) for w in app.screen.query("ConditionsForm, CheckPanel"))
        if not pending and all(w.is_finished for w in app.workers):
            break
        await pilot.pause(0.01)
    await pilot.pause()


def burst(app, keys) -> None:
    """Send keys to the app all at once, without waiting for any to be handled (as a fast typist on a slow
    link or a paste without bracketed-paste mode delivers them); the same key events Pilot.press makes."""
    import unicodedata

    from textual import events
    from textual.app import REPLACED_KEYS, _character_to_key, _get_unicode_name_from_key

    for key in keys:
        if len(key) == 1 and not key.isalnum():
            key = _character_to_key(key)
        try:
            char = unicodedata.lookup(_get_unicode_name_from_key(REPLACED_KEYS.get(key, key)))
        except KeyError:
            char = key if len(key) == 1 else None
        event = events.Key(key, char)
        event.set_sender(app)
        app._driver.send_message(event)


async def ready_workbench(pilot):
    """The workbench screen once its library has loaded and the services are ready (the load runs in a worker
    from the start; numpy and the services are imported in another once the rows are shown, and then the
    detail's λ breakdown and the conditions follow)."""
    from crossrate.tui.screens.workbench import WorkbenchScreen

    for _ in range(250):
        await pilot.pause(0.02)
        s = pilot.app.screen
        if isinstance(s, WorkbenchScreen) and s.couple_set is not None and s.conditions is not None:
            return s
    raise AssertionError("library never loaded")


async def set_field(pilot, field: str, text: str) -> None:
    """Focus the editor's field `field`, empty it and type `text` key by key."""
    box = pilot.app.screen.query_one(f"#f-{field}")
    box.focus()
    box.value = ""
    await pilot.press(*text)

