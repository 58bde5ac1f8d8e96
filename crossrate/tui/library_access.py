"""How the workbench reaches the library and the services that take whole records (loading the layered set,
the lambda breakdown of a couple, the measured-rate check). Imports are local so the first paint is fast."""

from ..errors import CrossrateError


def load_layered_set(library_paths, **layers):
    """(CoupleSet or None, message) for the layered library plus the given files; layers: bundled, group,
    personal flags of load_layered. A file with problems is left out and its problems are the message (the
    set then holds the other files); None only when even the list of files cannot be made (bad config)."""
    try:
        from ..library.layers import load_layered_partial
    except ModuleNotFoundError as exc:
        if exc.name != "crossrate.library.layers":
            raise
        return _load_files_only(library_paths)
    try:
        cs, problems = load_layered_partial(extra_paths=tuple(library_paths), **layers)
    except CrossrateError as exc:
        return None, str(exc)
    return cs, "\n".join(str(p) for p in problems)


def _load_files_only(library_paths):
    """Fallback while the layer loader is not available: the given files only, in order."""
    from ..library.couple_set import CoupleSet
    from ..library.toml_reader import read_library_file

    couples: dict = {}
    files = []
    try:
        for path in library_paths:
            lf = read_library_file(path, layer="cli")
            files.append(lf.path)
            for c in lf.couples:
                couples[c.id] = c
    except CrossrateError as exc:
        return None, str(exc)
    return CoupleSet(list(couples.values()), files=files), ""


#: What the workbench needs once the rows are shown (numpy, the conditions, the solvent table, the services of
#: the detail's λ breakdown and of a prediction): imported by import_services in a worker thread.
SERVICE_MODULES = (
    "crossrate.services.conditions",
    "crossrate.core.solvents",
    "crossrate.services.lambda_estimate",
    "crossrate.services.prediction",
)


def services_imported() -> bool:
    import sys

    return all(name in sys.modules for name in SERVICE_MODULES)


def import_services() -> None:
    """Import SERVICE_MODULES (about 0.1 s, mostly numpy), so the workbench's event loop does not wait for them."""
    import importlib

    for name in SERVICE_MODULES:
        importlib.import_module(name)


def lambda_lines(couple_set, couple, conditions=None, unit: str = "kJ/mol") -> list[str]:
    """The reorganization-energy breakdown of a couple (inner, outer, work; measured beside the estimate),
    as lines for the detail panel, from services.lambda_estimate, energies in `unit` (kJ/mol, kcal/mol or
    eV); one line with the reason when it fails."""
    from ..services.lambda_estimate import lambda_breakdown
    from .units import energy_text

    try:
        b = lambda_breakdown(couple_set, couple.id, conditions=conditions)
    except CrossrateError as exc:
        return [f"not available: {exc}"]

    def en(v, signed=False):
        return "-" if v is None else energy_text(v, unit, signed=signed)

    sd = en(b.lambda_estimate_sd_kJ_per_mol).split()[0]
    out = [
        f"at {b.temperature_K:g} K, {b.ionic_strength_M:g} M, {b.medium}",
        f"λ_in   {en(b.lambda_in_kJ_per_mol)}  ({b.lambda_in_source})",
        f"λ_out  {en(b.lambda_out_kJ_per_mol)}  (two-sphere, Pekar {b.pekar_factor:.3f})",
        f"λ est. {en(b.lambda_estimate_kJ_per_mol).split()[0]} ± {sd} {unit} ({b.estimate_label})",
        f"w_ii   {en(b.work_kJ_per_mol, signed=True)}",
        f"k_self implied 10^{b.log10_k_self_estimate:.2f} M⁻¹ s⁻¹",
    ]
    if b.lambda_measured_kJ_per_mol is not None:
        out.append(f"λ from measured k_self {en(b.lambda_measured_kJ_per_mol)}")
    if b.k_self_used_how:
        out.append(f"predictions use: {b.k_self_used_how}")
    return out


def check_measured(couple_set, prediction, k, sd):
    """services.measured_check.check_pair for the current pair (with its couple records)."""
    from ..services.measured_check import check_pair

    couples = (couple_set[prediction.oxidant], couple_set[prediction.reductant])
    return check_pair(prediction, k, sd, couples=couples)


#: Monte Carlo draws per row of a series check in the workbench (the command line's default is 5000).
SERIES_SAMPLES = 2000


def check_series(couple_set, path: str, conditions):
    """services.measured_check.check_measured over a measured-rates CSV (the format of `crossrate check`):
    the CheckReport, or InputFileError naming file, line and field."""
    from ..services.measured_check import check_measured
    from ..services.measured_csv import read_measured_csv

    return check_measured(couple_set, read_measured_csv(path), conditions, samples=SERIES_SAMPLES, seed=0)


def file_sha256(couple_set, path: str) -> str:
    """sha256 of the file as it was when the set was loaded (what an edit is checked against); the file's
    current hash when the set does not know it."""
    known = getattr(couple_set, "file_sha256", {}) or {}
    if path in known:
        return known[path]
    from ..library.toml_reader import read_library_bytes, sha256_of

    return sha256_of(read_library_bytes(path))


def _known_scales(couple_set) -> dict:
    return {k: couple_set.scales.get(k) for k in couple_set.scales.keys()}


def build_couple(couple_set, path: str, couple_id: str, values: dict):
    """The Couple the form describes, validated as the file would validate it (its [library] defaults, the
    known scales and solvents). Raises LibraryError listing every problem."""
    from ..core.solvents import solvent_table
    from ..errors import LibraryError
    from ..library.toml_reader import read_library_file
    from ..library.validation import ValidationContext, validate_couple

    layer = (getattr(couple_set, "file_layers", {}) or {}).get(path, "cli")
    lf = read_library_file(path, layer, _known_scales(couple_set))
    ctx = ValidationContext(path, layer, dict(lf.defaults), frozenset(couple_set.scales.keys()) | frozenset(lf.scales),
                            frozenset(solvent_table()))
    out = validate_couple(couple_id, values, ctx, None, table_line=0)
    if isinstance(out, list):
        raise LibraryError(out)
    return out


def write_couple(kind: str, couple_set, path: str, couple_id: str, values: dict | None, expected_sha256: str,
                 old_id: str | None = None) -> str:
    """Write through the library's safe writer; returns the file's new sha256. kind: 'add', 'update' or
    'remove'; an update under a new id renames first. Raises ConflictError when the file changed since
    expected_sha256, LibraryError for a bad couple, CrossrateError otherwise: nothing is written then."""
    from ..library import couple_edits

    scales = _known_scales(couple_set)
    if kind == "remove":
        return couple_edits.remove_couple(path, couple_id, expected_sha256, known_scales=scales)
    couple = build_couple(couple_set, path, couple_id, values or {})
    if kind == "add":
        return couple_edits.add_couple(path, couple, expected_sha256, known_scales=scales)
    if old_id is not None and old_id != couple_id:
        expected_sha256 = couple_edits.rename_couple(path, old_id, couple_id, expected_sha256, known_scales=scales)
    return couple_edits.update_couple(path, couple, expected_sha256, known_scales=scales)


def writable_files(couple_set) -> list[tuple[str, str]]:
    """(path, layer) of the files of the set, bundled ones (starter, demo) last (they are usually read-only
    installs)."""
    layers: dict[str, str] = dict(getattr(couple_set, "file_layers", {}) or {})
    for c in couple_set:
        if c.origin is not None:
            layers.setdefault(c.origin.path, c.origin.layer)
    for f in couple_set.files:
        layers.setdefault(f, "file")
    return sorted(layers.items(), key=lambda kv: (kv[1] in ("bundled", "demo"), kv[0]))


def create_library_file(path: str) -> str:
    """A new library file at path through library.new_library (header and a commented example couple);
    returns its sha256. CrossrateError when it exists already or cannot be made: nothing is written then."""
    from ..library.new_library import create_library

    return create_library(path)
