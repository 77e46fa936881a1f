"""Speed of the kit planner: 200 coil types against 100 stock items (goal: under 2 s; issue 7).

The plan is invented for the benchmark (a seeded random plan): 200 coil types of 0.5 to 60 µH,
half of them at an operating frequency between 1 and 30 MHz, a fifth with a DC current, each
wanted 1 to 3 times; 60 formers of 6 to 30 mm and 40 ring cores (half by a generic material
class, half by an AL value), each 2 to 6 on the shelf; three reels of wire. Under
``--benchmark-disable`` the body runs once and still checks the plan. No assertion is on time.
"""

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
