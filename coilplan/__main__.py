"""``python -m coilplan`` runs the command line."""

from coilplan.cli import main

if __name__ == "__main__":
    main(prog_name="coilplan")
