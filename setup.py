"""Packages of the build: crossrate's own, plus the top-level libraries/ folder installed as
crossrate/bundled_libraries (the one source of the bundled couples stays where the design wants it)."""

from setuptools import find_packages, setup

setup(
    packages=[*find_packages(include=["crossrate", "crossrate.*"]), "crossrate.bundled_libraries"],
    package_dir={"crossrate.bundled_libraries": "libraries"},
)
