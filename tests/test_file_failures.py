"""The files a user keeps, under failure, through the real commands (CliRunner).

Every place the command line writes a user file goes through ``coilplan.files``: the trim
log (``trim start``, ``trim add``), the kit outputs under ``--out`` (``plan.json``,
``bom.csv``, the cards) and the ``--plot`` pictures (trim and the form commands). Each is
run here with a file of the user's already at the path and the write made to fail:

* a crash part-way: Ctrl-C after half the bytes are written, or just before the rename;
* a full disk: ENOSPC from ``write`` after part of the data, or from ``fsync``;
* a read-only folder: a real ``chmod 0o500`` where it takes effect, else (running as
  root, where it does not) ``PermissionError`` from creating a file in that folder.

For each: the user's file is byte-identical afterwards, no temporary file is left, the
exit status is 1 with no traceback, and stderr is one line that names the path and what
happened (after Ctrl-C that line is checked for the trim commands; kit and the form
commands' --plot still say only "aborted"). Atomic replacement by rename is the POSIX
``rename`` guarantee (common practice, no source).
"""

import errno
import json
import os
import subprocess
import sys
import tempfile
from pathlib import Path

import pytest
from click.testing import CliRunner

import coilplan.report.plot as plot_module
from coilplan.answer import flat_document
from coilplan.cli import main
from coilplan.files import FileWriteError, write_all_atomically

ROOT = Path(__file__).resolve().parents[1]

PLAN = """
[[coil]]
name = "bfo"
count = 2
target = "{target}"

[[toroid]]
name = "ring"
od = "12.7mm"
id = "7.7mm"
height = "4.8mm"
al = "20nH"
count = 3

[[reel]]
wire = "0.3mm"
length = "10m"
"""

FULL = os.strerror(errno.ENOSPC)
DENIED = os.strerror(errno.EACCES)


def run(*args):
    result = CliRunner().invoke(main, [str(arg) for arg in args])
    assert "Traceback" not in result.stdout + result.stderr
    assert result.exception is None or isinstance(result.exception, SystemExit), repr(result.exception)
    return result


def snapshot(folder: Path) -> dict[str, bytes]:
    """Every file under ``folder`` (relative name → bytes)."""
    return {str(path.relative_to(folder)): path.read_bytes() for path in sorted(folder.rglob("*")) if path.is_file()}


def temporaries(folder: Path) -> list[str]:
    return [path.name for path in folder.rglob("*") if path.name.endswith(".tmp")]


@pytest.fixture(autouse=True)
def quick_pictures(monkeypatch):
    """Pictures of a few kB instead of matplotlib's rendering (half a second each): only their writing is
    under test here; the drawing itself is tested with the commands (tests/cli/test_trim_cli.py)."""

    def picture(**fields) -> bytes:
        assert fields["fmt"] in ("png", "svg", "pdf")
        return (f"<svg><!-- {fields['fmt']} -->" + "<path/>" * 600 + "</svg>\n").encode()

    monkeypatch.setattr(plot_module, "impedance_plot", picture)
    monkeypatch.setattr(plot_module, "trim_plot", picture)


# --- the faults ---------------------------------------------------------------------------------


class Fault:
    """Make the write of one destination fail; other writes (another file of the same run) go through.

    ``tempfile.mkstemp`` is watched so that a descriptor is known by the file it stands in
    for (``.NAME.xxxx.tmp`` beside NAME).
    """

    def __init__(self, monkeypatch, target: Path, kind: str):
        self.target, self.kind, self.hit = Path(target), kind, False
        self._descriptors: dict[int, Path] = {}
        real_mkstemp, real_write, real_fsync, real_replace = tempfile.mkstemp, os.write, os.fsync, os.replace

        def mkstemp(*args, **kwargs):
            descriptor, name = real_mkstemp(*args, **kwargs)
            self._descriptors[descriptor] = Path(name)
            return descriptor, name

        def ours(descriptor) -> bool:
            name = self._descriptors.get(descriptor)
            return (name is not None and name.parent == self.target.parent
                    and name.name.startswith(f".{self.target.name}."))

        def write(descriptor, data):
            if not ours(descriptor):
                return real_write(descriptor, data)
            self.hit = True
            real_write(descriptor, bytes(data[: len(data) // 2]))  # part of the data reaches the disk
            if kind == "interrupt mid-write":
                raise KeyboardInterrupt
            raise OSError(errno.ENOSPC, FULL)

        def fsync(descriptor):
            if ours(descriptor):
                self.hit = True
                raise OSError(errno.ENOSPC, FULL)
            return real_fsync(descriptor)

        def replace(source, destination):
            if Path(destination) == self.target:
                self.hit = True
                raise KeyboardInterrupt
            return real_replace(source, destination)

        monkeypatch.setattr(tempfile, "mkstemp", mkstemp)
        if kind in ("interrupt mid-write", "disk full on write"):
            monkeypatch.setattr(os, "write", write)
        elif kind == "disk full on fsync":
            monkeypatch.setattr(os, "fsync", fsync)
        elif kind == "interrupt before rename":
            monkeypatch.setattr(os, "replace", replace)
        else:
            raise ValueError(kind)


CRASHES = ["interrupt mid-write", "interrupt before rename"]
FULL_DISKS = ["disk full on write", "disk full on fsync"]


@pytest.fixture
def read_only(monkeypatch):
    """Make a folder refuse new files: chmod 0o500, or, where that has no effect (root), PermissionError."""
    made: list[Path] = []

    def make(folder: Path) -> None:
        folder.chmod(0o500)
        made.append(folder)
        probe = folder / ".probe"
        try:
            os.close(os.open(probe, os.O_WRONLY | os.O_CREAT | os.O_EXCL, 0o600))
        except PermissionError:
            return  # the mode bits are enforced
        os.unlink(probe)
        real_open, real_mkdir = os.open, os.mkdir

        def refused(path) -> bool:
            return Path(path).parent == folder

        def open_(path, flags, *args, **kwargs):
            if flags & os.O_CREAT and refused(path):
                raise PermissionError(errno.EACCES, DENIED, str(path))
            return real_open(path, flags, *args, **kwargs)

        def mkdir(path, *args, **kwargs):
            if refused(path):
                raise PermissionError(errno.EACCES, DENIED, str(path))
            return real_mkdir(path, *args, **kwargs)

        monkeypatch.setattr(os, "open", open_)
        monkeypatch.setattr(os, "mkdir", mkdir)

    yield make
    for folder in made:
        folder.chmod(0o700)


INTERRUPTED = 130  # 128 + SIGINT, as shells report Ctrl-C (common practice, no source)


def one_line_error(result, *fragments, code=1):
    assert result.exit_code == code, result.stdout + result.stderr
    assert result.stderr.startswith("coilplan: error: ") and result.stderr.count("\n") == 1, result.stderr
    for fragment in fragments:
        assert fragment in result.stderr, (fragment, result.stderr)


# --- the jobs: a command that writes over a file of the user's ----------------------------------


def start_log(path: Path) -> None:
    result = run("trim", "start", path, "--target", "100uH", "--tolerance", "2%", "--measured", "55uH@20")
    assert result.exit_code == 0, result.stderr


def trim_start_force(folder: Path):
    """``trim start --force`` over an existing log: the log is the file at stake."""
    log = folder / "coil.json"
    start_log(log)
    return log, ("trim", "start", log, "--target", "47uH", "--measured", "20uH@10", "--force")


def trim_add(folder: Path):
    log = folder / "coil.json"
    start_log(log)
    return log, ("trim", "add", log, "--measured", "104uH@28")


def trim_add_plot(folder: Path):
    """``trim add --plot`` over an existing picture (in a folder of its own): the reading is saved, the old
    picture is kept."""
    log, picture = folder / "coil.json", folder / "pictures" / "trim.svg"
    start_log(log)
    picture.parent.mkdir()
    picture.write_bytes(b"<svg>the user's own picture</svg>\n")
    return picture, ("trim", "add", log, "--measured", "104uH@28", "--plot", picture)


def kit_force(folder: Path):
    """``kit --out --force`` over an earlier plan's files (the new plan differs): plan.json at stake."""
    out = folder / "kit"
    first, second = folder / "first.toml", folder / "second.toml"
    first.write_text(PLAN.format(target="8uH"), encoding="utf-8")
    second.write_text(PLAN.format(target="9uH"), encoding="utf-8")
    assert run("kit", first, "--out", out).exit_code == 0
    return out / "plan.json", ("kit", second, "--out", out, "--force")


def kit_new_files(folder: Path):
    """``kit --out`` into a folder that holds only a file of the user's: a new plan.json fails."""
    out = folder / "kit"
    out.mkdir()
    (out / "notes.txt").write_text("the user's notes\n", encoding="utf-8")
    plan = folder / "plan.toml"
    plan.write_text(PLAN.format(target="8uH"), encoding="utf-8")
    return out / "plan.json", ("kit", plan, "--out", out)


def solenoid_plot(folder: Path):
    picture = folder / "coil.svg"
    picture.write_bytes(b"<svg>the user's own picture</svg>\n")
    return picture, ("solenoid", "--wire", "0.5mm", "--former", "25mm", "--turns", "10", "--plot", picture)


def toroid_plot(folder: Path):
    picture = folder / "ring.png"
    picture.write_bytes(b"\x89PNG the user's own picture\n")
    return picture, ("toroid", "--od", "12.7mm", "--id", "7.7mm", "--height", "4.8mm", "--al", "20nH",
                     "--wire", "0.3mm", "--turns", "20", "--plot", picture)


TRIM_JOBS = [trim_start_force, trim_add, trim_add_plot]
JOBS = [*TRIM_JOBS, kit_force, kit_new_files, solenoid_plot, toroid_plot]


def kept(folder: Path, before: dict[str, bytes], target: Path, job) -> None:
    """The file at stake is as it was, nothing new was left beside it, and no temporary file anywhere."""
    after = snapshot(folder)
    key = str(target.relative_to(folder))
    assert after.get(key) == before.get(key)
    assert temporaries(folder) == []
    if job is trim_add_plot:  # the reading was saved before the picture failed, as the message says
        assert set(after) == set(before)
    else:
        assert after == before


# --- the tests ----------------------------------------------------------------------------------


@pytest.mark.parametrize("kind", CRASHES)
@pytest.mark.parametrize("job", JOBS, ids=lambda job: job.__name__)
def test_crash_keeps_the_users_file(tmp_path, monkeypatch, job, kind):
    """Ctrl-C part-way through the write or just before the rename: the old file stays, exit 130, no traceback."""
    target, command = job(tmp_path)
    before = snapshot(tmp_path)
    fault = Fault(monkeypatch, target, kind)
    result = run(*command)
    monkeypatch.undo()
    assert fault.hit
    assert result.exit_code == INTERRUPTED, result.stdout + result.stderr
    kept(tmp_path, before, target, job)


@pytest.mark.parametrize("kind", CRASHES)
@pytest.mark.parametrize("job", TRIM_JOBS, ids=lambda job: job.__name__)
def test_crash_in_trim_says_which_file_was_kept(tmp_path, monkeypatch, job, kind):
    """The trim commands name the file the interrupt left as it was, on one line."""
    target, command = job(tmp_path)
    Fault(monkeypatch, target, kind)
    result = run(*command)
    monkeypatch.undo()
    one_line_error(result, str(target), "interrupted while writing it", "as it was", code=INTERRUPTED)


@pytest.mark.parametrize("kind", FULL_DISKS)
@pytest.mark.parametrize("job", JOBS, ids=lambda job: job.__name__)
def test_full_disk_keeps_the_users_file(tmp_path, monkeypatch, job, kind):
    """ENOSPC from write (after part of the data) or from fsync: one line with the path and the reason, exit 1."""
    target, command = job(tmp_path)
    before = snapshot(tmp_path)
    fault = Fault(monkeypatch, target, kind)
    result = run(*command)
    monkeypatch.undo()
    assert fault.hit
    existed = str(target.relative_to(tmp_path)) in before
    one_line_error(result, str(target), FULL, "the file on disk is as it was" if existed else "nothing was written")
    kept(tmp_path, before, target, job)
    if job is trim_add_plot:
        assert "was saved" in result.stderr  # the log took the reading; only the picture failed


@pytest.mark.parametrize("job", JOBS, ids=lambda job: job.__name__)
def test_read_only_folder_keeps_the_users_file(tmp_path, read_only, job):
    """A folder that refuses new files: one line naming the path and the system's reason, exit 1."""
    target, command = job(tmp_path)
    before = snapshot(tmp_path)
    read_only(target.parent)
    result = run(*command)
    one_line_error(result, str(target), DENIED)
    kept(tmp_path, before, target, job)


def test_kit_out_under_a_read_only_folder_makes_nothing(tmp_path, read_only):
    """kit --out naming a new folder inside a read-only one: one line naming it, exit 1, nothing made."""
    plan = tmp_path / "plan.toml"
    plan.write_text(PLAN.format(target="8uH"), encoding="utf-8")
    locked = tmp_path / "locked"
    locked.mkdir()
    read_only(locked)
    result = run("kit", plan, "--out", locked / "kit")
    one_line_error(result, str(locked / "kit"), DENIED)
    assert list(locked.iterdir()) == []


def test_read_only_log_is_not_replaced(tmp_path, monkeypatch):
    """A log the user made read-only is refused, not replaced by the rename (which a folder would allow)."""
    log = tmp_path / "coil.json"
    start_log(log)
    before = log.read_bytes()
    log.chmod(0o444)
    if os.access(log, os.W_OK):  # root writes anything: act as the user the mode bits are for
        real_access = os.access
        monkeypatch.setattr(os, "access", lambda path, mode, **kw: False if Path(path) == log and mode == os.W_OK
                            else real_access(path, mode, **kw))
    result = run("trim", "add", log, "--measured", "104uH@28")
    one_line_error(result, str(log), "read-only", "as it was")
    assert log.read_bytes() == before
    assert temporaries(tmp_path) == []


def test_missing_folder_is_named(tmp_path):
    """A log in a folder that does not exist: one line that says so, exit 1, nothing made."""
    path = tmp_path / "no-such-folder" / "coil.json"
    result = run("trim", "start", path, "--target", "100uH")
    one_line_error(result, str(path), f"the folder {path.parent} does not exist", "nothing was written")
    assert list(tmp_path.iterdir()) == []


def test_killed_process_leaves_the_log_readable(tmp_path):
    """A process killed between writing the new log and the rename (os._exit, no clean-up at all) leaves the
    old log byte-identical; its stray temporary file is never read, and the next reading saves."""
    log = tmp_path / "coil.json"
    start_log(log)
    before = log.read_bytes()
    script = ("import os, sys\n"
              "os.replace = lambda *args: os._exit(9)\n"
              "from coilplan.cli import main\n"
              "main(sys.argv[1:])\n")
    killed = subprocess.run([sys.executable, "-c", script, "trim", "add", str(log), "--measured", "104uH@28"],
                            env={**os.environ, "PYTHONPATH": str(ROOT)}, capture_output=True, timeout=60)
    assert killed.returncode == 9
    assert log.read_bytes() == before
    stray = temporaries(tmp_path)
    assert len(stray) == 1 and stray[0].startswith(".coil.json.")
    result = run("trim", "add", log, "--measured", "96uH@27", "--json")
    assert result.exit_code == 0, result.stderr
    assert [reading["turns"] for reading in flat_document(json.loads(result.stdout))["result"]["readings"]] == [20, 27]


def test_a_set_of_files_changes_all_or_none(tmp_path, monkeypatch):
    """write_all_atomically stages every file before replacing any: a full disk on the last leaves all as they were."""
    paths = [tmp_path / name for name in ("plan.json", "bom.csv", "card.html")]
    for path in paths:
        path.write_bytes(b"old " + path.name.encode())
    before = snapshot(tmp_path)
    Fault(monkeypatch, paths[-1], "disk full on write")
    with pytest.raises(FileWriteError) as caught:
        write_all_atomically({path: b"new " + path.name.encode() for path in paths})
    monkeypatch.undo()
    assert caught.value.file == str(paths[-1]) and caught.value.code == errno.ENOSPC
    assert snapshot(tmp_path) == before
    write_all_atomically({path: b"new " + path.name.encode() for path in paths})
    assert all(path.read_bytes() == b"new " + path.name.encode() for path in paths)
    assert temporaries(tmp_path) == []


@pytest.mark.parametrize("command", ["start", "add", "show"])
def test_plot_onto_the_log_itself_is_refused(tmp_path, command):
    """--plot naming the log's own file (a log may have any name) is bad input: exit 2, the log untouched."""
    log = tmp_path / "coil.svg"
    start_log(log)
    before = snapshot(tmp_path)
    extra = {"start": ("--target", "100uH", "--measured", "55uH@20", "--force"),
             "add": ("--measured", "104uH@28"), "show": ()}[command]
    result = run("trim", command, log, *extra, "--plot", tmp_path / "." / "coil.svg")
    assert result.exit_code == 2, result.stdout + result.stderr
    assert result.stderr.count("\n") == 1 and "--plot: expected a file other than the trim log" in result.stderr
    assert snapshot(tmp_path) == before


def test_ctrl_c_while_a_form_plot_is_written_names_the_file(tmp_path, monkeypatch):
    """An interrupt during --plot on a form command says which file and that nothing was written there."""
    from click.testing import CliRunner

    from coilplan.cli import main

    def interrupted(*args, **kwargs):
        raise KeyboardInterrupt

    monkeypatch.setattr(os, "replace", interrupted)
    picture = tmp_path / "z.png"
    outcome = CliRunner().invoke(main, ["solenoid", "--former", "25mm", "--wire", "0.5mm", "--turns", "10",
                                        "--plot", str(picture)])
    lines = [line for line in outcome.stderr.splitlines() if line.strip()]
    assert outcome.exit_code == INTERRUPTED and len(lines) == 1
    assert str(picture) in lines[0] and "interrupted" in lines[0] and not picture.exists()
    assert not list(tmp_path.iterdir())  # no temporary file left behind


def test_kit_files_are_replaced_as_one_set(tmp_path, monkeypatch):
    """A full disk on the second file of a --force rewrite leaves every file of the earlier plan as it was."""
    from click.testing import CliRunner

    from coilplan.cli import main

    plan = tmp_path / "plan.toml"
    plan.write_text(PLAN.format(target="8uH"), encoding="utf-8")
    out = tmp_path / "out"
    assert CliRunner().invoke(main, ["kit", str(plan), "--out", str(out)]).exit_code == 0
    before = {path.name: path.read_bytes() for path in out.iterdir()}
    plan.write_text(PLAN.format(target="9uH"), encoding="utf-8")
    real_write = os.write
    calls = {"n": 0}

    def full_after_one_file(descriptor, data):
        calls["n"] += 1
        if calls["n"] > 1:
            raise OSError(errno.ENOSPC, "No space left on device")
        return real_write(descriptor, data)

    monkeypatch.setattr(os, "write", full_after_one_file)
    outcome = CliRunner().invoke(main, ["kit", str(plan), "--out", str(out), "--force"])
    monkeypatch.undo()
    assert outcome.exit_code == 1 and "No space left" in outcome.stderr
    assert {path.name: path.read_bytes() for path in out.iterdir()} == before
