"""Command-line face of crossrate: argparse, plain text / Rich tables, JSON and CSV. No science here."""
