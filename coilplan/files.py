"""Files a user keeps (trim logs, plots, plans): written atomically, never half-written.

A write goes to a temporary file in the same folder, is flushed and fsynced, and then
replaces the target with ``os.replace`` (atomic on POSIX and Windows); the folder is
synced so that the rename itself survives a crash. On any failure the temporary file
is removed and whatever was at the path stays as it was. A file the user may not write
(read-only) is not replaced, although a rename could do it.

:func:`write_all_atomically` does the same for a set of files that belong together
(a kit plan, its bill of materials and cards): every file is staged before the first
one replaces anything, so a full disk or a read-only folder changes none of them.
"""

from __future__ import annotations

import contextlib
import errno
import os
import tempfile
from collections.abc import Mapping
from pathlib import Path

from coilplan.errors import CoilplanError

__all__ = ["FileWriteError", "WriteInterrupted", "write_all_atomically", "write_atomically"]


def _aftermath(existed: bool) -> str:
    return "the file on disk is as it was" if existed else "nothing was written there"


class FileWriteError(CoilplanError, OSError):
    """A file (a log, a plot) could not be written: a full disk, a read-only folder. The old file is kept.

    Parameters
    ----------
    file : str
        The path that was being written.
    reason : str
        The system's reason, e.g. "No space left on device".
    code : int, optional
        The ``errno`` value.
    existed : bool
        Whether a file was at the path before (it is kept as it was); else nothing was written.
    replaced : sequence of str
        Files of the same set that had already been replaced (:func:`write_all_atomically`).
    """

    def __init__(self, file: str, reason: str, code: int | None = None, *, existed: bool = True,
                 replaced=()):
        super().__init__(code, reason)
        self.file = str(file)
        self.reason = reason
        self.code = code
        self.existed = existed
        self.replaced = tuple(str(path) for path in replaced)

    def __str__(self) -> str:
        return _outcome(self.file, f"cannot write it ({self.reason})", self.existed, self.replaced)


class WriteInterrupted(KeyboardInterrupt):
    """Ctrl-C (or another interrupt) arrived while a file was being written; the old file is kept.

    Still a :class:`KeyboardInterrupt`, so it stops the program as one; it carries the path
    so that a command can say which file was left as it was.
    """

    def __init__(self, file: str, *, existed: bool = True, replaced=()):
        super().__init__(str(file))
        self.file = str(file)
        self.existed = existed
        self.replaced = tuple(str(path) for path in replaced)

    def __str__(self) -> str:
        return _outcome(self.file, "interrupted while writing it", self.existed, self.replaced)


def _outcome(file: str, what: str, existed: bool, replaced: tuple[str, ...]) -> str:
    """``file: what; what became of it`` and the files of its set already replaced, if any."""
    text = f"{file}: {what}; {_aftermath(existed)}"
    if replaced:
        text += f" (already replaced: {', '.join(replaced)})"
    return text


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


def _reason(error: OSError, path: Path) -> str:
    if isinstance(error, FileNotFoundError) and not path.parent.is_dir():
        return f"the folder {path.parent} does not exist"
    return error.strerror or str(error)


def _stage(path: Path, data: bytes, existed: bool) -> str:
    """Write ``data`` to a new temporary file beside ``path`` (synced, with the file's mode bits); its name."""
    if existed and not os.path.isdir(path) and not os.access(path, os.W_OK):
        raise FileWriteError(path, "the file is read-only: make it writable, or choose another name",
                             errno.EACCES, existed=True)
    descriptor, temporary = tempfile.mkstemp(prefix=f".{path.name}.", suffix=".tmp", dir=path.parent)
    try:
        try:
            _write_all(descriptor, data)
            os.fsync(descriptor)
        finally:
            os.close(descriptor)
        with contextlib.suppress(OSError):  # an existing file's permissions, else what a new file would get
            os.chmod(temporary, _permissions(path))
    except BaseException:
        _discard(temporary)
        raise
    return temporary


def _discard(temporary: str) -> None:
    with contextlib.suppress(OSError):
        os.unlink(temporary)


def _reraise(error: BaseException, path: Path, existed: bool, replaced=()) -> None:
    """Raise the error for a failed write of ``path``: ours for the system's and for an interrupt."""
    if isinstance(error, OSError) and not isinstance(error, FileWriteError):
        raise FileWriteError(path, _reason(error, path), error.errno, existed=existed, replaced=replaced) from None
    if isinstance(error, KeyboardInterrupt) and not isinstance(error, WriteInterrupted):
        raise WriteInterrupted(path, existed=existed, replaced=replaced) from None
    raise error


def write_all_atomically(files: Mapping[str | os.PathLike, bytes]) -> None:
    """Write several files as one change: all are staged (written and synced) before any is replaced.

    A failure while staging (a full disk, a read-only folder or file, an interrupt) removes
    every temporary file and leaves every path as it was. The renames that follow take
    microseconds and rarely fail (the folder's permissions changed meanwhile, Ctrl-C in that
    instant); the error then lists the files already replaced.

    Raises
    ------
    FileWriteError
        A file could not be written (the system's reason is kept; the path is named).
    WriteInterrupted
        An interrupt (Ctrl-C) arrived during the write.
    """
    staged: list[tuple[Path, str, bool]] = []
    for name, data in files.items():
        path = Path(name)
        existed = os.path.lexists(path)
        try:
            staged.append((path, _stage(path, data, existed), existed))
        except BaseException as error:
            for _, temporary, _ in staged:
                _discard(temporary)
            _reraise(error, path, existed)
    done: list[Path] = []
    for index, (path, temporary, existed) in enumerate(staged):
        try:
            os.replace(temporary, path)
        except BaseException as error:
            for _, rest, _ in staged[index:]:
                _discard(rest)
            _reraise(error, path, existed, replaced=done)
        done.append(path)
    for folder in dict.fromkeys(path.parent for path in done):
        _sync_folder(folder)


def write_atomically(path, data: bytes) -> None:
    """Write ``data`` to ``path`` in one step: a temporary file in the same folder, fsync, os.replace.

    On any failure the temporary file is removed and whatever was at ``path`` stays as it
    was. A temporary file left by a crash has a unique name (``.NAME.*.tmp``) and is never
    read. A file at ``path`` the user may not write is refused, not replaced.

    Raises
    ------
    FileWriteError
        The folder cannot be written, the disk is full or the file is read-only (the system's
        reason is kept).
    WriteInterrupted
        An interrupt (Ctrl-C) arrived during the write; the file is as it was.
    """
    write_all_atomically({path: data})
