"""The ``coilplan`` script's entry: Ctrl-C while the command line is still being imported ends in one line
and exit status 130, not a traceback."""

import sys


def run() -> None:
    """Import the command line and run it; an interrupt during the imports is one line, exit status 130."""
    try:
        from coilplan.cli import run as command_line
    except KeyboardInterrupt:
        sys.stderr.write("coilplan: error: interrupted\n")
        sys.exit(130)
    command_line()
