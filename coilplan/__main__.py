"""``python -m coilplan`` runs the command line."""

from coilplan._entry import run

if __name__ == "__main__":
    run()
