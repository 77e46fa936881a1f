"""The kit planner's ferrite rods, gapped cores, multilayer bobbins, taps and the wire on the reels."""

import csv
import io
import json
import math
import re
import xml.etree.ElementTree as ET

import pytest
from scipy.constants import mu_0

from coilplan.forms import MultilayerCoil, RodCoil
from coilplan.kit import PlanFileError, parse_plan, plan_kit
from coilplan.kit.outputs import bom_csv, card_files, kit_document, result_fields
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire

REEL = '[[reel]]\nwire = "0.3mm"\nlength = "100m"\n'
PACKING = 0.9  # the plan's default hand-winding packing
LEAD = 0.02  # the plan's default lead per end, m


def coil(name, count, target, extra=""):
    return f'[[coil]]\nname = "{name}"\ncount = {count}\ntarget = "{target}"\n{extra}'


def rod(name, count, extra='material = "nizn-125"\n', length="100mm", diameter="10mm"):
    return f'[[rod]]\nname = "{name}"\nlength = "{length}"\ndiameter = "{diameter}"\n{extra}count = {count}\n'


def gapped(name, count, core='gap = "0.3mm"\nmu = 2000\n', width="10mm", depth="5mm"):
    return (f'[[gapped]]\nname = "{name}"\nae = "40mm2"\nle = "45mm"\n{core}window_width = "{width}"\n'
            f'window_depth = "{depth}"\ncount = {count}\n')


def bobbin(name, count, diameter="6mm", width="8mm", depth="6mm", extra=""):
    return (f'[[bobbin]]\nname = "{name}"\ndiameter = "{diameter}"\nwidth = "{width}"\ndepth = "{depth}"\n{extra}'
            f'count = {count}\n')


def toroid(name, count, al):
    return (f'[[toroid]]\nname = "{name}"\nod = "12.7mm"\nid = "7.7mm"\nheight = "4.8mm"\nal = "{al}"\n'
            f'count = {count}\n')


def hand_pitch(wire_text):
    return parse_wire(wire_text, option="wire").overall_diameter / PACKING


# --- the plan file: the new tables' errors name file, line, entry and field -----------------------

BASE = coil("c", 1, "10uH")


def _line(text, fragment):
    return text.splitlines().index(fragment) + 1


@pytest.mark.parametrize(("stock", "where", "fragments"), [
    pytest.param(rod("ferrite", 2, extra=""), "[[rod]]", ["rod[1] 'ferrite'", "material:", "permeability mu"],
                 id="rod-without-material"),
    pytest.param(rod("ferrite", 2, extra='material = "nizn-125"\nmu = 125\n'), "mu = 125",
                 ["rod[1] 'ferrite'", "mu: give either material or mu"], id="rod-material-and-mu"),
    pytest.param(rod("ferrite", 2, extra="mu = 0.5\n"), "mu = 0.5",
                 ["rod[1] 'ferrite'", "mu: expected a relative permeability of at least 1", "(got 0.5)"],
                 id="rod-mu-below-one"),
    pytest.param(rod("ferrite", 2, extra='material = "nizn-125"\nformer = "8mm"\n'), 'former = "8mm"',
                 ["rod[1] 'ferrite'", "former: expected a former at least as wide"], id="rod-former-too-narrow"),
    pytest.param(rod("ferrite", 2, extra='material = "nizn-125"\nmeasured = "12uH"\nmeasured_wire = "0.3mm"\n'),
                 'measured = "12uH"', ["rod[1] 'ferrite'", "measured:", "inductance@turns"], id="rod-bad-reading"),
    pytest.param(rod("ferrite", 2, extra='material = "nizn-125"\nmeasured = "12uH@20"\n'), "[[rod]]",
                 ["rod[1] 'ferrite'", "measured_wire: expected the wire of the test winding"],
                 id="rod-reading-without-its-wire"),
    pytest.param(gapped("e-core", 1, core='gap = "0.3mm"\nal = "200nH"\n'), 'gap = "0.3mm"',
                 ["gapped[1] 'e-core'", "gap: give either gap"], id="gapped-gap-and-al"),
    pytest.param(gapped("e-core", 1, core='mu = 2000\n'), "[[gapped]]",
                 ["gapped[1] 'e-core'", "gap: expected the core's air gap"], id="gapped-without-gap"),
    pytest.param(gapped("e-core", 1, core='gap = "0.3mm"\n'), "[[gapped]]",
                 ["gapped[1] 'e-core'", "material: expected a material class"], id="gapped-gap-without-material"),
    pytest.param(gapped("e-core", 1).replace('ae = "40mm2"', 'ae = "40mm"'), 'ae = "40mm"',
                 ["gapped[1] 'e-core'", "ae:", "'40mm'"], id="gapped-area-as-length"),
    pytest.param(gapped("e-core", 1).replace('window_width = "10mm"\n', ""), "[[gapped]]",
                 ["gapped[1] 'e-core'", "window_width: field required"], id="gapped-window-missing"),
    pytest.param(gapped("e-core", 1, core='gap = "30mm"\nmu = 2000\n'), 'gap = "30mm"',
                 ["gapped[1] 'e-core'", "gap: expected a gap well below the path length"], id="gapped-gap-too-long"),
    pytest.param(bobbin("spool", 1, extra='style = "random"\n'), 'style = "random"',
                 ["bobbin[1] 'spool'", "style:", "'random'"], id="bobbin-style"),
    pytest.param(bobbin("spool", 1).replace('depth = "6mm"', 'depth = "6"'), 'depth = "6"',
                 ["bobbin[1] 'spool'", "depth:", "'6'"], id="bobbin-depth-without-unit"),
])
def test_new_stock_errors_name_file_line_entry_and_field(stock, where, fragments):
    """A malformed rod, gapped core or bobbin is refused with one line: the file, the line of the field named (or
    of the entry's header when that field is missing), the entry and the field."""
    text = BASE + stock + REEL
    with pytest.raises(PlanFileError) as caught:
        parse_plan(text, "plan.toml")
    message = str(caught.value)
    assert "\n" not in message
    assert message.startswith(f"plan.toml, line {_line(text, where)}: "), message
    for fragment in fragments:
        assert fragment in message, (fragment, message)


@pytest.mark.parametrize(("extra", "fragments"), [
    pytest.param("tap_fraction = 1.5\n", ["coil[1] 'c'", "tap_fraction: expected a fraction of the turns"],
                 id="tap-fraction-above-one"),
    pytest.param("tap_fraction = 0.25\ntap_turns = 4\n", ["coil[1] 'c'", "tap_turns: give either"], id="two-taps"),
    pytest.param("tap_turns = 0\n", ["coil[1] 'c'", "tap_turns: expected a whole number of at least 1"],
                 id="tap-turn-zero"),
    pytest.param('forms = ["spiral"]\n', ["coil[1] 'c'", "forms"], id="unknown-form"),
])
def test_coil_tap_and_form_errors(extra, fragments):
    """Taps and forms of a coil are checked like its other fields."""
    with pytest.raises(PlanFileError) as caught:
        parse_plan(coil("c", 1, "10uH", extra) + toroid("t", 1, "20nH") + REEL, "plan.toml")
    for fragment in fragments:
        assert fragment in str(caught.value), (fragment, str(caught.value))


# --- the new forms --------------------------------------------------------------------------------


def test_rod_turns_are_the_rod_models_own():
    """On a rod the kit winds the whole turns the inverse solver gives on the same rod model, wound the same way
    (close wound at the plan's packing, centred), and reports that model's inductance at them."""
    result = plan_kit(parse_plan(coil("loop", 1, "40uH", 'tolerance = "10%"\nforms = ["rod"]\n')
                                 + rod("ferrite", 1) + REEL))
    (placement,) = result.placements
    wire = parse_wire("0.3mm", option="wire")
    model = RodCoil(rod_length=0.1, rod_diameter=0.01, mu_initial=125.0, wire=wire, pitch=hand_pitch("0.3mm"),
                    lead=LEAD)
    assert placement.candidate.turns == solve_turns(model, 40e-6).turns
    assert placement.candidate.inductance == pytest.approx(float(model.inductance(placement.candidate.turns)),
                                                           rel=1e-12)


def test_rod_reading_scales_the_model_through_it():
    """One reading L@N of a test winding scales the rod model by L / L_model(N) (the least-squares factor of a
    single point is the ratio; the meter's frequency is left out here, so no correction applies)."""
    text = (coil("loop", 1, "40uH", 'tolerance = "10%"\nforms = ["rod"]\n')
            + rod("ferrite", 1, extra='material = "nizn-125"\nmeasured = "30uH@20"\nmeasured_wire = "0.3mm"\n')
            + REEL)
    result = plan_kit(parse_plan(text))
    (placement,) = result.placements
    model = RodCoil(rod_length=0.1, rod_diameter=0.01, mu_initial=125.0, wire=parse_wire("0.3mm", option="wire"),
                    pitch=hand_pitch("0.3mm"), lead=LEAD)
    factor = 30e-6 / float(model.inductance(20.0))
    assert result.evaluation.stock[0].scale == pytest.approx(factor, rel=1e-12)
    turns = placement.candidate.turns
    assert placement.candidate.inductance == pytest.approx(factor * float(model.inductance(turns)), rel=1e-12)
    fields = result_fields(result)["placements"][0]
    assert fields["calibration_factor"] == pytest.approx(factor, rel=1e-12)
    assert not any("uncalibrated" in text for text in fields["warnings"])


def test_uncalibrated_rod_says_so():
    """A rod without a reading is flagged as rough (the rod model is tens of percent until calibrated)."""
    result = plan_kit(parse_plan(coil("loop", 1, "40uH", 'tolerance = "10%"\n') + rod("ferrite", 1) + REEL))
    (fields,) = result_fields(result)["placements"]
    assert fields["form"] == "rod"
    assert any("uncalibrated" in text for text in fields["warnings"])


def _gapped_al(gap, ae, le, mu, window):
    """AL = F µ0 Ae/(lg + le/µr), F = 1 + (lg/√Ae) ln(2G/lg) (IEC 60205 parameters; McLyman's fringing factor,
    from memory), written out here apart from the code under test."""
    return (1 + gap / math.sqrt(ae) * math.log(2 * window / gap)) * mu_0 * ae / (gap + le / mu)


def test_gapped_core_turns_follow_the_gapped_al():
    """On a gapped core the turns are the whole number nearest √(L/AL) for the core's gapped AL."""
    al = _gapped_al(0.3e-3, 40e-6, 45e-3, 2000.0, 10e-3)
    result = plan_kit(parse_plan(coil("choke", 1, "200uH", 'tolerance = "10%"\n') + gapped("e-core", 1) + REEL))
    (placement,) = result.placements
    exact = math.sqrt(200e-6 / al)
    nearest = min((math.floor(exact), math.ceil(exact)), key=lambda n: abs(al * n * n - 200e-6))
    assert placement.candidate.turns == nearest
    assert placement.candidate.inductance == pytest.approx(al * nearest**2, rel=1e-9)
    fields = result_fields(result)["placements"][0]
    # layers: ⌊window width / hand pitch⌋ turns a layer (the form's layer winding, common practice, no source)
    per_layer = math.floor(10e-3 / hand_pitch("0.3mm"))
    assert fields["turns_per_layer"] == per_layer
    assert fields["layers"] == math.ceil(nearest / per_layer)


def test_gapped_core_that_would_saturate_is_rejected():
    """B = AL·N·I/Ae (IEC 60205 effective parameters) at or above 80 % of the material's saturation: not used.

    mnzn-power saturates at 0.49 T at 25 °C (the project's generic class table; typical of power MnZn ferrite).
    At 3 A the 200 µH winding of 33 turns runs near 0.47 T, about 95 % of it; at 0.5 A it is well below.
    """
    core = 'gap = "0.3mm"\nmaterial = "mnzn-power"\n'
    heavy = plan_kit(parse_plan(coil("choke", 1, "200uH", 'tolerance = "10%"\ncurrent = "3A"\n')
                                + gapped("e-core", 1, core=core) + REEL))
    assert not heavy.placements and "saturation" in heavy.unplaced[0]
    light = plan_kit(parse_plan(coil("choke", 1, "200uH", 'tolerance = "10%"\ncurrent = "0.5A"\n')
                                + gapped("e-core", 1, core=core) + REEL))
    (fields,) = result_fields(light)["placements"]
    assert fields["flux_density_T"] < 0.8 * fields["saturation_flux_density_T"]


def test_bobbin_reaches_what_a_single_layer_cannot():
    """A 1 mH choke: beyond a 40 mm former's single layer, within a bobbin's layers; the turns are the inverse
    solver's on the same multilayer coil (exact filament sum), and the layers ⌈N/turns a layer⌉ (layered)."""
    text = (coil("choke", 1, "1mH", 'tolerance = "10%"\n') + bobbin("spool", 1)
            + '[[former]]\nname = "tube"\ndiameter = "10mm"\nlength = "40mm"\ncount = 1\n'
            + '[[reel]]\nwire = "0.2mm"\nlength = "100m"\n')
    result = plan_kit(parse_plan(text))
    (placement,) = result.placements
    assert result.evaluation.stock[placement.stock].kind == "bobbin"
    former = next(s for s, item in enumerate(result.evaluation.stock) if item.kind == "former")
    assert "above the" in result.evaluation.reason(0, former)
    wire = parse_wire("0.2mm", option="wire")
    model = MultilayerCoil(former_diameter=6e-3, width=8e-3, wire=wire, packing=PACKING, max_depth=6e-3,
                           lead=LEAD)
    assert placement.candidate.turns == solve_turns(model, 1e-3).turns
    fields = result_fields(result)["placements"][0]
    per_layer = math.floor(8e-3 / (wire.overall_diameter / PACKING) + 1e-9)
    assert fields["layers"] == math.ceil(placement.candidate.turns / per_layer)
    assert sum(fields["layer_turns"]) == placement.candidate.turns


# --- taps -----------------------------------------------------------------------------------------


@pytest.mark.parametrize(("tap", "expected"), [
    ("tap_fraction = 0.25\n", 5),  # 20 turns × 0.25 = 5
    ("tap_fraction = 0.275\n", 6),  # 5.5 rounds half up to 6
    ("tap_fraction = 0.01\n", 1),  # never the first end itself
    ("tap_fraction = 0.99\n", 19),  # nor the last
    ("tap_turns = 7\n", 7),
])
def test_tap_turn_on_a_twenty_turn_ring(tap, expected):
    """8 µH on a ring of 20 nH per turn² is 20 turns (L = AL·N², IEC 60205); the tap falls on the turn asked
    for (a fraction to the nearest whole turn, hand-worked), in the JSON, the CSV and the card."""
    result = plan_kit(parse_plan(coil("osc", 1, "8uH", tap) + toroid("ring", 1, "20nH") + REEL))
    (placement,) = result.placements
    assert placement.candidate.turns == 20 and placement.candidate.tap == expected
    fields = result_fields(result)
    document = json.loads(kit_document("kit.toml", fields))
    assert document["result"]["placements"][0]["tap_turn"] == expected
    rows = list(csv.DictReader(io.StringIO(bom_csv(fields, result))))
    winding = next(row for row in rows if row["section"] == "winding")
    assert winding["tap_turn"] == str(expected) and f"tapped at turn {expected}" in winding["description"]
    card = card_files(fields)["card-osc.html"]
    assert f"at turn {expected} of 20" in card and f"tap, turn {expected}" in card


def test_tap_beyond_the_winding_rules_the_stock_out():
    """A tap at turn 25 of a 20-turn winding cannot be: that stock is not used, and the reason says why."""
    result = plan_kit(parse_plan(coil("osc", 1, "8uH", "tap_turns = 25\n") + toroid("ring", 1, "20nH") + REEL))
    assert not result.placements
    assert "the tap at turn 25 needs more than the 20 turns" in result.unplaced[0]


# --- the wire on the reels ------------------------------------------------------------------------


def test_short_reel_sends_the_second_coil_to_the_other_wire():
    """Two coils whose cheapest wire is on a reel that holds one piece: one is cut from it, the other from the
    other wire's reel, and no reel gives more than it holds (hand reasoning on the pieces' lengths)."""
    probe = plan_kit(parse_plan(coil("osc", 2, "8uH") + toroid("ring", 2, "20nH") + REEL))
    piece = probe.placements[0].candidate.wire_length
    text = (coil("osc", 2, "8uH") + toroid("ring", 2, "20nH")
            + f'[[reel]]\nwire = "0.3mm"\nlength = "{1.5 * piece:.4f}m"\n'
            + '[[reel]]\nwire = "0.4mm"\nlength = "10m"\n')
    result = plan_kit(parse_plan(text))
    assert result.complete
    assert sorted(result.evaluation.wires[p.candidate.wire][0] for p in result.placements) == ["0.3mm", "0.4mm"]
    for reel in result.reels:
        assert reel["used_m"] <= reel["length_m"] + 1e-9
    assert [reel["pieces"] for reel in result.reels] == [1, 1]


def test_coils_left_for_want_of_wire_are_explained_with_the_shortfall():
    """Three coils, stock for three, wire for one: two are left out, the message says the reels ran out and the
    shortfall is the two pieces' length (the least wire to buy, by the program; hand reasoning)."""
    probe = plan_kit(parse_plan(coil("osc", 1, "8uH") + toroid("ring", 1, "20nH") + REEL))
    piece = probe.placements[0].candidate.wire_length
    text = (coil("osc", 3, "8uH") + toroid("ring", 3, "20nH")
            + f'[[reel]]\nwire = "0.3mm"\nlength = "{1.5 * piece:.4f}m"\n')
    result = plan_kit(parse_plan(text))
    assert sum(p.quantity for p in result.placements) == 1
    assert result.shortfall["0.3mm grade 1"] == pytest.approx(2 * piece, rel=1e-9)
    assert result.unplaced[0].startswith("coil 'osc' × 2: the reels run out of the wire it needs")
    assert "2 of toroid 'ring'" in result.unplaced[0]


# --- the cards draw every form to scale ---------------------------------------------------------


def _scale(svg: str) -> float:
    """px per mm, from the note under the drawing."""
    return float(re.search(r"1 mm = ([\d.]+) px", svg).group(1))


def _rects(root):
    return [element for element in root.iter() if element.tag.endswith("rect")]


@pytest.fixture(scope="module")
def mixed_cards():
    text = (coil("loop", 1, "40uH", 'tolerance = "10%"\nforms = ["rod"]\ntap_fraction = 0.1\n')
            + coil("choke", 1, "200uH", 'tolerance = "10%"\nforms = ["gapped"]\ntap_fraction = 0.5\n')
            + coil("rfc", 1, "1mH", 'tolerance = "10%"\nforms = ["multilayer"]\ntap_turns = 10\n')
            + rod("ferrite", 1) + gapped("e-core", 1, width="4mm") + bobbin("spool", 1)
            + '[[reel]]\nwire = "0.2mm"\nlength = "100m"\n' + REEL)
    result = plan_kit(parse_plan(text))
    fields = result_fields(result)
    cards = card_files(fields)
    return {p["coil"]: (p, cards[f"card-{p['coil']}.html"]) for p in fields["placements"]}


def _svg_of(card: str):
    svg = card[card.index("<svg"):card.index("</svg>") + 6]
    return svg, ET.fromstring(svg)


def _drawn_to_scale(card: str, fill: str, width_m: float, height_m: float) -> None:
    """The card's first rectangle of ``fill`` is ``width_m`` by ``height_m`` at the stated scale (to a pixel)."""
    svg, root = _svg_of(card)
    scale = _scale(svg)
    shape = next(r for r in _rects(root) if r.get("fill") == fill)
    assert float(shape.get("width")) == pytest.approx(width_m * 1e3 * scale, abs=1.0)
    assert float(shape.get("height")) == pytest.approx(height_m * 1e3 * scale, abs=1.0)


def test_rod_card_draws_the_rod_to_scale(mixed_cards):
    """The rod's rectangle is its length and diameter at the stated scale (to a pixel)."""
    p, card = mixed_cards["loop"]
    _drawn_to_scale(card, "#555", p["rod_length_m"], p["rod_diameter_m"])
    assert f"{p['turns']} turns" in card and "tap, turn" in card


def test_gapped_card_draws_the_window_and_layers_to_scale(mixed_cards):
    """The window is the bobbin's width by depth at the stated scale; one band per layer, a wire thick."""
    p, card = mixed_cards["choke"]
    svg, root = _svg_of(card)
    scale = _scale(svg)
    window = next(r for r in _rects(root) if r.get("stroke-dasharray"))
    assert float(window.get("height")) == pytest.approx(p["window_width_m"] * 1e3 * scale, abs=1.0)
    assert float(window.get("width")) == pytest.approx(p["window_depth_m"] * 1e3 * scale, abs=1.0)
    bands = [r for r in _rects(root) if r.get("fill") == "#b45f06"]
    assert len(bands) == p["layers"]
    assert float(bands[0].get("width")) == pytest.approx(p["wire_pitch_m"] * 1e3 * scale, abs=0.05)
    assert f"in layer {p['tap_layer']}" in card


def test_bobbin_card_draws_the_bobbin_to_scale(mixed_cards):
    """The bobbin's core is its width and diameter at the stated scale; the layers are drawn above and below."""
    p, card = mixed_cards["rfc"]
    _drawn_to_scale(card, "#eee", p["bobbin_width_m"], p["bobbin_diameter_m"])
    root = _svg_of(card)[1]
    assert len([r for r in _rects(root) if r.get("fill") == "#b45f06"]) == 2 * p["layers"]
    assert "tap, turn 10" in card


def test_reel_lengths_beyond_a_hundred_metres_are_read():
    """A reel of fine wire holds hundreds of metres: 300 m reads as 300 m (SI prefixes: 1 m = 1000 mm)."""
    plan = parse_plan(BASE + toroid("t", 1, "20nH") + '[[reel]]\nwire = "0.2mm"\nlength = "300m"\n'
                      + '[[reel]]\nwire = "0.3mm"\nlength = "2500mm"\n')
    assert [reel.length for reel in plan.reel] == [300.0, 2.5]


@pytest.mark.parametrize(("length", "fragment"), [
    ("200", "a reel length such as 250m"),
    ("0.5mm", "from 1 mm to 100 km"),
    ("2,5m", "decimal point"),
    ("30ft", "'ft' is not a unit of length"),
])
def test_bad_reel_length_names_the_reel(length, fragment):
    """A reel length that cannot be read is refused on its line, naming the reel and the field."""
    text = BASE + toroid("t", 1, "20nH") + f'[[reel]]\nwire = "0.2mm"\nlength = "{length}"\n'
    with pytest.raises(PlanFileError) as caught:
        parse_plan(text, "plan.toml")
    message = str(caught.value)
    assert message.startswith(f"plan.toml, line {_line(text, f'length = {chr(34)}{length}{chr(34)}')}: reel[1]: "
                              f"length: "), message
    assert fragment in message
