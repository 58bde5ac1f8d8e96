"""Fixtures for the whole suite: the library cache goes to a folder of this test run, never the user's."""

import pytest


@pytest.fixture(autouse=True, scope="session")
def _private_library_cache(tmp_path_factory):
    with pytest.MonkeyPatch.context() as mp:
        mp.setenv("XDG_CACHE_HOME", str(tmp_path_factory.mktemp("xdg-cache")))
        yield
