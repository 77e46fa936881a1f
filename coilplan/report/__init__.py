"""Rendering of results: aligned text for the terminal and the ``--json`` document."""

from coilplan.report.json_report import json_document
from coilplan.report.text import aligned_rows, bullet_lines

__all__ = ["aligned_rows", "bullet_lines", "json_document"]
