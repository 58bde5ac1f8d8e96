"""The bundled libraries are package data: a built wheel and an editable install both find them, from any
folder, and no network is needed (the fresh environment borrows this one's dependencies).

The wheel is built offline from a copy of the sources (`pip wheel --no-deps --no-build-isolation`), so the
checkout gets no build/ or egg-info folders; it is installed into a fresh virtual environment that sees the
running environment's site-packages through a .pth line (numpy, textual... without downloading them; the
running environment's own crossrate, an editable install, is not visible that way: .pth files of an added
folder are not processed).
"""

import json
import os
import shutil
import subprocess
import sys
import sysconfig
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
#: What the build reads: the package, the bundled libraries and the build configuration.
SOURCES = ("crossrate", "libraries", "pyproject.toml", "setup.py", "README.md")


def _pip(*args, cwd=None):
    r = subprocess.run([sys.executable, "-m", "pip", "--disable-pip-version-check", "--no-input", *args],
                       cwd=cwd, capture_output=True, text=True, timeout=120)
    assert r.returncode == 0, r.stdout + r.stderr
    return r


def _fresh_venv(path: Path) -> Path:
    """A virtual environment without pip whose site-packages also sees this environment's packages."""
    import venv

    venv.EnvBuilder(with_pip=False, symlinks=os.name != "nt").create(path)
    python = path / ("Scripts/python.exe" if os.name == "nt" else "bin/python")
    site = subprocess.run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                          capture_output=True, text=True, check=True).stdout.strip()
    Path(site, "borrowed_dependencies.pth").write_text(sysconfig.get_paths()["purelib"] + "\n", encoding="utf-8")
    return python


def _copy_sources(dest: Path) -> Path:
    for name in SOURCES:
        src = ROOT / name
        if src.is_dir():
            shutil.copytree(src, dest / name, ignore=shutil.ignore_patterns("__pycache__", "*.pyc"))
        else:
            shutil.copy2(src, dest / name)
    return dest


def _run(python: Path, cwd: Path, home: Path, *args) -> subprocess.CompletedProcess:
    env = {k: v for k, v in os.environ.items() if not k.startswith(("CROSSRATE_", "PYTHON"))}
    env.update(HOME=str(home), XDG_CONFIG_HOME=str(home / "config"), XDG_CACHE_HOME=str(home / "cache"),
               NO_COLOR="1", COLUMNS="100")
    return subprocess.run([str(python), "-m", "crossrate.cli.main", *args], cwd=cwd, env=env, capture_output=True,
                          text=True, timeout=60)


def _check_installed(python: Path, work: Path, expect_dir: Path) -> None:
    elsewhere = work / "elsewhere"
    elsewhere.mkdir(exist_ok=True)
    home = work / "home"
    r = _run(python, elsewhere, home, "library", "list", "--demo", "--format", "json")
    assert r.returncode == 0, r.stderr
    records = json.loads(r.stdout)
    paths = {Path(rec["path"]).resolve() for rec in records}
    assert paths == {(expect_dir / "starter.toml").resolve(), (expect_dir / "demo.toml").resolve()}
    r = _run(python, elsewhere, home, "library", "list")
    assert r.returncode == 0 and "fe-aq" in r.stdout and "hl-med2" not in r.stdout, r.stderr
    # one prediction on the starter couples (literature values from memory) and one on the demo
    r = _run(python, elsewhere, home, "predict", "fe-phen3", "fe-aq", "--ionic-strength", "0.5", "--samples", "0")
    assert r.returncode == 0 and "k_obs (predicted)" in r.stdout, r.stderr
    r = _run(python, elsewhere, home, "predict", "hl-med2", "hl-ru-amine", "--demo", "--samples", "0")
    assert r.returncode == 0 and "hl-med2 (! invented)" in r.stdout, r.stderr


def test_wheel_and_editable_install_find_the_bundled_libraries(tmp_path):
    src = _copy_sources(tmp_path / "src")
    _pip("wheel", "--no-deps", "--no-build-isolation", "--no-index", "-w", str(tmp_path / "dist"), str(src),
         cwd=tmp_path)
    (wheel,) = (tmp_path / "dist").glob("crossrate-*.whl")
    python = _fresh_venv(tmp_path / "venv")
    _pip("--python", str(python), "install", "--no-deps", "--no-index", str(wheel))
    site = Path(subprocess.run([str(python), "-c", "import sysconfig; print(sysconfig.get_paths()['purelib'])"],
                               capture_output=True, text=True, check=True).stdout.strip())
    _check_installed(python, tmp_path, site / "crossrate" / "bundled_libraries")

    # The same package as an editable install reads libraries/ of its source folder.
    editable = _fresh_venv(tmp_path / "venv-editable")
    _pip("--python", str(editable), "install", "--no-deps", "--no-build-isolation", "--no-index", "-e", str(src))
    _check_installed(editable, tmp_path, src / "libraries")
