"""Files a user keeps (trim logs, plots, plans): written atomically, never half-written.

A write goes to a temporary file in the same folder, is flushed and fsynced, and then
replaces the target with ``os.replace`` (atomic on POSIX and Windows); the folder is
synced so that the rename itself survives a crash. On any failure the temporary file
is removed and whatever was at the path stays as it was.
"""

from __future__ import annotations

import contextlib
import os
import tempfile
from pathlib import Path

from coilplan.errors import CoilplanError

__all__ = ["FileWriteError", "write_atomically"]


class FileWriteError(CoilplanError, OSError):
    """A file (a log, a plot) could not be written: a full disk, a read-only folder. The old file is kept.

    Parameters
    ----------
    file : str
        The path that was being written.
    reason : str
        The system's reason, e.g. "No space left on device".
    """

    def __init__(self, file: str, reason: str, code: int | None = None):
        super().__init__(code, reason)
        self.file = str(file)
        self.reason = reason
        self.code = code

    def __str__(self) -> str:
        return f"{self.file}: cannot write it ({self.reason}); the file on disk is as it was"


def _write_all(descriptor: int, data: bytes) -> None:
    view = memoryview(data)
    while view:
        written = os.write(descriptor, view)
        view = view[written:]


def _sync_folder(folder: Path) -> None:
    """Make the rename itself durable, where the platform lets a folder be opened and synced."""
    if os.name != "posix":
        return
    try:
        descriptor = os.open(folder, os.O_RDONLY)
    except OSError:
        return
    try:
        os.fsync(descriptor)
    except OSError:
        pass
    finally:
        os.close(descriptor)


def _permissions(path: Path) -> int:
    """The mode bits of the file at ``path``, or those of a new file under the current umask."""
    try:
        return os.stat(path).st_mode & 0o7777
    except FileNotFoundError:
        mask = os.umask(0o022)
        os.umask(mask)
        return 0o666 & ~mask


def write_atomically(path, data: bytes) -> None:
    """Write ``data`` to ``path`` in one step: a temporary file in the same folder, fsync, os.replace.

    On any failure the temporary file is removed and whatever was at ``path`` stays as it
    was. A temporary file left by a crash has a unique name (``.NAME.*.tmp``) and is never
    read.

    Raises
    ------
    FileWriteError
        The folder cannot be written or the disk is full (the system's reason is kept).
    """
    path = Path(path)
    folder = path.parent
    try:
        descriptor, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=folder)
    except OSError as error:
        raise FileWriteError(path, error.strerror or str(error), error.errno) from None
    try:
        try:
            _write_all(descriptor, data)
            os.fsync(descriptor)
        finally:
            os.close(descriptor)
        with contextlib.suppress(OSError):  # an existing file's permissions, else what a new file would get
            os.chmod(temporary, _permissions(path))
        os.replace(temporary, path)
    except BaseException as error:
        with contextlib.suppress(OSError):
            os.unlink(temporary)
        if isinstance(error, OSError):
            raise FileWriteError(path, error.strerror or str(error), error.errno) from None
        raise
    _sync_folder(folder)
