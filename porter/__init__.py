"""porter: port pandas scripts to the Polars lazy API without silently changing a result."""

__version__ = "0.1.0"
