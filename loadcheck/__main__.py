"""``python -m loadcheck`` runs the command line."""

from .cli import main

main()
