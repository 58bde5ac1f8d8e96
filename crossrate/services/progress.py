"""Progress reporting for long service calls: a plain callback, so services never depend on a face."""

from collections.abc import Callable

#: progress(done, total): called with the amount of work finished so far and the total (same unit,
#: e.g. rows of a rate map). Called at least once at the end with done == total.
ProgressCallback = Callable[[int, int], None]


def report(progress: ProgressCallback | None, done: int, total: int) -> None:
    """Call the callback when one was given (services call this instead of testing for None each time)."""
    if progress is not None:
        progress(int(done), int(total))
