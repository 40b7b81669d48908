"""Which names resolve to pandas and numpy, however the script spells its imports."""

from __future__ import annotations

from dataclasses import dataclass, field

import libcst as cst
from libcst.helpers import get_full_name_for_node

# Modules with pandas' API under another name.
PANDAS_MODULES = {"pandas", "modin.pandas"}
NUMPY_MODULES = {"numpy"}
# Dask's DataFrame module: its functions are mapping keys of their own (`dd.read_csv`,
# mappings/dask.toml); the frames they make take pandas' rules for the rest of their API
DASK_MODULES = {"dask.dataframe"}


@dataclass
class ImportFacts:
    """`names` maps a local name to what it resolves to: "pandas", "pandas.read_csv", "numpy"…"""

    names: dict[str, str] = field(default_factory=dict)
    pandas_imports: list[cst.CSTNode] = field(default_factory=list)
    numpy_imports: list[cst.CSTNode] = field(default_factory=list)
    has_polars_as_pl: bool = False

    @property
    def uses_pandas(self) -> bool:
        return any(v in ("pandas", "dask") or v.startswith(("pandas.", "dask."))
                   for v in self.names.values())

    @property
    def uses_dask(self) -> bool:
        return any(v == "dask" or v.startswith("dask.") for v in self.names.values())


def _canonical(module: str) -> str | None:
    if module in PANDAS_MODULES:
        return "pandas"
    if module in NUMPY_MODULES:
        return "numpy"
    if module in DASK_MODULES:
        return "dask"
    return None


class _ImportCollector(cst.CSTVisitor):
    def __init__(self) -> None:
        self.facts = ImportFacts()

    def visit_Import(self, node: cst.Import) -> None:
        for alias in node.names:
            module = get_full_name_for_node(alias.name) or ""
            canonical = _canonical(module)
            if module == "polars" and alias.asname is not None:
                self.facts.has_polars_as_pl |= _asname(alias) == "pl"
            if canonical is None:
                continue
            if alias.asname is not None:
                self.facts.names[_asname(alias)] = canonical
            elif "." not in module:
                self.facts.names[module] = canonical
            if canonical in ("pandas", "dask"):
                self.facts.pandas_imports.append(node)
            elif canonical == "numpy" and node not in self.facts.numpy_imports:
                self.facts.numpy_imports.append(node)

    def visit_ImportFrom(self, node: cst.ImportFrom) -> None:
        if node.module is None or node.relative:
            return
        if get_full_name_for_node(node.module) == "dask" and not isinstance(node.names, cst.ImportStar):
            # from dask import dataframe as dd
            for alias in node.names:
                if get_full_name_for_node(alias.name) == "dataframe":
                    local = _asname(alias) if alias.asname is not None else "dataframe"
                    self.facts.names[local] = "dask"
                    self.facts.pandas_imports.append(node)
            return
        canonical = _canonical(get_full_name_for_node(node.module) or "")
        if canonical is None or isinstance(node.names, cst.ImportStar):
            return
        for alias in node.names:
            name = get_full_name_for_node(alias.name) or ""
            local = _asname(alias) if alias.asname is not None else name
            self.facts.names[local] = f"{canonical}.{name}"
        if canonical in ("pandas", "dask"):
            self.facts.pandas_imports.append(node)
        elif canonical == "numpy":
            self.facts.numpy_imports.append(node)


def _asname(alias: cst.ImportAlias) -> str:
    assert alias.asname is not None
    target = alias.asname.name
    return target.value if isinstance(target, cst.Name) else ""


def collect_imports(module: cst.Module) -> ImportFacts:
    collector = _ImportCollector()
    module.visit(collector)
    return collector.facts
