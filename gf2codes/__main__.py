"""``python -m gf2codes`` runs the command line."""

from gf2codes.cli import entry_point

entry_point()
