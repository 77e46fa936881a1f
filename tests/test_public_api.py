"""The public namespace is curated: __all__ is sorted and lists every public name (as httpx checks)."""

import coilplan


def test_all_is_sorted_and_complete():
    """coilplan.__all__ equals the sorted public names the package exposes."""
    public = sorted(name for name in vars(coilplan)
                    if not name.startswith("_") and not isinstance(getattr(coilplan, name), type(coilplan)))
    assert coilplan.__all__ == sorted(coilplan.__all__)
    assert sorted(coilplan.__all__) == public


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
