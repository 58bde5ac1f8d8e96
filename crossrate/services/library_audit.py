"""Provenance audit of the loaded couples: which are invented, unverified or estimated, and which of them
the predictions of a measured-rates check file rely on.

A couple is
* invented: made-up values (`invented = true`, the demo library), never measurements;
* unverified: recalled or estimated values not yet checked against the primary source (`verified` not true);
* estimated: no measured self-exchange rate, so every prediction with it estimates k_self from a
  reorganization energy (lambda_total, or lambda_in / bond data plus the two-sphere lambda_out; see
  services.self_exchange), or it has no self-exchange data at all and cannot be predicted.
Each couple also carries its DOI and date (when given) and where it was read, so a reviewer can follow it
to its source.
"""

from dataclasses import dataclass

from ..library.couple import Couple
from ..library.couple_set import CoupleSet

#: How a couple's self-exchange rate is obtained, from its own fields (services.self_exchange, in order).
K_SELF_MEASURED = "k_self given"
K_SELF_FROM_LAMBDA_TOTAL = "estimated from lambda_total"
K_SELF_FROM_STRUCTURE = "estimated from lambda_in / bonds + two-sphere lambda_out"
K_SELF_NONE = "no self-exchange data"


def k_self_basis(c: Couple) -> str:
    """Where a couple's k_self comes from: one of the K_SELF_* words."""
    if c.k_self is not None:
        return K_SELF_MEASURED
    if c.lambda_total is not None:
        return K_SELF_FROM_LAMBDA_TOTAL
    if c.lambda_in is not None or c.bonds:
        return K_SELF_FROM_STRUCTURE
    return K_SELF_NONE


@dataclass(frozen=True)
class CoupleAudit:
    """One couple's provenance: id; provenance "invented" / "unverified" / "verified"; k_self_basis (K_SELF_*);
    doi and date (ISO text) or None; source text; where (path:line, layer); check_lines: lines of the check
    file whose predictions use the couple (empty without a check file)."""

    couple_id: str
    provenance: str
    k_self_basis: str
    doi: str | None
    date: str | None
    source: str
    where: str
    layer: str
    check_lines: tuple[int, ...] = ()

    @property
    def estimated(self) -> bool:
        return self.k_self_basis != K_SELF_MEASURED

    @property
    def flagged(self) -> bool:
        """True when a reviewer should look at it: invented, unverified or estimated."""
        return self.provenance != "verified" or self.estimated

    def to_dict(self) -> dict:
        return {"id": self.couple_id, "provenance": self.provenance, "k_self_basis": self.k_self_basis,
                "estimated": self.estimated, "doi": self.doi, "date": self.date, "source": self.source,
                "where": self.where, "layer": self.layer, "check_lines": list(self.check_lines)}


@dataclass(frozen=True)
class CheckUse:
    """What a check file's predictions rely on: path; rows: number of rows; couples: audits of the couples
    its rows name (file order of first use); unknown: (line, id) of ids not in the loaded set;
    rows_on: rows that use at least one couple of each kind ("invented", "unverified", "estimated")."""

    path: str
    rows: int
    couples: tuple[CoupleAudit, ...]
    unknown: tuple[tuple[int, str], ...]
    rows_on: dict

    def to_dict(self) -> dict:
        return {"path": self.path, "rows": self.rows, "couples": [c.to_dict() for c in self.couples],
                "unknown": [{"line": ln, "id": cid} for ln, cid in self.unknown], "rows_on": dict(self.rows_on)}


@dataclass(frozen=True)
class AuditReport:
    """The audit of a loaded set: every couple's audit (set order), counts per kind, and the check file's use."""

    couples: tuple[CoupleAudit, ...]
    counts: dict
    check: CheckUse | None = None

    def to_dict(self) -> dict:
        return {"counts": dict(self.counts), "couples": [c.to_dict() for c in self.couples],
                "check": None if self.check is None else self.check.to_dict()}


def _audit(c: Couple, lines: tuple[int, ...] = ()) -> CoupleAudit:
    o = c.origin
    return CoupleAudit(c.id, c.provenance, k_self_basis(c), c.doi, None if c.date is None else c.date.isoformat(),
                       c.source, f"{o.path}:{o.line}" if o is not None else "", o.layer if o is not None else "",
                       lines)


def audit_library(couple_set: CoupleSet, check_rows=None, check_path: str | None = None) -> AuditReport:
    """Audit every couple of the set, and (check_rows: MeasuredRow list of services.measured_csv) which couples
    the predictions of those rows use. Nothing is computed but the couples' own fields."""
    uses: dict[str, list[int]] = {}
    unknown: list[tuple[int, str]] = []
    rows_on = {"invented": 0, "unverified": 0, "estimated": 0}
    for row in check_rows or ():
        kinds = set()
        for cid in (row.oxidant, row.reductant):
            if cid not in couple_set:
                unknown.append((row.line, cid))
                continue
            uses.setdefault(cid, [])
            if row.line not in uses[cid]:
                uses[cid].append(row.line)
            c = couple_set[cid]
            if c.provenance != "verified":
                kinds.add(c.provenance)
            if k_self_basis(c) != K_SELF_MEASURED:
                kinds.add("estimated")
        for k in kinds:
            rows_on[k] += 1
    audits = tuple(_audit(c, tuple(uses.get(c.id, ()))) for c in couple_set)
    counts = {
        "couples": len(audits),
        "invented": sum(a.provenance == "invented" for a in audits),
        "unverified": sum(a.provenance == "unverified" for a in audits),
        "estimated": sum(a.estimated for a in audits),
        "without_doi": sum(a.doi is None for a in audits),
    }
    check = None
    if check_rows is not None:
        by_id = {a.couple_id: a for a in audits}
        check = CheckUse(check_path or (check_rows[0].path if check_rows else ""), len(check_rows),
                         tuple(by_id[cid] for cid in uses), tuple(unknown), rows_on)
    return AuditReport(audits, counts, check)
