"""How far a couple's values can be trusted, as one mark and one word shared by every output.

invented: made-up values (the demo library, teaching files), never measurements;
unverified: recalled or estimated values, not yet checked against the primary source;
verified: checked against the primary source named in `source`.
An invented couple carries only its own mark: "unverified" would understate that nothing was measured.
The word is `Couple.provenance`; results of the services carry it as `*_provenance`.
"""

#: Mark beside a couple whose values are made up.
INVENTED_MARK = "!"
#: Mark beside a couple whose values are recalled or estimated, not checked against the primary source.
UNVERIFIED_MARK = "?"
#: Mark of each provenance word.
MARKS = {"invented": INVENTED_MARK, "unverified": UNVERIFIED_MARK, "verified": ""}

#: Legend of each mark, in the words every face uses.
MARK_LEGEND = {
    "invented": "invented: made-up values (demo, teaching), not measurements; never use them for real predictions",
    "unverified": "unverified: values recalled or estimated, not checked against the primary source",
}


def mark_of(kind: str) -> str:
    """The mark of a provenance word ('invented' -> '!', 'unverified' -> '?', anything else -> '')."""
    return MARKS.get(kind, "")


def provenance_mark(couple) -> str:
    """'!' for an invented couple, '?' for an unverified one, '' for a verified one."""
    return mark_of(couple.provenance)


def marked_id(couple_id: str, kind: str) -> str:
    """The id followed by the mark of its provenance word, e.g. 'hl-med2!' or 'fe-aq?'."""
    return couple_id + mark_of(kind)


def labelled_id(couple_id: str, kind: str) -> str:
    """'hl-med2 (! invented)', 'fe-aq (? unverified)', or the bare id of a verified couple."""
    mark = mark_of(kind)
    return f"{couple_id} ({mark} {kind})" if mark else couple_id


def legend_lines(kinds, what: str = "couples") -> list[str]:
    """One legend line per mark that occurs among the provenance words `kinds` (or couples), with a count."""
    kinds = [k if isinstance(k, str) else k.provenance for k in kinds]
    out = []
    for kind, text in MARK_LEGEND.items():
        n = kinds.count(kind)
        if n:
            out.append(f"{MARKS[kind]} {text} ({n} of these {what})")
    return out
