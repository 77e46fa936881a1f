"""Every command's --json document follows the published JSON Schema (coilplan/output.schema.json), and the
shipped file is the one the answer's table of figures makes."""

import json
import shlex
from importlib import resources

import jsonschema
import pytest
from click.testing import CliRunner

from coilplan.answer import FIGURES, SCHEMA_VERSION, json_schema
from coilplan.cli import main

SHIPPED = json.loads(resources.files("coilplan").joinpath("output.schema.json").read_text(encoding="utf-8"))

COMMANDS = [
    "solenoid --former 25mm --wire 0.5mm --target 10uH --at 7MHz --max-length 40mm",
    "solenoid --former 25mm --wire 0.5mm --turns 10",
    "solenoid --former 25mm --wire 0.5mm --target 10uH --measured 8uH@20 --at 7MHz",
    "solenoid --former 25mm --wire 0.5mm --target-frequency 7MHz --capacitance 100pF",
    "multilayer --former 10mm --width 8mm --wire 0.2mm --target 1mH --max-depth 5mm --at 100kHz",
    "multilayer --former 10mm --width 8mm --wire 0.5mm --measured 30uH@60 --test-wire 0.3mm --target 40uH",
    "spiral --inner 20mm --spacing 0.2mm --wire 0.5mm --target 4uH --outer 80mm --at 10MHz",
    "toroid --od 23mm --id 14mm --height 7mm --wire 0.5mm --material nizn-125 --target 22uH --at 3MHz --current 0.5A",
    "toroid --od 23mm --id 14mm --height 7mm --wire 0.5mm --measured 40uH@20 --target 60uH --measured-q 80@100kHz"
    " --at 1MHz --meter-freq 100kHz",
    "gapped --ae 52mm2 --le 57mm --window-width 28mm --window-depth 7mm --wire 0.8mm --material mnzn-power"
    " --target 2mH --current 1A --at 50kHz",
    "gapped --ae 52mm2 --le 57mm --window-width 28mm --window-depth 7mm --wire 0.8mm --material mnzn-power"
    " --target 2mH --turns 100",
    "gapped --ae 52mm2 --le 57mm --wire 0.8mm --mu 2000 --gap 1mm --turns 100 --ac-voltage 20V --at 50kHz",
    "rod --rod-length 100mm --rod-diameter 10mm --wire 0.3mm --material nizn-125 --target 200uH --at 1MHz",
    "rod --rod-length 140mm --rod-diameter 10mm --wire 0.3mm --measured 68uH@30 --target 239uH",
    "rewind --measured 62uH@24 --measured 80uH@27 --target 150uH --offset --turn-length 30mm --wire 0.5mm",
    "rewind --measured 62uH@24 --target 150uH --at 10MHz",
    "wire 24awg",
    "materials",
    "materials nizn-125",
    "tank --inductance 10uH --capacitance 100pF",
    "count-turns --before 10uH --after 12uH --added 3",
]


def test_the_shipped_schema_is_the_one_the_table_makes():
    assert json_schema() == SHIPPED
    assert SHIPPED["properties"]["schema"]["properties"]["version"]["const"] == SCHEMA_VERSION


@pytest.mark.parametrize("line", COMMANDS, ids=[line[:60] for line in COMMANDS])
def test_a_commands_json_follows_the_schema(line):
    outcome = CliRunner().invoke(main, [*shlex.split(line), "--json"])
    assert outcome.exit_code == 0, outcome.stderr
    document = json.loads(outcome.stdout)
    jsonschema.validate(document, SHIPPED, cls=jsonschema.Draft202012Validator)
    assert document["schema"] == {"name": "coilplan-output", "version": SCHEMA_VERSION}


def test_the_schema_refuses_a_figure_outside_its_part():
    """The schema can fail: a coil's figure moved to another part, or an unknown figure, is refused."""
    outcome = CliRunner().invoke(main, [*shlex.split(COMMANDS[0]), "--json"])
    document = json.loads(outcome.stdout)
    document["result"]["copper"]["turns"] = document["result"]["wind"].pop("turns")
    with pytest.raises(jsonschema.ValidationError):
        jsonschema.validate(document, SHIPPED, cls=jsonschema.Draft202012Validator)


def test_every_figure_has_one_part_and_a_json_type():
    assert all(part and kind in ("number", "integer", "boolean", "string", "array", "object")
               for part, kind in FIGURES.values())


@pytest.mark.parametrize("line", [
    "solenoid --former 25mm --wire 0.5mm --target 40uH --max-length 20mm",
    "toroid --od 10mm --id 5mm --height 4mm --wire 1mm --mu 125 --target 1mH",
    "rewind --measured 62uH@24 --target 1nH",
], ids=["solenoid", "toroid", "rewind"])
def test_a_request_that_cannot_be_done_still_prints_one_json_object(line):
    """--json on an infeasible request: one document with no result and the reason, then the one line on stderr
    and exit status 1."""
    outcome = CliRunner().invoke(main, [*shlex.split(line), "--json"])
    assert outcome.exit_code == 1
    document = json.loads(outcome.stdout)
    jsonschema.validate(document, SHIPPED, cls=jsonschema.Draft202012Validator)
    assert document["result"] is None and document["error"]["message"].startswith("cannot be done: ")
    assert outcome.stderr.startswith("coilplan: error: cannot be done: ") and outcome.stderr.count("\n") == 1
