"""Shadowing: a couple of a later layer replacing the couple of the same id from an earlier one.

Its own module, imported only when a layer does shadow another: defining a frozen dataclass costs a cold
command about 1 ms (Python 3.11), and the bundled layers alone shadow nothing.
"""

from dataclasses import dataclass

from .couple import Origin


@dataclass(frozen=True)
class Shadowing:
    """Couple `couple_id` from `hidden` is replaced by the one from `winner` (a later layer)."""

    couple_id: str
    hidden: Origin
    winner: Origin
