"""Every form command at its numerical edges, through CliRunner, with and without --json.

The edges: a target below what one turn gives; a target or a turn count beyond what fits;
length-to-diameter ratios near 1e-3 and 1e3; an operating frequency above the coil's
self-resonance; a reading at zero turns; very large and very small values within the units
the options read. Each must end in a clear answer: exit status 0, 1 (cannot be done) or 2
(bad input); never a traceback; on failure one line on stderr that says why; on success a
strict JSON document (no NaN or Infinity, the defined quantities finite) and a text report
with no ``nan`` or ``inf`` token and no number longer than a float can hold.

The expected exit status and the words looked for follow the physics, not this program:
one turn is the least a winding has; a coil is a capacitor above its self-resonance
(common practice, no source).
"""

import json
import math
import re

import pytest
from click.testing import CliRunner

from coilplan.cli import main

AIR = ("--wire", "0.5mm", "--former", "25mm")
MULTI = ("--wire", "0.3mm", "--former", "10mm", "--width", "8mm")
FLAT = ("--wire", "0.5mm", "--inner", "30mm", "--spacing", "0mm")
RING = ("--od", "12.7mm", "--id", "7.7mm", "--height", "4.8mm", "--wire", "0.3mm")
GAPPED = ("--ae", "50mm2", "--le", "45mm", "--mu", "2000", "--wire", "0.5mm")
ROD = ("--rod-length", "100mm", "--rod-diameter", "10mm", "--mu", "125", "--wire", "0.3mm")

SINGLE_TURN = "single turn"
REACH = "this coil can reach"
ZERO_TURNS = "a whole number of at least 1"

# (id, arguments, exit status, words in the error line or, on success, in the text report)
CASES = [
    # a target below what a single turn gives
    ("solenoid-below-one-turn", ("solenoid", *AIR, "--target", "1nH"), 1, SINGLE_TURN),
    ("solenoid-femtohenry", ("solenoid", *AIR, "--target", "1fH"), 1, SINGLE_TURN),
    ("multilayer-below-one-turn", ("multilayer", *MULTI, "--target", "1pH"), 1, SINGLE_TURN),
    ("spiral-below-one-turn", ("spiral", *FLAT, "--target", "1pH"), 1, SINGLE_TURN),
    ("toroid-below-one-turn", ("toroid", *RING, "--al", "20nH", "--target", "1nH"), 1, SINGLE_TURN),
    ("gapped-below-one-turn", ("gapped", *GAPPED, "--gap", "0.5mm", "--target", "1pH"), 1, SINGLE_TURN),
    ("gapped-gap-for-a-tiny-target", ("gapped", *GAPPED, "--turns", "10", "--target", "1pH"), 1, "gap"),
    ("rod-below-one-turn", ("rod", *ROD, "--target", "1pH"), 1, SINGLE_TURN),
    ("rewind-below-one-turn", ("rewind", "--measured", "55uH@20", "--target", "1nH"), 1, SINGLE_TURN),
    ("rewind-femtohenry", ("rewind", "--measured", "55uH@20", "--target", "1fH"), 1, SINGLE_TURN),
    ("tank-resonance-too-high-for-one-turn",
     ("solenoid", *AIR, "--target-frequency", "100MHz", "--capacitance", "100pF"), 1, SINGLE_TURN),
    # a target, or a turn count, beyond what fits
    ("solenoid-former-full", ("solenoid", *AIR, "--max-length", "20mm", "--target", "100uH"), 1, REACH),
    ("solenoid-length-full", ("solenoid", "--wire", "0.5mm", "--diameter", "1000mm", "--length", "1mm",
                              "--turns", "2"), 1, "do not fit"),
    ("multilayer-window-full", ("multilayer", *MULTI, "--max-depth", "2mm", "--target", "10mH"), 1, REACH),
    ("spiral-outer-full", ("spiral", "--wire", "0.5mm", "--inner", "30mm", "--outer", "40mm", "--target", "100uH"),
     1, REACH),
    ("toroid-one-layer-full", ("toroid", *RING, "--al", "20nH", "--target", "1H"), 1, REACH),
    ("toroid-window-full", ("toroid", *RING, "--al", "20nH", "--layers", "many", "--target", "1H"), 1, REACH),
    ("toroid-too-many-turns", ("toroid", *RING, "--al", "20nH", "--turns", "1000"), 1, "do not fit"),
    ("gapped-window-full", ("gapped", *GAPPED, "--gap", "0.5mm", "--window-width", "10mm", "--window-depth", "5mm",
                            "--target", "10H"), 1, REACH),
    ("gapped-al-above-the-core", ("gapped", *GAPPED, "--turns", "1", "--target", "1H"), 1, "ungapped"),
    ("rod-full", ("rod", *ROD, "--target", "10H"), 1, REACH),
    ("rod-short-former-full", ("rod", *ROD, "--max-length", "20mm", "--target", "1mH"), 1, REACH),
    ("toroid-femtohenry-al", ("toroid", *RING, "--al", "1fH", "--target", "1uH"), 1, REACH),
    ("rewind-offset-flat", ("rewind", "--measured", "55uH@20", "--measured", "55uH@21", "--offset",
                            "--target", "100uH"), 1, REACH),
    ("tank-band-not-covered", ("tank", "--band", "530kHz:1700kHz", "--capacitor", "10pF:365pF", "--padder", "10pF"),
     1, "not all of"),
    # length to diameter near 1e3 and 1e-3
    ("solenoid-long-thin", ("solenoid", "--wire", "0.5mm", "--diameter", "1mm", "--length", "1000mm",
                            "--turns", "2"), 0, "1000.000"),
    ("solenoid-short-wide", ("solenoid", "--wire", "0.5mm", "--diameter", "1000mm", "--length", "1mm",
                             "--turns", "1"), 0, "0.001"),
    ("solenoid-one-turn-wide", ("solenoid", "--wire", "0.5mm", "--diameter", "500mm", "--turns", "1"), 0, "1 turn"),
    ("multilayer-long-thin", ("multilayer", "--wire", "0.3mm", "--former", "0.01mm", "--width", "10m",
                              "--turns", "5"), 0, "5 turns"),
    ("multilayer-short-wide", ("multilayer", "--wire", "0.3mm", "--former", "10m", "--width", "0.4mm",
                               "--turns", "5"), 0, "5 turns"),
    ("spiral-tiny-hole", ("spiral", "--wire", "0.5mm", "--inner", "0.01mm", "--spacing", "0mm", "--turns", "3"),
     0, "3 turns"),
    ("spiral-huge-hole", ("spiral", "--wire", "0.5mm", "--inner", "10m", "--spacing", "0mm", "--turns", "3"),
     0, "3 turns"),
    ("toroid-flat-wide-ring", ("toroid", "--od", "1000mm", "--id", "999mm", "--height", "0.01mm", "--mu", "1",
                               "--wire", "0.3mm", "--turns", "3"), 0, "3 turns"),
    ("toroid-tall-thin-ring", ("toroid", "--od", "1.1mm", "--id", "1mm", "--height", "1000mm", "--mu", "1",
                               "--wire", "0.3mm", "--turns", "3"), 0, "3 turns"),
    ("gapped-thin-long-path", ("gapped", "--ae", "1e-12m2", "--le", "1000mm", "--gap", "0.5mm", "--mu", "2000",
                               "--wire", "0.5mm", "--turns", "3"), 0, "3 turns"),
    ("rod-long-thin", ("rod", "--rod-length", "1000mm", "--rod-diameter", "1mm", "--mu", "125", "--wire", "0.3mm",
                       "--turns", "10"), 0, "10 turns"),
    ("rod-short-wide", ("rod", "--rod-length", "1mm", "--rod-diameter", "1000mm", "--mu", "125", "--wire", "0.3mm",
                        "--turns", "1"), 0, "1 turn"),
    ("rod-disc", ("rod", "--rod-length", "0.1mm", "--rod-diameter", "100mm", "--mu", "125", "--wire", "0.01mm",
                  "--turns", "1"), 0, "1 turn"),
    # an operating frequency above the self-resonance
    ("solenoid-above-srf", ("solenoid", *AIR, "--turns", "100", "--at", "1GHz"), 0, "above self-resonance"),
    ("solenoid-far-above-srf", ("solenoid", *AIR, "--turns", "10", "--at", "100GHz"), 0, "above self-resonance"),
    ("multilayer-above-srf", ("multilayer", *MULTI, "--turns", "200", "--at", "1GHz"), 0, "above self-resonance"),
    ("multilayer-target-above-srf", ("multilayer", *MULTI, "--target", "100uH", "--at", "100MHz"), 1,
     "resonates by itself"),
    ("spiral-above-srf", ("spiral", *FLAT, "--turns", "20", "--at", "10GHz"), 0, "above self-resonance"),
    ("toroid-above-srf", ("toroid", *RING, "--al", "20nH", "--turns", "20", "--at", "10GHz", "--ac-voltage", "1V"),
     0, "above self-resonance"),
    ("toroid-target-above-srf", ("toroid", *RING, "--al", "20nH", "--target", "10uH", "--at", "1GHz",
                                 "--self-capacitance", "5pF"), 1, "resonates by itself"),
    ("rod-above-srf", ("rod", *ROD, "--turns", "30", "--at", "10GHz", "--ac-voltage", "1V"), 0,
     "above self-resonance"),
    # a reading at zero turns
    *[(f"{command}-reading-at-zero-turns", (command, *options, "--target", "10uH", "--measured", "1uH@0"), 2,
       f"--measured: expected a measurement inductance@turns such as 120uH@36 ({ZERO_TURNS})")
      for command, options in [("solenoid", AIR), ("multilayer", MULTI), ("spiral", FLAT),
                               ("toroid", (*RING, "--al", "20nH")), ("toroid", RING),
                               ("gapped", (*GAPPED, "--gap", "0.5mm")), ("rod", ROD), ("rewind", ())]],
    ("rewind-second-reading-at-zero", ("rewind", "--measured", "1uH@1", "--measured", "1uH@0", "--target", "10uH"),
     2, ZERO_TURNS),
    ("count-turns-test-winding-at-zero", ("count-turns", "--test-winding", "1uH@0", "--unknown", "1mH"), 2,
     "--test-winding"),
    ("count-turns-zero-added", ("count-turns", "--before", "1mH", "--after", "1.1mH", "--added", "0"), 2,
     "other than 0"),
    ("count-turns-zero-removed", ("count-turns", "--before", "1mH", "--after", "1.1mH", "--removed", "0"), 2,
     "--removed"),
    ("solenoid-zero-turns", ("solenoid", *AIR, "--turns", "0"), 2, "--turns"),
    ("solenoid-zero-inductance-reading", ("solenoid", *AIR, "--target", "10uH", "--measured", "0uH@10"), 2,
     "above zero"),
    # very large and very small values, within the units the options read
    ("solenoid-milliherz", ("solenoid", *AIR, "--turns", "10", "--at", "1mHz"), 0, "10 turns"),
    ("solenoid-micrometre-former", ("solenoid", "--wire", "0.5mm", "--former", "1um", "--turns", "3"), 0,
     "3 turns"),
    ("solenoid-hot", ("solenoid", *AIR, "--target", "10uH", "--temperature", "1000C"), 0, "1000"),
    ("solenoid-below-absolute-zero", ("solenoid", *AIR, "--target", "10uH", "--temperature", "-300C"), 2,
     "absolute zero"),
    ("solenoid-reading-kilohenry", ("solenoid", *AIR, "--target", "10uH", "--measured", "1kH@10"), 1, SINGLE_TURN),
    # a former thinner than any length the tool reads (1 µm .. 100 m) is refused where it is typed
    ("solenoid-former-too-thin", ("solenoid", "--wire", "0.5mm", "--former", "1e-300m", "--turns", "3"), 2,
     "--former"),
    ("solenoid-turns-not-whole", ("solenoid", *AIR, "--turns", "1e9"), 2, "--turns"),
    ("toroid-henry-al", ("toroid", *RING, "--al", "1H", "--turns", "3"), 0, "9.000 H"),  # L = AL·N²
    ("toroid-kiloampere", ("toroid", *RING, "--mu", "100", "--turns", "3", "--current", "1kA", "--bsat", "0.3T"),
     0, "3 turns"),
    ("gapped-kiloampere", ("gapped", *GAPPED, "--gap", "0.5mm", "--turns", "3", "--current", "1kA", "--bsat",
                           "0.3T"), 0, "3 turns"),
    ("gapped-choke-microampere", ("gapped", *GAPPED, "--target", "1mH", "--current", "1uA", "--bsat", "0.3T"), 0,
     "1.000 mH"),
    ("gapped-gap-far-too-long", ("gapped", *GAPPED, "--gap", "1000mm", "--turns", "3"), 2, "--gap"),
    ("rewind-kilohenry", ("rewind", "--measured", "55uH@20", "--target", "1kH"), 0, "1.000 kH"),
    ("rewind-femtohenry-reading", ("rewind", "--measured", "1fH@20", "--target", "1uH"), 0, "632456 turns"),
    ("rewind-reading-kilohenry", ("rewind", "--measured", "1kH@20", "--target", "1uH"), 1, SINGLE_TURN),
    ("rewind-million-turns", ("rewind", "--measured", "55uH@1000000", "--target", "100uH"), 0, "turns"),
    ("rewind-tight-tolerance", ("rewind", "--measured", "55uH@20", "--target", "100uH", "--tolerance", "0.0001%"),
     0, "27 turns"),
    ("rewind-loose-tolerance", ("rewind", "--measured", "55uH@20", "--target", "100uH", "--tolerance", "99%"), 2,
     "--tolerance"),
    ("count-turns-tiny-rise", ("count-turns", "--before", "1mH", "--after", "1.0000001mH", "--added", "5"), 0,
     "or more"),
    ("count-turns-no-rise", ("count-turns", "--before", "1mH", "--after", "1mH", "--added", "5"), 1,
     "did not rise"),
    ("count-turns-million-removed", ("count-turns", "--before", "1mH", "--after", "0.5mH", "--removed", "1000000"),
     0, "turns"),
    ("count-turns-leads-above-reading", ("count-turns", "--resistance", "1ohm", "--wire", "0.3mm",
                                         "--turn-length", "30mm", "--lead-resistance", "2ohm"), 2,
     "--lead-resistance"),
    # added turns: N = n / (sqrt(L_after / L_before) - 1); test winding: N = n·sqrt(L / L_test) (L = AL·N²)
    ("count-turns-femtohenry", ("count-turns", "--before", "1fH", "--after", "2fH", "--added", "5"), 0, "12 turns"),
    ("count-turns-kilohenry", ("count-turns", "--before", "1kH", "--after", "1.1kH", "--added", "5"), 0,
     "102 turns"),
    ("count-turns-femtohenry-test-winding", ("count-turns", "--test-winding", "1fH@10", "--unknown", "1pH"), 0,
     "316 turns"),
    ("count-turns-kiloohm", ("count-turns", "--resistance", "1kohm", "--wire", "0.3mm", "--turn-length", "30mm"),
     0, "turns"),
    # f = 1/(2π·sqrt(L·C)): 1 kH with 1 F is 5.033 mHz, 1 fF at 1 GHz needs 25.33 µH (hand-worked)
    ("tank-femto", ("tank", "--inductance", "1fH", "--capacitance", "1fF"), 0, "GHz"),
    ("tank-kilohenry-farad", ("tank", "--inductance", "1kH", "--capacitance", "1F"), 0, "5.033 mHz"),
    ("tank-femtofarad-gigahertz", ("tank", "--capacitance", "1fF", "--frequency", "1GHz"), 0, "25.33 μH"),
    ("tank-femtohenry-band", ("tank", "--inductance", "1fH", "--capacitor", "10pF:365pF"), 0, "GHz"),
    ("tank-band-of-six-decades", ("tank", "--band", "1kHz:1GHz", "--capacitor", "10pF:365pF"), 1, "not all of"),
    ("tank-femtofarad-resonances", ("tank", "--resonance", "1fF@1GHz", "--resonance", "2fF@0.8GHz"), 0,
     "resonances"),
    ("tank-one-pair-twice", ("tank", "--resonance", "100pF@1MHz", "--resonance", "100pF@1MHz"), 2, "--resonance"),
    ("tank-frequency-rising-with-c", ("tank", "--resonance", "100pF@1MHz", "--resonance", "200pF@1.1MHz"), 2,
     "--resonance"),
    ("tank-all-three", ("tank", "--inductance", "10uH", "--capacitance", "100pF", "--frequency", "1MHz"), 2,
     "not all three"),
    ("tank-empty-band", ("tank", "--band", "530kHz:530kHz", "--capacitor", "10pF:365pF"), 2, "--band"),
    # absurd magnitudes are slips, refused where typed, with the range (issue 8); the bounds are a bench
    # tool's outer limits (common practice, no source), the ranges named in coilplan.quantities
    ("solenoid-target-1e300", ("solenoid", *AIR, "--target", "1e300H"), 2, "--target: expected an inductance"),
    ("solenoid-target-range-named", ("solenoid", *AIR, "--target", "1e300H"), 2, "from 1 fH to 100 kH"),
    ("solenoid-wire-1e-300", ("solenoid", "--wire", "1e-300m", "--former", "25mm", "--turns", "3"), 2, "--wire"),
    ("solenoid-former-1e300", ("solenoid", "--wire", "0.5mm", "--former", "1e300m", "--turns", "3"), 2,
     "--former"),
    ("solenoid-target-frequency-1e300", ("solenoid", *AIR, "--target-frequency", "1e300Hz", "--capacitance",
                                         "100pF"), 2, "--target-frequency"),
    ("solenoid-permittivity-1e300", ("solenoid", *AIR, "--turns", "10", "--former-permittivity", "1e300"), 2,
     "--former-permittivity"),
    ("multilayer-former-1e300", ("multilayer", "--wire", "0.3mm", "--former", "1e300m", "--width", "8mm",
                                 "--turns", "3"), 2, "--former"),
    ("spiral-spacing-1e300", ("spiral", "--wire", "0.5mm", "--inner", "30mm", "--spacing", "1e300m", "--turns", "3"),
     2, "--spacing"),
    ("toroid-height-1e300", ("toroid", "--od", "12.7mm", "--id", "7.7mm", "--height", "1e300m", "--wire", "0.3mm",
                             "--mu", "100", "--turns", "3"), 2, "--height"),
    ("toroid-al-1e300", ("toroid", *RING, "--al", "1e300H", "--turns", "3"), 2, "--al"),
    ("toroid-current-1e300", ("toroid", *RING, "--mu", "100", "--turns", "3", "--current", "1e300A", "--bsat",
                              "0.3T"), 2, "--current"),
    ("gapped-current-1e300", ("gapped", *GAPPED, "--gap", "0.5mm", "--turns", "3", "--current", "1e300A", "--bsat",
                              "0.3T"), 2, "--current"),
    ("rod-coil-length-1e300", ("rod", *ROD, "--turns", "10", "--coil-length", "1e300m"), 2, "--coil-length"),
    ("rod-length-1e300", ("rod", "--rod-length", "1e300m", "--rod-diameter", "10mm", "--mu", "125", "--wire",
                          "0.3mm", "--turns", "10"), 2, "--rod-length"),
    ("rod-position-1e300", ("rod", *ROD, "--turns", "10", "--position", "1e300m"), 2, "--position"),
    ("tank-inductance-1e-300", ("tank", "--inductance", "1e-300H", "--capacitance", "100pF"), 2, "--inductance"),
    ("tank-q-1e300", ("tank", "--inductance", "10uH", "--capacitance", "100pF", "--q", "1e300", "--power", "5W"),
     2, "--q"),
    ("tank-power-1e300", ("tank", "--inductance", "10uH", "--capacitance", "100pF", "--q", "100", "--power",
                          "1e300W"), 2, "--power"),
    ("tank-band-1e300", ("tank", "--band", "1e-300Hz:1e300Hz", "--capacitor", "10pF:365pF"), 2, "--band"),
    ("count-turns-unknown-1e300", ("count-turns", "--test-winding", "1uH@10", "--unknown", "1e300H"), 2,
     "--unknown"),
    ("count-turns-after-1e300", ("count-turns", "--before", "1mH", "--after", "1e300H", "--added", "5"), 2,
     "--after"),
    # the largest values the options read still give finite, readable answers
    ("tank-band-fourteen-decades", ("tank", "--band", "1mHz:100GHz", "--capacitor", "10pF:365pF"), 1,
     "not all of"),
    ("rod-coil-far-off-the-rod", ("rod", *ROD, "--turns", "10", "--position", "100m"), 0, "10 turns"),
    ("rod-hundred-metres", ("rod", "--rod-length", "100m", "--rod-diameter", "10mm", "--mu", "125", "--wire",
                            "0.3mm", "--turns", "10"), 0, "10 turns"),
    ("rod-shorter-than-a-wire", ("rod", "--rod-length", "1um", "--rod-diameter", "100m", "--mu", "125", "--wire",
                                 "0.01mm", "--turns", "10"), 2, "--rod-length"),
    ("tank-tune-at-the-top", ("solenoid", *AIR, "--target-frequency", "100GHz", "--capacitance", "1F"), 1,
     SINGLE_TURN),
    ("solenoid-counts-uncertain-beyond-themselves", ("solenoid", *AIR, "--target", "10uH", "--measured", "5uH@10",
                                                     "--turns-uncertainty", "1000"), 2, "--turns-uncertainty"),
    ("spiral-counts-uncertain-beyond-themselves", ("spiral", *FLAT, "--target", "10uH", "--measured", "5uH@10",
                                                   "--turns-uncertainty", "10"), 2, "--turns-uncertainty"),
    # a reading at more turns than the former can hold is not of this coil: a 100 m winding is the longest
    # planned on a former of unstated length (0.5353 mm pitch: 186821 turns)
    ("solenoid-reading-beyond-any-former", ("solenoid", *AIR, "--target", "10uH", "--measured", "1uH@1000000"), 2,
     "--measured"),
    ("solenoid-reading-beyond-the-former", ("solenoid", *AIR, "--max-length", "20mm", "--target", "10uH",
                                            "--measured", "1uH@100"), 2, "at most 37"),
    ("multilayer-reading-beyond-the-sum", ("multilayer", *MULTI, "--target", "10uH", "--measured", "1uH@6000"), 2,
     "--measured"),
    # readings that give less than one turn: a winding has at least one (issue 8)
    ("count-turns-rise-too-large", ("count-turns", "--before", "1mH", "--after", "100kH", "--added", "5"), 1,
     "less than the one turn"),
    ("count-turns-resistance-below-a-turn", ("count-turns", "--resistance", "1mohm", "--wire", "0.3mm",
                                             "--turn-length", "30mm"), 1, "less than the one turn"),
    ("count-turns-test-winding-below-a-turn", ("count-turns", "--test-winding", "1uH@10", "--unknown", "1pH"), 1,
     "less than the one turn"),
    # unreachable targets refused quickly (tests/benchmarks/test_bench_edges.py times them)
    ("solenoid-kilohenry", ("solenoid", *AIR, "--target", "1kH"), 1, "100.0 m winding"),
    ("solenoid-kilohenry-filament", ("solenoid", *AIR, "--target", "1kH", "--method", "filament"), 1, REACH),
    ("solenoid-millihertz-farad", ("solenoid", *AIR, "--target-frequency", "1mHz", "--capacitance", "1F"), 1, REACH),
    ("multilayer-kilohenry-wheeler", ("multilayer", *MULTI, "--target", "1kH", "--method", "wheeler-1928"), 1,
     REACH),
    ("spiral-hundred-thousand-turns", ("spiral", *FLAT, "--turns", "100000"), 1, "do not fit"),
    ("rod-target-at-100MHz-with-100pF", ("rod", *ROD, "--target", "10uH", "--at", "100MHz", "--self-capacitance",
                                         "100pF"), 1, "resonates by itself"),
    # zero where the help promises it (a gap of 0 between touching enamelled turns) needs no unit
    ("spiral-touching-turns-bare-zero", ("spiral", "--wire", "0.5mm", "--inner", "30mm", "--spacing", "0",
                                         "--turns", "3"), 0, "3 turns"),
    # two turns over a metre are not a coil: Knight's self-capacitance is out of its range and says so
    ("solenoid-two-turns-over-a-metre", ("solenoid", "--wire", "0.5mm", "--diameter", "1mm", "--length", "1000mm",
                                         "--turns", "2"), 0, "pitch angle is 90°"),
]

NON_FINITE = re.compile(r"(?<![A-Za-z])(nan|inf|infinity)(?![A-Za-z])", re.IGNORECASE)
TOO_MANY_DIGITS = re.compile(r"\d{17,}")  # more than a double's 17 significant digits: not a readable answer
DEFINED = ("inductance_H", "turns", "turns_exact", "turns_range", "wire_length_m", "dc_resistance_ohm", "al_H")


def run(*args):
    result = CliRunner().invoke(main, list(args))
    assert "Traceback" not in result.stdout + result.stderr
    assert result.exception is None or isinstance(result.exception, SystemExit), repr(result.exception)
    assert result.exit_code in (0, 1, 2), result.exit_code
    assert "internal error" not in result.stderr, result.stderr
    return result


def strict(text: str) -> dict:
    def refuse(constant):
        raise ValueError(f"{constant} in the JSON")

    return json.loads(text, parse_constant=refuse)


def finite_numbers(value, where="result"):
    """Every number in the document is finite (json.loads gives floats for 1e999 too)."""
    if isinstance(value, dict):
        for key, item in value.items():
            finite_numbers(item, f"{where}.{key}")
    elif isinstance(value, list):
        for index, item in enumerate(value):
            finite_numbers(item, f"{where}[{index}]")
    elif isinstance(value, float):
        assert math.isfinite(value), where


def defined(result: dict) -> None:
    """The answer's own quantities are there: a null inductance or turn count is a NaN in disguise."""
    for key in DEFINED:
        if key in result:
            value = result[key]
            assert value is not None, key
            assert not isinstance(value, list) or value[0] is not None, key  # [n, null]: n or more
    if "inductance_H" in result:
        assert result["inductance_H"] > 0
    if isinstance(result.get("turns"), int):
        assert result["turns"] >= 1


@pytest.mark.parametrize(("arguments", "code", "words"), [case[1:] for case in CASES],
                         ids=[case[0] for case in CASES])
def test_edge_gets_a_clear_answer(arguments, code, words):
    """The exit status the physics calls for, one clear line on failure, strict JSON and clean text on success."""
    as_json, as_text = run(*arguments, "--json"), run(*arguments)
    assert as_json.exit_code == as_text.exit_code == code, as_json.stdout + as_json.stderr
    for result in (as_json, as_text):
        assert not NON_FINITE.search(result.stdout + result.stderr), result.stdout + result.stderr
    words_shown = as_text.stdout + as_text.stderr + as_json.stderr  # the JSON's own floats are repr()s
    assert not TOO_MANY_DIGITS.search(words_shown), words_shown
    if code:
        for result in (as_json, as_text):
            assert result.stderr.startswith("coilplan: error: "), result.stderr
            assert result.stderr.count("\n") == 1, result.stderr
            assert words in result.stderr, (words, result.stderr)
        return
    assert as_json.stderr == as_text.stderr == ""
    document = strict(as_json.stdout)
    assert document["command"] == arguments[0]
    finite_numbers(document)
    defined(document["result"])
    assert words in as_text.stdout, (words, as_text.stdout)


def test_plot_without_a_self_resonance_is_refused():
    """A sweep with no finite self-resonance (a winding with no self-capacitance estimate gives SRF = ∞ and
    frequencies of NaN) is refused naming the plot, not drawn with an 'inf MHz' label."""
    from coilplan.errors import InvalidInputError
    from coilplan.report.plot import impedance_plot

    nothing = [math.nan] * 4
    sweep = {"frequency_Hz": nothing, "impedance_ohm": nothing, "q": nothing, "srf_Hz": math.inf}
    with pytest.raises(InvalidInputError, match=r"^plot: expected a coil whose self-resonance is known"):
        impedance_plot(sweep=sweep, operating_frequency=1e6, fmt="svg")
