"""The one pipeline (coilplan.pipeline): every form command is design(form, request), and the cases a bench
user meets (a test winding of another wire, a rod of unknown material, an old winding of another wire on a
closed core, a rewind at frequency) come out as the physics says."""

import json
import math

import pytest
from click.testing import CliRunner

from coilplan.answer import flat, flat_document
from coilplan.cli import main
from coilplan.errors import InvalidInputError
from coilplan.forms import FlatSpiral, GappedCore, MultilayerCoil, RodCoil, Solenoid, Toroid
from coilplan.pipeline import design
from coilplan.request import CoreFacts, Drive, Reading, Request
from coilplan.wire import parse_wire


def run_json(*args):
    outcome = CliRunner().invoke(main, [*args, "--json"])
    assert outcome.exit_code == 0, outcome.stdout + outcome.stderr
    return flat_document(json.loads(outcome.stdout))


def close(ours, theirs, rel=1e-9):
    """Every number of the command's result equals the API's to ``rel``."""
    assert ours.keys() == theirs.keys()
    for key, value in ours.items():
        if isinstance(value, float) and theirs[key] is not None:
            assert value == pytest.approx(theirs[key], rel=rel, abs=0), key
        elif isinstance(value, dict):
            close(value, theirs[key], rel)
        else:
            assert value == theirs[key], key


WIRE = parse_wire("0.5mm")
THIN = parse_wire("0.3mm")

# (command line, the same coil and request through the Python API)
SAME_COIL = {
    "solenoid": (["solenoid", "--former", "25mm", "--wire", "0.5mm", "--measured", "8uH@20", "--test-wire", "0.3mm",
                  "--target", "12uH", "--at", "7MHz"],
                 Solenoid.on_former(0.025, WIRE),
                 Request(target=12e-6, frequency=7e6, readings=(Reading(8e-6, 20, wire=THIN),))),
    "multilayer": (["multilayer", "--former", "10mm", "--width", "8mm", "--wire", "0.5mm", "--measured",
                    "30uH@60", "--test-wire", "0.3mm", "--target", "40uH"],
                   MultilayerCoil(former_diameter=0.010, width=0.008, wire=WIRE),
                   Request(target=40e-6, readings=(Reading(30e-6, 60, wire=THIN),))),
    "spiral": (["spiral", "--inner", "20mm", "--spacing", "0.2mm", "--wire", "0.5mm", "--measured", "3uH@12",
                "--test-wire", "0.3mm", "--target", "4uH"],
               FlatSpiral(inner_diameter=0.020, wire=WIRE, spacing=0.2e-3),
               Request(target=4e-6, readings=(Reading(3e-6, 12, wire=THIN),))),
    "toroid": (["toroid", "--od", "23mm", "--id", "14mm", "--height", "7mm", "--wire", "0.5mm", "--measured",
                "40uH@20", "--test-wire", "0.3mm", "--target", "60uH", "--current", "0.2A"],
               Toroid(inner_diameter=0.014, outer_diameter=0.023, height=0.007, wire=WIRE,
                      al_basis="measured: 40.00 μH at 20 turns"),
               Request(target=60e-6, readings=(Reading(40e-6, 20, wire=THIN),), drive=Drive(dc_current=0.2))),
    "gapped": (["gapped", "--ae", "52mm2", "--le", "57mm", "--window-width", "28mm", "--window-depth", "7mm",
                "--wire", "0.8mm", "--measured", "1.05H@1563", "--target", "20mH"],
               GappedCore(ae=52e-6, le=0.057, wire=parse_wire("0.8mm"), window_width=0.028, window_depth=0.007),
               Request(target=20e-3, readings=(Reading(1.05, 1563),))),
    "rod": (["rod", "--rod-length", "100mm", "--rod-diameter", "8mm", "--material", "nizn-250", "--wire", "0.5mm",
             "--pitch", "0.56347mm", "--measured", "52uH@30", "--test-wire", "0.3mm", "--test-pitch", "0.3466mm",
             "--turns", "76", "--at", "1MHz"],
            RodCoil(rod_length=0.100, rod_diameter=0.008, mu_initial=250.0, wire=WIRE, pitch=0.56347e-3,
                    saturation_flux_density=None),
            Request(turns=76, frequency=1e6, readings=(Reading(52e-6, 30, wire=THIN, pitch=0.3466e-3),),
                    core=CoreFacts(material="nizn-250"))),
}


@pytest.mark.parametrize("name", sorted(SAME_COIL))
def test_a_command_answers_what_the_python_api_answers(name):
    """The same coil and readings (a test winding of another wire) through the command and through design()."""
    arguments, form, request = SAME_COIL[name]
    document = run_json(*arguments)
    if name == "rod":  # the command takes the class's saturation figure; the API form here has none
        from coilplan.materials import material

        form = RodCoil(**{**form.__dict__, "saturation_flux_density":
                          float(material("nizn-250").saturation_flux_density(20.0))})
    answer = design(form, request)
    close(document["result"], flat(json.loads(json.dumps(answer.to_json()))["result"]))
    assert document["warnings"] == list(answer.warnings)
    assert document["cautions"] == list(answer.cautions)


def test_a_test_winding_of_another_wire_is_modelled_as_wound():
    """The scale factor compares the reading with the model of the winding it was read on (0.3 mm wire at its own
    pitch), and the planned coil (0.5 mm at 0.56 mm) takes that factor: k = L_read/L_test(30), L = k·L_plan(76)."""
    document = run_json(*SAME_COIL["rod"][0])["result"]
    plan = RodCoil(rod_length=0.100, rod_diameter=0.008, mu_initial=250.0, wire=WIRE, pitch=0.56347e-3)
    test = RodCoil(rod_length=0.100, rod_diameter=0.008, mu_initial=250.0, wire=THIN, pitch=0.3466e-3)
    factor = 52e-6 / float(test.inductance(30))
    assert document["model_factor"] == pytest.approx(factor, rel=1e-9)
    assert document["inductance_H"] == pytest.approx(factor * float(plan.inductance(76)), rel=1e-9)
    # taken as a reading of the planned winding instead, the answer would be several percent off
    naive = 52e-6 / float(plan.inductance(30)) * float(plan.inductance(76))
    assert abs(naive / document["inductance_H"] - 1) > 0.03


def test_a_rod_of_unknown_material_takes_its_permeability_from_the_reading():
    """No --mu, no --material: the reading sets µi, so the model reads exactly what the meter read."""
    result = run_json("rod", "--rod-length", "140mm", "--rod-diameter", "10mm", "--wire", "0.3mm",
                      "--measured", "68uH@30", "--target", "239uH")["result"]
    rod = RodCoil(rod_length=0.140, rod_diameter=0.010, mu_initial=result["mu_fitted"], wire=THIN)
    assert float(rod.inductance(30)) == pytest.approx(68e-6, rel=1e-8)
    assert result["model_factor"] == pytest.approx(1.0, rel=1e-8)
    assert result["turns_now"] == 30 and result["turns"] > 30


def test_an_old_winding_of_other_wire_on_a_closed_core_plans_a_whole_winding():
    """1563 turns of an old thin winding read 1.05 H: L = AL·N² (docs/methods.md §8) gives AL, and the new 0.8 mm
    winding for 20 mH is N = 1563·√(0.02/1.05), wound afresh (the old count does not fit with the new wire)."""
    result = run_json(*SAME_COIL["gapped"][0])["result"]
    assert result["turns_exact"] == pytest.approx(1563 * math.sqrt(0.02 / 1.05), rel=1e-9)
    assert "turns_now" not in result and any("another winding" in note for note in result["notices"])


def test_rewind_at_a_frequency_says_why_it_cannot_correct_and_corrects_with_a_given_capacitance():
    """A closed core of unknown geometry has no self-capacitance to estimate: one warning, the plain answer.
    With one given, the target at f is L = L_app/(1 + ω²·L_app·C) at low frequency (docs/methods.md §10)."""
    plain = run_json("rewind", "--measured", "62uH@24", "--target", "150uH")
    warned = run_json("rewind", "--measured", "62uH@24", "--target", "150uH", "--at", "10MHz")
    assert warned["result"]["turns_exact"] == plain["result"]["turns_exact"]
    assert sum("changes nothing" in text for text in warned["warnings"]) == 1
    given = run_json("rewind", "--measured", "62uH@24", "--target", "150uH", "--at", "10MHz",
                     "--self-capacitance", "1pF")["result"]
    omega = 2 * math.pi * 10e6
    low = 150e-6 / (1 + omega**2 * 150e-6 * 1e-12)
    assert given["target_low_frequency_H"] == pytest.approx(low, rel=1e-12)
    assert given["turns_exact"] == pytest.approx(24 * math.sqrt(low / 62e-6), rel=1e-9)


def test_the_library_names_its_own_fields_and_the_command_line_its_options():
    """A request that asks two things names the field in the library and the option on the command line."""
    with pytest.raises(InvalidInputError) as caught:
        design(Solenoid(diameter=0.02, wire=WIRE), Request(turns=10, target=1e-6))
    assert caught.value.option == "target"
    with pytest.raises(InvalidInputError) as caught:
        Request(turns=10, tuning=(7e6, 100e-12))
    assert caught.value.option == "turns"
    with pytest.raises(InvalidInputError) as caught:
        design(RodCoil(rod_length=0.1, rod_diameter=0.01, mu_initial=None, wire=WIRE), Request(turns=10))
    assert caught.value.option == "mu_initial"
    outcome = CliRunner().invoke(main, ["rod", "--rod-length", "100mm", "--rod-diameter", "10mm", "--wire",
                                        "0.5mm", "--turns", "10"])
    assert outcome.exit_code == 2 and outcome.stderr.startswith("coilplan: error: --mu: expected")


KIT_ROD = """
[settings]
packing = 0.95

[[coil]]
name = "loop"
count = 1
target = "237uH"
tolerance = "5%"
forms = ["rod"]

[[rod]]
length = "100mm"
diameter = "8mm"
material = "nizn-250"
count = 1
measured = ["52uH@30"]
measured_wire = "0.3mm"

[[reel]]
wire = "0.5mm"
length = "20m"
"""


def test_the_kit_and_the_rod_command_agree_on_a_rod_calibrated_by_a_test_winding_of_other_wire(tmp_path):
    """The kit winds by hand at pitch = overall diameter / packing, the test winding too; the rod command told
    the same pitches (--pitch, --test-pitch) gives the same inductance and calibration to 1e-9."""
    plan = tmp_path / "plan.toml"
    plan.write_text(KIT_ROD, encoding="utf-8")
    placed = run_json("kit", str(plan))["result"]["placements"][0]
    pitch, test_pitch = WIRE.overall_diameter / 0.95, THIN.overall_diameter / 0.95
    single = run_json("rod", "--rod-length", "100mm", "--rod-diameter", "8mm", "--material", "nizn-250",
                      "--wire", "0.5mm", "--pitch", f"{pitch * 1e3!r}mm", "--measured", "52uH@30",
                      "--test-wire", "0.3mm", "--test-pitch", f"{test_pitch * 1e3!r}mm",
                      "--turns", str(placed["turns"]))["result"]
    assert single["inductance_H"] == pytest.approx(placed["inductance_H"], rel=1e-9)
    assert single["model_factor"] == pytest.approx(placed["calibration_factor"], rel=1e-9)


def test_the_batched_apparent_solve_is_the_apparent_forms_root():
    """solve_apparent (many targets, each at its own frequency) finds the root the apparent form and the plain
    solver find one target at a time: L(N)/(1 − ω²L(N)C(N)) = T (docs/methods.md §10), to the last bits."""
    from coilplan.apparent import ApparentForm
    from coilplan.solve import solve_apparent, solve_turns

    coil = Solenoid.on_former(0.025, WIRE)
    targets, frequencies = [10e-6, 4e-6, 25e-6, 10e-6], [7e6, 20e6, 3e6, 0.0]
    batch = solve_apparent(coil, targets, frequencies)
    for k, (target, frequency) in enumerate(zip(targets, frequencies, strict=True)):
        one = solve_turns(ApparentForm(coil, frequency) if frequency else coil, target)
        assert batch.turns_exact[k] == pytest.approx(one.turns_exact, rel=1e-12)
        assert batch.turns[k] == one.turns and batch.inductance[k] == pytest.approx(one.inductance, rel=1e-12)


KIT_FORMER = """
[settings]
packing = 0.9
lead = "0mm"

[[coil]]
name = "tank"
count = 1
target = "10uH"
at = "7MHz"
tolerance = "5%"

[[former]]
diameter = "25mm"
length = "60mm"
count = 1

[[reel]]
wire = "0.5mm"
length = "20m"
"""


def test_the_kit_and_the_solenoid_command_agree_at_the_operating_frequency(tmp_path):
    """A coil for 10 µH at 7 MHz on a former: the kit's turns and inductances are the command's for the same
    hand-wound coil (overall diameter / packing as the pitch), by the same batched apparent solve."""
    plan = tmp_path / "plan.toml"
    plan.write_text(KIT_FORMER, encoding="utf-8")
    placed = run_json("kit", str(plan))["result"]["placements"][0]
    overall = WIRE.overall_diameter
    single = run_json("solenoid", "--diameter", f"{(0.025 + overall) * 1e3!r}mm", "--wire", "0.5mm",
                      "--overall", f"{overall / 0.9 * 1e3!r}mm", "--max-length", "60mm", "--target", "10uH",
                      "--at", "7MHz")["result"]
    assert single["turns"] == placed["turns"]
    assert single["inductance_H"] == pytest.approx(placed["inductance_H"], rel=1e-9)
    assert single["apparent_inductance_H"] == pytest.approx(placed["apparent_inductance_H"], rel=1e-9)
