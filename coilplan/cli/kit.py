"""``coilplan kit PLAN.toml``: many coils from the stock on hand, with a bill of materials and winding cards."""

from __future__ import annotations

import sys
from pathlib import Path

import click

from coilplan.cli._common import json_option
from coilplan.errors import InfeasibleError, InvalidInputError

__all__ = ["kit"]

#: Plans with more (coil type × stock item) pairs than this show a progress bar (about a second of work);
#: a pair with a ferrite rod or a bobbin counts as several (their models are costly: a solve per turn count).
PROGRESS_PAIRS = 2000
PAIR_WEIGHT = {"rod": 60, "bobbin": 10}


def _outputs(out: Path, plan_file, fields, result) -> dict[str, bytes]:
    from coilplan.kit.outputs import bom_csv, card_files, kit_document

    files = {"plan.json": (kit_document(plan_file, fields) + "\n").encode("utf-8"),
             "bom.csv": bom_csv(fields, result).encode("utf-8")}
    files.update({name: text.encode("utf-8") for name, text in card_files(fields).items()})
    return {str(out / name): data for name, data in files.items()}


def _write(files: dict[str, bytes], force: bool) -> None:
    from coilplan.files import FileWriteError, write_all_atomically

    existing = [path for path in files if Path(path).exists()]
    if existing and not force:
        more = f" and {len(existing) - 1} more" if len(existing) > 1 else ""
        raise InvalidInputError("--out", f"a folder without the plan's files, or --force to replace them "
                                f"({existing[0]}{more} already there)", None)
    try:  # the plan's files as one set: none is replaced unless all could be written
        write_all_atomically(files)
    except FileWriteError as error:
        raise click.ClickException(str(error)) from None


@click.command()
@click.argument("plan_file", metavar="PLAN", type=click.Path(dir_okay=False, path_type=Path))
@click.option("--out", type=click.Path(file_okay=False, path_type=Path),
              help="Write plan.json, bom.csv and one winding card (HTML) per coil type into this folder.")
@click.option("--force", is_flag=True, help="Replace files of an earlier plan already in --out.")
@json_option
def kit(plan_file, out, force, as_json):
    """Plan many coils at once from the formers, ring cores, ferrite rods, gapped cores, bobbins and
    wire reels in PLAN (a TOML file).

    Every coil type is tried on every stock item with every reel's wire; stock and wire are then
    shared out optimally under the counts and the reel lengths: fewest coils left out, then least
    wire, then closest to target, then best Q. What cannot be placed is explained, with the wire
    short of each gauge; the exit status is then 1.
    """
    from coilplan.kit import load_plan, plan_kit
    from coilplan.kit.outputs import kit_document, result_fields, summary_lines
    from coilplan.kit.plan import STOCK_FORMS

    plan = load_plan(plan_file)
    if out is not None and out.exists() and not out.is_dir():
        raise InvalidInputError("--out", "a folder", str(out))
    stock = sum(len(getattr(plan, kind)) for kind in STOCK_FORMS)
    work = sum(PAIR_WEIGHT.get(kind, 1) * len(getattr(plan, kind)) for kind in STOCK_FORMS)
    if len(plan.coil) * work > PROGRESS_PAIRS and not as_json:
        with click.progressbar(length=stock, label="trying every coil on every stock item",
                               file=sys.stderr) as bar:
            result = plan_kit(plan, progress=bar.update)
    else:
        result = plan_kit(plan)
    fields = result_fields(result)
    if out is not None:
        files = _outputs(out, plan_file, fields, result)
        if not out.exists():
            try:
                out.mkdir(parents=True)
            except OSError as error:
                raise click.ClickException(f"{out}: cannot make the folder ({error.strerror or error})") from None
        _write(files, force)
        fields["files"] = sorted(Path(path).name for path in files)
    if as_json:
        click.echo(kit_document(plan_file, fields))
    else:
        lines = summary_lines(str(plan_file), fields)
        if out is not None:
            lines += ["", f"written to {out}: " + ", ".join(fields["files"])]
        click.echo("\n".join(lines))
    if not result.complete:
        items = fields["not_placed"]
        more = f"; and {len(items) - 1} more (listed above)" if len(items) > 1 else ""
        raise InfeasibleError(f"{items[0]}{more}")
