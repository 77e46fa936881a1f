"""`coilplan kit PLAN` through CliRunner: the summary, the files under --out, --force, and one-line errors."""

import csv
import json
import pathlib

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main

EXAMPLE = pathlib.Path(__file__).resolve().parents[2] / "examples" / "kit_classroom.toml"

SMALL = """
[[coil]]
name = "bfo"
count = 2
target = "8uH"

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


def run(*args):
    result = CliRunner().invoke(main, [str(arg) for arg in args])
    assert "Traceback" not in result.stdout + result.stderr
    return result


def one_line_error(result, code, *fragments):
    assert result.exit_code == code, result.stdout + result.stderr
    assert result.stderr.count("\n") == 1, result.stderr
    for fragment in fragments:
        assert fragment in result.stderr, (fragment, result.stderr)


@pytest.fixture
def plan(tmp_path):
    path = tmp_path / "plan.toml"
    path.write_text(SMALL, encoding="utf-8")
    return path


def test_plan_prints_the_summary(plan):
    """A plan that can be done prints its table and exits 0: 8 µH on 20 nH per turn² is 20 turns (L = AL·N²)."""
    result = run("kit", plan)
    assert result.exit_code == 0, result.stderr
    assert result.stdout.startswith(f"Kit plan {plan}: 2 of 2 coils placed")
    row = next(line for line in result.stdout.splitlines() if line.strip().startswith("bfo"))
    assert row.split()[1:5] == ["2", "toroid", "'ring'", "20"]


def test_out_writes_readable_files(plan, tmp_path):
    """--out writes plan.json (JSON), bom.csv (CSV) and a card per coil type that holds its turns."""
    out = tmp_path / "kit"
    result = run("kit", plan, "--out", out)
    assert result.exit_code == 0, result.stderr
    assert sorted(path.name for path in out.iterdir()) == ["bom.csv", "card-bfo.html", "plan.json"]
    document = json.loads((out / "plan.json").read_text(encoding="utf-8"))
    assert document["result"]["placements"][0]["turns"] == 20
    with (out / "bom.csv").open(encoding="utf-8", newline="") as handle:
        rows = list(csv.DictReader(handle))
    assert {row["section"] for row in rows} == {"stock", "wire", "winding", "coil"}
    winding = next(row for row in rows if row["section"] == "winding")
    assert winding["turns"] == "20" and winding["tap_turn"] == ""
    assert "20 turns" in (out / "card-bfo.html").read_text(encoding="utf-8")


def test_never_overwrites_without_force(plan, tmp_path):
    """A second run into the same folder is refused (exit 2) and leaves every file byte-identical; --force replaces."""
    out = tmp_path / "kit"
    assert run("kit", plan, "--out", out).exit_code == 0
    (out / "plan.json").write_bytes(b"kept by the user\n")
    before = {path.name: path.read_bytes() for path in out.iterdir()}
    result = run("kit", plan, "--out", out)
    one_line_error(result, 2, "--out", "--force", "plan.json")
    assert {path.name: path.read_bytes() for path in out.iterdir()} == before
    assert run("kit", plan, "--out", out, "--force").exit_code == 0
    assert json.loads((out / "plan.json").read_text(encoding="utf-8"))["command"] == "kit"


def test_json_is_one_document(plan):
    """--json prints the plan as one JSON object of the shared shape."""
    result = run("kit", plan, "--json")
    assert result.exit_code == 0, result.stderr
    document = flat_document(json.loads(result.stdout))
    assert list(document) == ["schema", "command", "inputs", "result", "warnings", "cautions"]
    assert document["result"]["complete"] is True


def test_malformed_plan_is_one_line_exit_2(plan):
    """A wrong unit in the plan: one line naming the file, line, entry and field; exit 2."""
    plan.write_text(SMALL.replace('target = "8uH"', 'target = "8uF"'), encoding="utf-8")
    one_line_error(run("kit", plan), 2, f"{plan}, line 5", "coil[1] 'bfo'", "target:")


def test_missing_plan_is_exit_2(tmp_path):
    """No plan file at the path: one line, exit 2."""
    one_line_error(run("kit", tmp_path / "nothing.toml"), 2, "no plan file there")


def test_infeasible_plan_is_explained_exit_1(plan):
    """More coils than cores: the plan is printed, and one line names the coil, the count and why; exit 1."""
    plan.write_text(SMALL.replace("count = 2", "count = 5"), encoding="utf-8")
    result = run("kit", plan)
    one_line_error(result, 1, "cannot be done", "coil 'bfo' × 2")
    assert "not done:" in result.stdout


def test_the_example_plan_runs(tmp_path):
    """The classroom example is complete: every coil placed, exit 0."""
    result = run("kit", EXAMPLE, "--out", tmp_path / "cards")
    assert result.exit_code == 0, result.stderr
    assert "72 of 72 coils placed" in result.stdout
    cards = sorted(path.name for path in (tmp_path / "cards").iterdir())
    assert "card-mw-aerial.html" in cards and "bom.csv" in cards


def _large_plan() -> str:
    """60 coil types against 40 ring cores: over the 2000 pairs from which the progress bar shows."""
    parts = [f'[[coil]]\nname = "c{k}"\ncount = 1\ntarget = "{1 + k / 4:.2f}uH"\ntolerance = "20%"\n'
             for k in range(60)]
    parts += [f'[[toroid]]\nname = "t{k}"\nod = "12.7mm"\nid = "7.7mm"\nheight = "4.8mm"\nal = "{5 + k}nH"\ncount = 2\n'
              for k in range(40)]
    return "".join(parts) + '[[reel]]\nwire = "0.3mm"\nlength = "100m"\n'


def test_large_plan_shows_progress_on_stderr_only(tmp_path):
    """A plan of more than a moment's work shows the progress label on stderr; --json prints nothing there."""
    path = tmp_path / "large.toml"
    path.write_text(_large_plan(), encoding="utf-8")
    result = run("kit", path)
    assert result.exit_code == 0, result.stderr
    assert "trying every coil on every stock item" in result.stderr
    assert result.stdout.startswith(f"Kit plan {path}: 60 of 60 coils placed")
    quiet = run("kit", path, "--json")
    assert quiet.exit_code == 0 and quiet.stderr == ""
    assert flat_document(json.loads(quiet.stdout))["result"]["coils_placed"] == 60


MIXED = """
[[coil]]
name = "loop"
count = 1
target = "40uH"
tolerance = "10%"
tap_fraction = 0.1
forms = ["rod"]

[[coil]]
name = "choke"
count = 1
target = "200uH"
tolerance = "10%"
forms = ["gapped"]

[[coil]]
name = "rfc"
count = 1
target = "1mH"
tolerance = "10%"
forms = ["multilayer"]

[[rod]]
name = "ferrite"
length = "100mm"
diameter = "10mm"
material = "nizn-125"
count = 1

[[gapped]]
name = "e-core"
ae = "40mm2"
le = "45mm"
gap = "0.3mm"
mu = 2000
window_width = "10mm"
window_depth = "5mm"
count = 1

[[bobbin]]
name = "spool"
diameter = "6mm"
width = "8mm"
depth = "6mm"
count = 1

[[reel]]
wire = "0.2mm"
length = "150m"
"""


def test_every_stock_kind_gets_its_card(tmp_path):
    """A rod, a gapped core and a bobbin: each coil placed, each card written with its drawing; exit 0."""
    path = tmp_path / "mixed.toml"
    path.write_text(MIXED, encoding="utf-8")
    out = tmp_path / "cards"
    result = run("kit", path, "--out", out)
    assert result.exit_code == 0, result.stderr
    assert "3 of 3 coils placed" in result.stdout
    for name, drawn in (("loop", "rod 100.0 mm long"), ("choke", "centre leg"), ("rfc", "between the cheeks")):
        card = (out / f"card-{name}.html").read_text(encoding="utf-8")
        assert "<svg" in card and drawn in card, name


def test_malformed_rod_is_one_line_exit_2(tmp_path):
    """A rod given both a material and a permeability: one line naming the file, the line, the entry and the field."""
    path = tmp_path / "mixed.toml"
    path.write_text(MIXED.replace('material = "nizn-125"', 'material = "nizn-125"\nmu = 125'), encoding="utf-8")
    line = MIXED.replace('material = "nizn-125"', 'material = "nizn-125"\nmu = 125').splitlines().index("mu = 125") + 1
    one_line_error(run("kit", path), 2, f"{path}, line {line}", "rod[1] 'ferrite'", "mu:")


CORED = """
[[coil]]
name = "tuned"
count = 1
target = "10uH"
at = "14MHz"
tolerance = "5%"

[[toroid]]
name = "ring"
od = "12.7mm"
id = "7.7mm"
height = "4.8mm"
material = "nizn-125"
count = 1

[[reel]]
wire = "26awg"
length = "10m"
"""


def test_a_cored_coil_in_a_kit_has_the_core_loss_and_drift_the_form_command_gives(tmp_path):
    """The kit's batch figures for a ring of a named class at 14 MHz match `coilplan toroid --material --at`
    (one code path batched, the other per coil): the Q counts the core's loss, the L its permeability there."""
    plan = tmp_path / "plan.toml"
    plan.write_text(CORED, encoding="utf-8")
    result = run("kit", plan, "--out", tmp_path / "out")
    assert result.exit_code == 0, result.stderr
    placed = json.loads((tmp_path / "out" / "plan.json").read_text(encoding="utf-8"))["result"]["placements"][0]
    single = flat_document(json.loads(run("toroid", "--od", "12.7mm", "--id", "7.7mm", "--height", "4.8mm",
                                          "--material", "nizn-125", "--wire", "26awg", "--turns", placed["turns"],
                                          "--at", "14MHz", "--json").stdout))["result"]
    # the kit winds by hand (the packing and lead settings change the copper a little), the core is the same
    assert placed["q"] == pytest.approx(single["q"], rel=1e-2)
    assert placed["q"] < 0.5 * single["copper_q"]  # the core's loss dominates at 14 MHz
    assert placed["core_q"] == pytest.approx(single["core_q"], rel=1e-3)
    assert placed["apparent_inductance_H"] == pytest.approx(single["apparent_inductance_H"], rel=1e-3)
    # the batched evaluation that ranks the windings (the assignment's Q level) gives the same Q and apparent L
    from coilplan.kit.assign import plan_kit
    from coilplan.kit.plan_file import parse_plan

    candidate = plan_kit(parse_plan(CORED)).placements[0].candidate
    assert candidate.q == pytest.approx(placed["q"], rel=2e-3)
    assert candidate.apparent_inductance == pytest.approx(placed["apparent_inductance_H"], rel=1e-5)  # small-R limit


ROD_READ_NEAR_RESONANCE = """
[settings]
meter_frequency = "100MHz"

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
measured = ["180uH@50"]
measured_wire = "0.2mm"

[[reel]]
wire = "0.2mm"
length = "20m"
"""


def test_a_rod_reading_near_self_resonance_names_the_plan_setting(tmp_path):
    """180 µH read at 100 MHz on a winding of about 1.2 pF is at 99 % of its self-resonance: refused, naming the
    plan's own setting (the kit has no --meter-freq option)."""
    plan = tmp_path / "plan.toml"
    plan.write_text(ROD_READ_NEAR_RESONANCE, encoding="utf-8")
    result = run("kit", plan)
    one_line_error(result, 2, "settings.meter_frequency", "self-resonance")
    assert "--meter-freq" not in result.stderr
