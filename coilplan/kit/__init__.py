"""The kit planner: many coils at once from the formers, toroids, ferrite rods, gapped cores, bobbins and
wire reels on the shelf.

``plan`` holds the plan file's records (pydantic), ``plan_values`` the types that read its values,
``plan_file`` reads and validates it, ``keys`` names the library's fields as the plan's keys, ``stock``
builds each stock item's coil form, ``evaluation`` evaluates every coil on every stock item with every
wire, ``optimise`` shares out the stock and the wire optimally under the counts and the reel lengths,
``assign`` turns the share-out into placements and explains what is left out, ``outputs`` renders the
table, the JSON and the bill of materials, ``cards`` the winding cards. Import it only from the ``kit`` command
(pydantic stays out of the other commands' start-up).
"""

from coilplan.kit.assign import KitResult, Placement, plan_kit
from coilplan.kit.evaluation import Candidate, evaluate_plan
from coilplan.kit.plan import PlanFileError
from coilplan.kit.plan_file import load_plan, parse_plan

__all__ = ["Candidate", "KitResult", "Placement", "PlanFileError", "evaluate_plan", "load_plan", "parse_plan",
           "plan_kit"]
