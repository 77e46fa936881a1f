"""The public namespace is curated: __all__ is sorted, every name resolves, every subpackage ships."""

import importlib
import inspect

import coilplan


def test_all_is_sorted_and_every_name_resolves():
    """coilplan.__all__ is sorted, and each name is defined by the module the table says (as httpx checks)."""
    assert coilplan.__all__ == sorted(coilplan.__all__)
    for name in coilplan.__all__:
        value = getattr(coilplan, name)
        assert value is not None
        module = importlib.import_module(coilplan._WHERE[name])
        assert getattr(module, name) is value
        assert name in getattr(module, "__all__", [name]), (name, module.__name__)


def test_no_public_name_outside_all():
    """Nothing public is defined in the package namespace but __all__ and the subpackages."""
    for name, value in vars(coilplan).items():
        if name.startswith("_") or inspect.ismodule(value):
            continue
        assert name in coilplan.__all__, name


def test_unknown_name_is_an_attribute_error():
    """A misspelt name fails as Python's own attribute error does."""
    try:
        coilplan.solve_turn  # noqa: B018
    except AttributeError as error:
        assert "solve_turn" in str(error)
    else:
        raise AssertionError("no AttributeError")


def test_physics_exports_are_sorted():
    """coilplan.physics re-exports each kernel module's names, sorted."""
    import coilplan.physics as physics

    assert physics.__all__ == sorted(physics.__all__)
    for name in physics.__all__:
        assert callable(getattr(physics, name))


def test_every_subpackage_ships():
    """Each package folder under coilplan/ is listed for the wheel (a missing one breaks the install)."""
    import pathlib
    import tomllib

    root = pathlib.Path(__file__).resolve().parent.parent
    listed = set(tomllib.loads((root / "pyproject.toml").read_text())["tool"]["setuptools"]["packages"])
    found = {".".join(path.parent.relative_to(root).parts) for path in (root / "coilplan").rglob("__init__.py")}
    assert found <= listed


def test_solve_path_imports_nothing_heavy():
    """The solenoid command's import path leaves out pydantic, matplotlib and the heavy scipy parts.

    Start-up time is a benchmark goal (tests/benchmarks); this keeps the cause of a regression visible.
    """
    import subprocess
    import sys

    probe = ("import sys, coilplan.cli.solenoid; "
             "print(' '.join(m for m in ('pydantic', 'matplotlib', 'scipy.interpolate', 'scipy.optimize', "
             "'scipy.linalg', 'scipy.integrate') if m in sys.modules))")
    loaded = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True).stdout
    assert loaded.strip() == ""
