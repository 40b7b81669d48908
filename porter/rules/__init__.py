"""Rules: one small pure function per pandas API, registered under its mapping key.

A rule receives the recognised call and a context and returns a symbolic value (whose code is
the Polars rewrite), or raises `ctx.todo(reason)`. It does no I/O and edits no imports.
Modules here are split by pandas area, like the files in `mappings/`.
"""

from __future__ import annotations

from collections.abc import Callable
import importlib
import pkgutil
from typing import TypeVar

from porter.translate.context import PandasCall, RuleContext
from porter.translate.values import Value

RuleFn = Callable[[PandasCall, RuleContext], Value]
F = TypeVar("F", bound=RuleFn)

REGISTRY: dict[str, RuleFn] = {}


def rule(*keys: str) -> Callable[[F], F]:
    """Register a rule for one or more mapping keys."""

    def register(fn: F) -> F:
        for key in keys:
            if key in REGISTRY:
                raise ValueError(f"two rules for {key}: {REGISTRY[key].__name__}, {fn.__name__}")
            REGISTRY[key] = fn
        return fn

    return register


_loaded = False


def registry() -> dict[str, RuleFn]:
    global _loaded
    if not _loaded:
        for info in pkgutil.iter_modules(__path__):
            importlib.import_module(f"{__name__}.{info.name}")
        _loaded = True
    return REGISTRY
