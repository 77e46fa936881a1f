"""The library speaks its own words: errors below the command line name the field or parameter the value
belongs to, the command line names the option the user typed for it (coilplan/cli/_fields.py), and the kit
the plan-file key (coilplan/kit/keys.py).

The rule checked here is the house's (DEVELOPERS.md, "Adding a coil form" and "Command-line conventions":
an error is one line naming the option, or in the library the field, and what was expected); common
practice, no source.
"""

import ast
import dataclasses
import math
import pathlib

import pytest
from click.testing import CliRunner

import coilplan.forms
from coilplan import materials, quantities
from coilplan import tank_values as tank
from coilplan import wire as wires
from coilplan.cli import main
from coilplan.cli._fields import COMMAND_OPTIONS, FIELD_OPTIONS, in_option_words, option_for
from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.forms import ClosedCore, FlatSpiral, GappedCore, MultilayerCoil, RodCoil, Solenoid, Toroid
from coilplan.report.plot import plot_format
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire

PACKAGE = pathlib.Path(coilplan.forms.__file__).resolve().parents[1]
WIRE = parse_wire("0.5mm")  # enamelled, about 0.54 mm overall

#: a form that validates, per class; each case below spoils one field of it
VALID = {
    Solenoid: {"diameter": 0.02, "wire": WIRE},
    MultilayerCoil: {"former_diameter": 0.01, "width": 0.01, "wire": WIRE},
    FlatSpiral: {"inner_diameter": 0.01, "wire": WIRE},
    Toroid: {"inner_diameter": 0.01, "outer_diameter": 0.02, "height": 0.005, "wire": WIRE, "mu_r": 100.0},
    RodCoil: {"rod_length": 0.1, "rod_diameter": 0.01, "mu_initial": 125.0, "wire": WIRE},
    GappedCore: {"ae": 50e-6, "le": 0.045, "wire": WIRE, "gap": 0.001, "mu_r": 2000.0},
    ClosedCore: {"al": 100e-9},
}

#: (form, the field the error must name, the changes that spoil it)
BAD = [
    (Solenoid, "diameter", {"diameter": math.nan}),
    (Solenoid, "diameter", {"diameter": 0.3e-3}),  # inside the wire itself
    (Solenoid, "pitch", {"pitch": -1.0}),
    (Solenoid, "pitch", {"pitch": 0.1e-3}),  # turns would overlap
    (Solenoid, "pitch", {"pitch": 1e-3, "length": 0.02}),  # one or the other
    (Solenoid, "length", {"length": 0.0}),
    (Solenoid, "length", {"length": 0.05, "max_length": 0.03}),
    (Solenoid, "max_length", {"max_length": 0.1e-3}),
    (Solenoid, "lead", {"lead": -1e-3}),
    (Solenoid, "method", {"method": "guess"}),
    (Solenoid, "former_permittivity", {"former_permittivity": 0.5}),
    (MultilayerCoil, "former_diameter", {"former_diameter": 0.0}),
    (MultilayerCoil, "width", {"width": 0.1e-3}),  # not one turn wide
    (MultilayerCoil, "max_depth", {"max_depth": 0.1e-3}),
    (MultilayerCoil, "packing", {"packing": 3.0}),
    (MultilayerCoil, "lead", {"lead": math.nan}),
    (MultilayerCoil, "style", {"style": "heaped"}),
    (MultilayerCoil, "method", {"method": "guess"}),
    (FlatSpiral, "inner_diameter", {"inner_diameter": -0.01}),
    (FlatSpiral, "outer_diameter", {"outer_diameter": 0.0105}),  # not two wires beyond the inside
    (FlatSpiral, "spacing", {"spacing": -1e-3}),
    (FlatSpiral, "spacing", {"wire": parse_wire("0.5mm", grade="bare")}),  # bare turns touching
    (FlatSpiral, "lead", {"lead": -1e-3}),
    (FlatSpiral, "method", {"method": "guess"}),
    (Toroid, "inner_diameter", {"inner_diameter": 0.0}),
    (Toroid, "outer_diameter", {"outer_diameter": 0.01}),  # not above the inside
    (Toroid, "height", {"height": -0.005}),
    (Toroid, "al", {"al": 0.0}),
    (Toroid, "mu_r", {"mu_r": -5.0}),
    (Toroid, "chamfer", {"chamfer": 0.004}),  # beyond half the section
    (Toroid, "layers", {"layers": "two"}),
    (Toroid, "lead", {"lead": -1e-3}),
    (Toroid, "wire", {"inner_diameter": 1e-3, "wire": parse_wire("0.8mm")}),  # does not pass the hole
    (RodCoil, "rod_length", {"rod_length": 0.0}),
    (RodCoil, "rod_length", {"rod_length": 0.3e-3}),  # no room for one turn
    (RodCoil, "rod_diameter", {"rod_diameter": -0.01}),
    (RodCoil, "mu_initial", {"mu_initial": 0.5}),
    (RodCoil, "former_diameter", {"former_diameter": 0.005}),  # narrower than the rod
    (RodCoil, "pitch", {"pitch": 0.1e-3}),
    (RodCoil, "pitch", {"pitch": 1e-3, "coil_length": 0.02}),
    (RodCoil, "coil_length", {"coil_length": 0.2}),  # longer than the rod
    (RodCoil, "max_length", {"max_length": 0.3e-3}),
    (RodCoil, "position", {"position": math.inf}),
    (RodCoil, "lead", {"lead": -1e-3}),
    (GappedCore, "ae", {"ae": 0.0}),
    (GappedCore, "le", {"le": -0.045}),
    (GappedCore, "mu_r", {"mu_r": 0.0}),
    (GappedCore, "al", {"al": -1e-6}),
    (GappedCore, "gap", {"gap": -1e-3}),
    (GappedCore, "gap", {"gap": 0.03}),  # above half the path
    (GappedCore, "window_width", {"window_width": 0.1e-3}),  # narrower than the wire
    (GappedCore, "window_depth", {"window_depth": math.nan}),
    (GappedCore, "lead", {"lead": -1e-3}),
    (ClosedCore, "al", {"al": 0.0}),
    (ClosedCore, "turn_length", {"turn_length": -0.02}),
]


# --- (a) every form names its own dataclass field -----------------------------------------------------------


@pytest.mark.parametrize(("form", "field", "changes"), BAD,
                         ids=[f"{form.__name__}-{field}-{i}" for i, (form, field, _) in enumerate(BAD)])
def test_a_form_refuses_a_bad_value_naming_its_own_field(form, field, changes):
    """One bad value at a time: the error names the form's own field, and no option appears in the message."""
    assert field in {f.name for f in dataclasses.fields(form)}
    form(**VALID[form])  # the unspoilt form is accepted
    with pytest.raises(InvalidInputError) as caught:
        form(**{**VALID[form], **changes})
    assert caught.value.option == field
    assert str(caught.value).startswith(f"{field}: expected ")
    assert "--" not in str(caught.value)


def test_every_form_class_is_checked():
    """A new form in coilplan.forms gets its cases here."""
    forms = {value for name in coilplan.forms.__all__
             if isinstance(value := getattr(coilplan.forms, name), type) and dataclasses.is_dataclass(value)}
    assert forms == set(VALID) == {form for form, _, _ in BAD}


@pytest.mark.parametrize(("call", "field"), [
    pytest.param(lambda: parse_wire("copper"), "wire", id="parse_wire"),
    pytest.param(lambda: parse_wire("24awg", grade="4"), "grade", id="parse_wire-grade"),
    pytest.param(lambda: quantities.parse_relative("many"), "tolerance",
                 id="parse_relative"),
    pytest.param(lambda: quantities.parse_temperature("warm"), "temperature",
                 id="parse_temperature"),
    pytest.param(lambda: quantities.parse_measurement("12uH"), "readings",
                 id="parse_measurement"),
    pytest.param(lambda: quantities.parse_loss_factor("x@1MHz"), "loss_factor",
                 id="parse_loss_factor"),
    pytest.param(lambda: quantities.parse_q_reading("x@1MHz"), "measured_q",
                 id="parse_q_reading"),
    pytest.param(lambda: materials.material("nizn-152"), "material",
                 id="material"),
    pytest.param(lambda: materials.materials_for_permeability(-1), "mu_r",
                 id="materials_for_permeability"),
    pytest.param(lambda: wires.parse_current_density("many"), "density",
                 id="parse_current_density"),
    pytest.param(lambda: tank.parse_resonance("100pF"), "points", id="parse_resonance"),
    pytest.param(lambda: plot_format("coil.gif"), "plot",
                 id="plot_format"),
    pytest.param(lambda: solve_turns(Solenoid(**VALID[Solenoid]), 1.0),
                 "target", id="solve_turns"),
])
def test_a_parser_left_to_its_default_names_a_field(call, field):
    """Called without a name, the library's readers and the solver name their own field, not an option."""
    with pytest.raises((InvalidInputError, InfeasibleError)) as caught:
        call()
    assert caught.value.option == field
    assert not caught.value.option.startswith("--")


# --- (b) no option names below the command line -------------------------------------------------------------

#: the trim log is being rewritten apart; drop it from here when that lands (the check below says when)
PENDING = {"session.py"}

#: functions whose argument names the field of the value they check: (name, position of that argument)
NAMING_CALLS = {"InvalidInputError": 0, "InfeasibleError": None, "positive": 1, "_positive": 1,
                "_check_positive": 1, "_check_tolerance": 1}


def _named_fields(path: pathlib.Path):
    """(line, text) of every field a library module names as a string: the first argument (or ``option=``) of
    an error or check, and the default of an ``option`` parameter."""
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.Call):
            name = getattr(node.func, "id", getattr(node.func, "attr", None))
            if name not in NAMING_CALLS:
                continue
            position = NAMING_CALLS[name]
            named = [node.args[position]] if position is not None and len(node.args) > position else []
            named += [keyword.value for keyword in node.keywords if keyword.arg == "option"]
            for value in named:
                if isinstance(value, ast.JoinedStr) and value.values:
                    value = value.values[0]
                if isinstance(value, ast.Constant) and isinstance(value.value, str):
                    yield node.lineno, value.value
        elif isinstance(node, ast.FunctionDef):
            arguments = node.args.posonlyargs + node.args.args
            for argument, default in zip(arguments[len(arguments) - len(node.args.defaults):], node.args.defaults,
                                         strict=True):
                if argument.arg == "option" and isinstance(default, ast.Constant) and isinstance(default.value, str):
                    yield node.lineno, default.value


def _library_modules():
    return [path for path in sorted(PACKAGE.rglob("*.py")) if "cli" not in path.relative_to(PACKAGE).parts]


def test_no_library_module_names_a_command_line_option():
    """No error raised under coilplan/ outside coilplan/cli/ names an option (a string starting with "--")."""
    found = [f"{path.relative_to(PACKAGE)}:{line}: {text!r}" for path in _library_modules()
             if path.name not in PENDING for line, text in _named_fields(path) if text.startswith("--")]
    assert len(_library_modules()) > 30  # the scan sees the package
    assert found == []


def test_the_pending_exception_is_still_needed():
    """The module left out above still names options; once it does not, it leaves PENDING."""
    for name in PENDING:
        (path,) = [path for path in _library_modules() if path.name == name]
        assert any(text.startswith("--") for _, text in _named_fields(path)), f"{name} may leave PENDING"


#: fields the library names that no command sets directly (a reader's generic name, a physics switch)
LIBRARY_ONLY = {"value", "gauge", "kind", "measurements"}


def test_every_field_the_library_names_has_an_option():
    """Each field named as a string in the library maps to an option in cli/_fields.py, or is library-only."""
    mapped = set(FIELD_OPTIONS) | {field for fields in COMMAND_OPTIONS.values() for field in fields}
    named = {text for path in _library_modules() if path.name not in PENDING and "kit" not in path.parts
             for _, text in _named_fields(path)}
    assert named - mapped - LIBRARY_ONLY == set()
    assert named >= LIBRARY_ONLY  # each is still used, or leaves the list
    assert all(option.startswith("--") for option in FIELD_OPTIONS.values())


# --- (c) through the command line: the option the user typed ------------------------------------------------


def run(*args):
    outcome = CliRunner().invoke(main, [str(arg) for arg in args])
    assert "Traceback" not in outcome.stdout + outcome.stderr
    return outcome


def the_error(outcome, code=2) -> str:
    assert outcome.exit_code == code, outcome.stdout + outcome.stderr
    lines = outcome.stderr.splitlines()
    assert len(lines) == 1, outcome.stderr
    return lines[0]


TOROID = ("toroid", "--height", "5mm", "--mu", "100", "--wire", "0.3mm", "--turns", "10")
SPIRAL = ("spiral", "--wire", "0.3mm", "--turns", "10")
ROD = ("rod", "--rod-length", "100mm", "--rod-diameter", "10mm", "--wire", "0.5mm", "--turns", "10")
GAPPED = ("gapped", "--ae", "50mm2", "--le", "45mm", "--wire", "0.3mm", "--turns", "10")


@pytest.mark.parametrize(("args", "start", "field"), [
    pytest.param(("solenoid", "--diameter", "20mm", "--wire", "0.5mm", "--pitch", "0.2mm", "--turns", "5"),
                 "--pitch: expected a pitch of at least the overall wire diameter", "pitch", id="solenoid"),
    pytest.param(("solenoid", "--target-frequency", "7MHz", "--capacitance", "47pF", "--at", "5MHz",
                  "--diameter", "20mm", "--wire", "0.5mm"),
                 "--at: expected the resonant frequency of the tuning", "frequency", id="solenoid-at"),
    pytest.param(("multilayer", "--former", "10mm", "--width", "0.1mm", "--wire", "0.5mm", "--turns", "5"),
                 "--width: expected a winding width of at least", "width", id="multilayer"),
    pytest.param(("multilayer", "--former", "10mm", "--width", "10mm", "--max-depth", "0.1mm", "--wire", "0.5mm",
                  "--turns", "5"), "--max-depth: expected a depth of at least one wire diameter", "max_depth",
                 id="multilayer-depth"),
    pytest.param((*SPIRAL, "--inner", "10mm", "--outer", "10.5mm"),
                 "--outer: expected an outer diameter of at least the inner diameter", "outer_diameter",
                 id="spiral"),
    pytest.param((*TOROID, "--id", "10mm", "--od", "5mm"),
                 "--od: expected an outer diameter above the inner diameter", "outer_diameter", id="toroid"),
    pytest.param((*TOROID, "--id", "10mm", "--od", "20mm", "--chamfer", "5mm"),
                 "--chamfer: expected a chamfer of zero or more", "chamfer", id="toroid-chamfer"),
    pytest.param((*ROD, "--mu", "125", "--former", "5mm"),
                 "--former: expected a former at least as wide as the", "former_diameter", id="rod"),
    pytest.param(ROD, "--mu: expected the core's permeability, a material class, or a reading", "mu_initial",
                 id="rod-no-core"),
    pytest.param((*GAPPED, "--mu", "2000", "--gap", "40mm"),
                 "--gap: expected a gap well below the path length", "gap", id="gapped"),
    pytest.param(("rewind", "--measured", "10uH@10", "--measured", "11uH@10", "--target", "20uH"),
                 "--measured: expected one reading per turn count", "readings", id="rewind"),
    pytest.param(("rewind", "--measured", "10uH@10", "--target", "20uH", "--turns-uncertainty", "12"),
                 "--turns-uncertainty: expected an uncertainty below the fewest turns read", "turns_uncertainty",
                 id="rewind-count"),
    pytest.param(("tank", "--inductance", "1uH", "--capacitance", "1nF", "--frequency", "1MHz"),
                 "--frequency: expected two of the inductance, capacitance and frequency", "frequency",
                 id="tank-frequency"),
    pytest.param(("tank", "--frequency", "1MHz"), "--inductance or --capacitance: expected one more of them",
                 "inductance or capacitance", id="tank-two-of-three"),
    pytest.param(("count-turns", "--before", "1mH", "--added", "3"),
                 "--after: expected the reading after the change", "after", id="count-turns"),
])
def test_the_command_line_names_the_option_typed(args, start, field):
    """The library's field comes out as the option of the command that ran: one line, exit status 2."""
    line = the_error(run(*args))
    assert line.startswith(f"coilplan: error: {start}"), line
    named = line.removeprefix("coilplan: error: ").split(": expected")[0]
    assert named == option_for(field, args[0])  # the library's field, through the one map


def test_one_field_two_commands_two_options():
    """inner_diameter and outer_diameter are --id/--od on a toroid and --inner/--outer on a spiral; frequency is
    --frequency in tank and --at in the form commands."""
    assert (option_for("inner_diameter", "toroid"), option_for("outer_diameter", "toroid")) == ("--id", "--od")
    assert (option_for("inner_diameter", "spiral"), option_for("outer_diameter", "spiral")) == ("--inner", "--outer")
    assert (option_for("frequency", "tank"), option_for("frequency", "solenoid")) == ("--frequency", "--at")
    error = InvalidInputError("inner_diameter", "an inner diameter above zero", 0.0)
    assert str(in_option_words(error, "toroid")) == "--id: expected an inner diameter above zero; got 0.0"
    assert str(in_option_words(error, "spiral")) == "--inner: expected an inner diameter above zero; got 0.0"
    spiral = the_error(run(*SPIRAL, "--inner", "10mm", "--outer", "10.5mm"))
    toroid = the_error(run(*TOROID, "--id", "10mm", "--od", "5mm"))
    assert "--outer:" in spiral and "--od" not in spiral
    assert "--od:" in toroid and "--outer" not in toroid


def test_names_that_are_not_fields_are_kept():
    """An option the command line names itself, a file's own error and an unknown name pass unchanged."""
    from coilplan.kit.plan import PlanFileError

    typed = InvalidInputError("--out", "a folder", "x")
    assert in_option_words(typed, "kit") is typed
    plan = PlanFileError("target", "coil[1]: target: expected an inductance")  # a plan file called "target"
    assert in_option_words(plan, "kit") is plan
    assert option_for("WIRE", "wire") == "WIRE"
    infeasible = in_option_words(InfeasibleError("too many turns", option="turns", achievable=(1.0, 2.0)))
    assert (infeasible.option, infeasible.message, infeasible.achievable) == ("--turns", "too many turns", (1.0, 2.0))


# --- the kit: the plan-file key, with the file, the line and the entry --------------------------------------

ROD_PLAN = """[settings]
meter_frequency = "{meter}"

[[coil]]
name = "aerial"
count = 1
target = "200uH"
forms = ["rod"]

[[rod]]
name = "rod-10"
length = "100mm"
diameter = "10mm"
material = "nizn-125"
count = 1
measured = ["{reading}"]
measured_wire = "0.2mm"

[[reel]]
wire = "0.2mm"
length = "20m"
"""


@pytest.mark.parametrize(("meter", "reading", "where"), [
    pytest.param("100MHz", "180uH@50", "line 2: rod[1] 'rod-10': settings.meter_frequency: expected a test "
                 "frequency well below the coil's self-resonance", id="meter-near-resonance"),
    pytest.param("10kHz", "180uH@5000", "line 16: rod[1] 'rod-10': measured: expected a reading at a turn count "
                 "this coil can have", id="reading-beyond-the-rod"),
])
def test_a_kit_error_names_the_plan_key_with_file_line_and_entry(tmp_path, meter, reading, where):
    """A rod's readings the library refuses (on meter_frequency, on readings) are placed in the plan file: the
    setting's or the entry's line, the entry, and the key the user wrote (not the library's field)."""
    plan = tmp_path / "plan.toml"
    plan.write_text(ROD_PLAN.format(meter=meter, reading=reading), encoding="utf-8")
    line = the_error(run("kit", plan))
    assert line.startswith(f"coilplan: error: {plan}, {where}"), line
    assert "readings" not in line and "meter_frequency:" not in line.replace("settings.meter_frequency:", "")


def test_plan_keys_per_table():
    """One field, the key each table keeps it under (coilplan/kit/keys.py)."""
    from coilplan.kit.keys import plan_key

    assert [plan_key("wire", table) for table in ("reel", "rod")] == ["wire", "measured_wire"]
    assert [plan_key("former_diameter", table) for table in ("rod", "bobbin")] == ["former", "diameter"]
    assert [plan_key(field, "toroid") for field in ("inner_diameter", "outer_diameter", "mu_r")] == ["id", "od", "mu"]
    assert plan_key("meter_frequency", "rod") == "settings.meter_frequency"
