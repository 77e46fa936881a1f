"""The design layer type-checks strictly (mypy --strict, configured in pyproject.toml): what a notebook user
calls states its types, and they hold."""

import pathlib

from mypy import api

ROOT = pathlib.Path(__file__).resolve().parent.parent


def test_the_design_layer_type_checks_strictly(monkeypatch, tmp_path):
    monkeypatch.chdir(ROOT)
    out, err, status = api.run(["--config-file", str(ROOT / "pyproject.toml"), "--cache-dir", str(tmp_path)])
    assert status == 0, out + err
