"""Speed of the kit planner: 200 coil types against 100 stock items (goal: under 2 s; issue 7).

The plans are invented for the benchmark (seeded random plans). The first: 200 coil types of 0.5
to 60 µH, half of them at an operating frequency between 1 and 30 MHz, a fifth with a DC current,
each wanted 1 to 3 times; 60 formers of 6 to 30 mm and 40 ring cores (half by a generic material
class, half by an AL value), each 2 to 6 on the shelf; three reels of wire, too short for every
coil to take its cheapest wire. The second mixes every stock kind (rods, gapped cores, bobbins)
and taps; it runs at a reduced size unless ``COILPLAN_FULL_BENCH=1``. Under
``--benchmark-disable`` each body runs once and still checks the plan. No assertion is on time.
"""

import os

import numpy as np

from coilplan.kit import parse_plan, plan_kit


def _plan_text(seed: int = 20261202) -> str:
    rng = np.random.default_rng(seed)
    parts = []
    for k in range(200):
        extra = f'at = "{rng.uniform(1, 30):.2f}MHz"\n' if k % 2 else ""
        if k % 5 == 0:
            extra += f'current = "{rng.uniform(0.01, 0.5):.3f}A"\n'
        parts.append(f'[[coil]]\nname = "c{k}"\ncount = {rng.integers(1, 4)}\n'
                     f'target = "{rng.uniform(0.5, 60):.3f}uH"\ntolerance = "5%"\n{extra}')
    for k in range(60):
        parts.append(f'[[former]]\nname = "f{k}"\ndiameter = "{rng.uniform(6, 30):.1f}mm"\n'
                     f'length = "{rng.uniform(15, 80):.1f}mm"\ncount = {rng.integers(2, 7)}\n')
    materials = ["iron-powder-rf", "nizn-125", "nizn-40", "nizn-250"]
    for k in range(40):
        od = rng.uniform(10, 30)
        core = f'material = "{materials[k % 4]}"' if k % 2 else f'al = "{rng.uniform(3, 100):.1f}nH"'
        parts.append(f'[[toroid]]\nname = "t{k}"\nod = "{od:.1f}mm"\nid = "{od * 0.55:.1f}mm"\n'
                     f'height = "{od * 0.4:.1f}mm"\n{core}\ncount = {rng.integers(2, 7)}\n')
    for wire, length in (("0.25mm", "200m"), ("0.4mm", "300m"), ("0.6mm", "200m")):
        parts.append(f'[[reel]]\nwire = "{wire}"\nlength = "{length}"\n')
    return "".join(parts)


def test_bench_kit_200_by_100(benchmark):
    """200 coil types × 100 stock items × 3 wires: evaluated, assigned and allocated."""
    plan = parse_plan(_plan_text())
    assert len(plan.coil) == 200 and len(plan.former) + len(plan.toroid) == 100
    result = benchmark.pedantic(plan_kit, args=(plan,), rounds=3, iterations=1)
    placed = sum(p.quantity for p in result.placements)
    assert placed > 0.5 * sum(coil.count for coil in plan.coil)
    columns = {}
    for placement in result.placements:
        columns[placement.stock] = columns.get(placement.stock, 0) + placement.quantity
    for stock, used in columns.items():  # never more of an item than the shelf holds
        assert used <= result.evaluation.stock[stock].count
    for reel in result.reels:  # nor more wire than a reel holds
        assert reel["used_m"] <= reel["length_m"] + 1e-9
    assert result.proven_optimal or result.bound[0] <= result.objective[0]


def _mixed_text(coils: int, seed: int = 20261203) -> str:
    """Coil types from 1 µH to 2 mH (some tapped) on formers, rings, rods, gapped cores and bobbins."""
    rng = np.random.default_rng(seed)
    parts = []
    for k in range(coils):
        extra = f'at = "{rng.uniform(0.5, 20):.2f}MHz"\n' if k % 2 else ""
        if k % 4 == 0:
            extra += f'current = "{rng.uniform(0.01, 0.3):.3f}A"\n'
        if k % 10 == 3:
            extra += "tap_fraction = 0.25\n"
        parts.append(f'[[coil]]\nname = "c{k}"\ncount = {rng.integers(1, 4)}\n'
                     f'target = "{np.exp(rng.uniform(0.0, np.log(2000.0))):.3f}uH"\ntolerance = "5%"\n{extra}')
    scale = coils / 100
    for k in range(round(30 * scale)):
        parts.append(f'[[former]]\nname = "f{k}"\ndiameter = "{rng.uniform(6, 30):.1f}mm"\n'
                     f'length = "{rng.uniform(15, 80):.1f}mm"\ncount = {rng.integers(2, 7)}\n')
    for k in range(round(20 * scale)):
        od = rng.uniform(10, 30)
        parts.append(f'[[toroid]]\nname = "t{k}"\nod = "{od:.1f}mm"\nid = "{od * 0.55:.1f}mm"\n'
                     f'height = "{od * 0.4:.1f}mm"\nmaterial = "{["iron-powder-rf", "nizn-125", "nizn-800"][k % 3]}"\n'
                     f'count = {rng.integers(2, 7)}\n')
    for k in range(max(round(4 * scale), 1)):
        parts.append(f'[[rod]]\nname = "r{k}"\nlength = "{rng.uniform(40, 160):.0f}mm"\n'
                     f'diameter = "{[8, 10, 12][k % 3]}mm"\nmaterial = "{["nizn-125", "nizn-250"][k % 2]}"\n'
                     f'count = {rng.integers(2, 7)}\n')
    for k in range(max(round(6 * scale), 1)):
        parts.append(f'[[gapped]]\nname = "g{k}"\nae = "{rng.uniform(10, 60):.0f}mm2"\n'
                     f'le = "{rng.uniform(20, 60):.0f}mm"\ngap = "{rng.uniform(0.05, 1):.2f}mm"\n'
                     'material = "mnzn-power"\n'
                     f'window_width = "{rng.uniform(5, 15):.1f}mm"\nwindow_depth = "{rng.uniform(2, 6):.1f}mm"\n'
                     f'count = {rng.integers(2, 7)}\n')
    for k in range(max(round(4 * scale), 1)):
        parts.append(f'[[bobbin]]\nname = "b{k}"\ndiameter = "{rng.uniform(4, 12):.1f}mm"\n'
                     f'width = "{rng.uniform(4, 12):.1f}mm"\ndepth = "{rng.uniform(2, 6):.1f}mm"\n'
                     f'count = {rng.integers(2, 7)}\n')
    for wire, length in (("0.2mm", 80), ("0.35mm", 80), ("0.5mm", 60)):
        parts.append(f'[[reel]]\nwire = "{wire}"\nlength = "{length * scale:.1f}m"\n')
    return "".join(parts)


def test_bench_kit_mixed_stock(benchmark):
    """100 coil types × 64 stock items of every kind × 3 wires (25 × 16 without COILPLAN_FULL_BENCH=1)."""
    coils = 100 if os.environ.get("COILPLAN_FULL_BENCH") == "1" else 25
    plan = parse_plan(_mixed_text(coils))
    result = benchmark.pedantic(plan_kit, args=(plan,), rounds=1, iterations=1)
    kinds = {result.evaluation.stock[p.stock].kind for p in result.placements}
    assert {"rod", "gapped", "bobbin"} & kinds  # the new kinds took part
    for reel in result.reels:
        assert reel["used_m"] <= reel["length_m"] + 1e-9
    assert result.proven_optimal or result.bound[0] <= result.objective[0]
