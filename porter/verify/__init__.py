"""Verification: run the original and the converted script on the same sample data and compare
every output (see docs/design.md §8)."""
