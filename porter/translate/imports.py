"""Import edits after a rewrite: add `import polars as pl` once, drop pandas imports nobody uses."""

from __future__ import annotations

import ast

import libcst as cst

from porter.analysis.imports import ImportFacts
from porter.rules.datetimes import (
    GUESS_DAYFIRST_DEFINITION, GUESS_DAYFIRST_FUNCTION, GUESS_DEFINITION, GUESS_FUNCTION,
    stamp_parts,
)
from porter.rules.handover import TEXT_DEFINITION, TEXT_FUNCTION
from porter.translate.handover import VALUES_DEFINITION, VALUES_FUNCTION
from porter.rules.elementwise import DISTINCT_DEFINITION, DISTINCT_FUNCTION
from porter.rules.legacy import (APPEND_DEFINITION, APPEND_FUNCTION, READ_CSV_DEFINITION,
                                 READ_CSV_FUNCTION)
from porter.rules.strings import (
    TITLE_DEFINITION, TITLE_FUNCTION, UPPER_DEFINITION, UPPER_FUNCTION, WHITESPACE_CONSTANT,
    WHITESPACE_DEFINITION,
)
from porter.rules.selection import (
    LABEL_ROWS_DEFINITION, LABEL_ROWS_FUNCTION, LEVEL_ROWS_DEFINITION, LEVEL_ROWS_FUNCTION,
    ROW_SUM_DEFINITION, ROW_SUM_FUNCTION,
    DTYPE_PROBE_CONSTANT, DTYPE_PROBE_DEFINITION, DTYPES_TEXT_DEFINITION, DTYPES_TEXT_FUNCTION,
)
from porter.rules.groupby import (
    GROUP_MEAN_DEFINITION, GROUP_MEAN_FUNCTION, GROUP_QUANTILE_DEFINITION, GROUP_QUANTILE_FUNCTION,
    GROUP_SKEW_DEFINITION, GROUP_SKEW_FUNCTION,
    GROUP_SUM_DEFINITION, GROUP_SUM_FUNCTION,
    GROUP_SUM_OVER_DEFINITION, GROUP_SUM_OVER_FUNCTION,
    GROUP_SUMS_DEFINITION, GROUP_SUMS_FUNCTION,
    MEAN_DEFINITION, MEAN_FUNCTION, TEXT_ARRAY_DEFINITION, TEXT_ARRAY_FUNCTION,
    TOTAL_DEFINITION, TOTAL_EXPR_DEFINITION, TOTAL_EXPR_FUNCTION, TOTAL_FUNCTION,
    TEXT_VALUES_DEFINITION, TEXT_VALUES_FUNCTION,
)
from porter.rules.totals import REDUCE_DEFINITION, REDUCE_FUNCTION
from porter.rules.assign import ALIGNED_DEFINITION, ALIGNED_FUNCTION
from porter.rules.io_options import (
    CATEGORY_COUNTS_DEFINITION, CATEGORY_COUNTS_FUNCTION,
    CSV_DATETIMES_CONSTANT, CSV_DATETIMES_DEFINITION, CSV_DURATIONS_CONSTANT, CSV_LISTS_CONSTANT,
    CSV_LISTS_DEFINITION, CSV_NUMBER_LISTS_CONSTANT, CSV_NUMBER_LISTS_DEFINITION,
    CSV_ZONED_DATETIMES_CONSTANT, CSV_ZONED_DATETIMES_DEFINITION,
    CSV_DURATIONS_DEFINITION, CSV_FLOATS_CONSTANT, CSV_FLOATS_DEFINITION, CSV_INTS_CONSTANT,
    CSV_INTS_DEFINITION,
    DIVIDE_DEFINITION, DIVIDE_FUNCTION, FLOAT_DIVMOD_DEFINITION, FLOAT_DIVMOD_FUNCTION,
    COUNT_MARGINS_DEFINITION, COUNT_MARGINS_FUNCTION, DATES_AS_TEXT_DEFINITION,
    DATES_AS_TEXT_FUNCTION, MARGINS_DEFINITION, MARGINS_FUNCTION, NA_CONSTANT, PANDAS_NA_TOKENS,
    PERCENTILES_DEFINITION, PERCENTILES_FUNCTION, QCUT_NUMBERS_DEFINITION, QCUT_NUMBERS_FUNCTION,
    QUANTILE_DEFINITION, QUANTILE_FUNCTION,
    ROW_DEFINITION,
    ROW_FUNCTION, SORT_DEFINITION, SORT_FUNCTION,
    UNSTACKED_DEFINITION, UNSTACKED_FUNCTION,
)


class _NameUses(cst.CSTVisitor):
    """Names read anywhere outside import statements."""

    def __init__(self) -> None:
        self.names: set[str] = set()

    def visit_Import(self, node: cst.Import) -> bool:
        return False

    def visit_ImportFrom(self, node: cst.ImportFrom) -> bool:
        return False

    def visit_Attribute(self, node: cst.Attribute) -> bool:
        node.value.visit(self)
        return False

    def visit_Arg(self, node: cst.Arg) -> bool:
        node.value.visit(self)
        return False

    def visit_Name(self, node: cst.Name) -> None:
        self.names.add(node.value)


def names_used(module: cst.Module) -> set[str]:
    visitor = _NameUses()
    module.visit(visitor)
    return visitor.names


def fix_imports(module: cst.Module, facts: ImportFacts, original: cst.Module | None = None) -> cst.Module:
    """Polars imported, pandas' names no longer used dropped, and numpy's names the original
    used but the conversion no longer does (np.where became pl.when): importing numpy costs
    time and memory. An import the original did not use either stays as the user wrote it."""
    module = plain_date_constants(module, facts)
    module = _numpy_through_pandas(module, facts)
    used = names_used(module)
    if GROUP_MEAN_FUNCTION in used:
        used.add(GROUP_SUM_FUNCTION)  # the mean's definition calls it
    if GROUP_SUM_OVER_FUNCTION in used:
        used.add(GROUP_SUMS_FUNCTION)  # the window sum's definition calls it
    needs_polars = "pl" in used and not facts.has_polars_as_pl
    pandas_names = {n for n, q in facts.names.items() if q in ("pandas", "dask") or q.startswith("pandas.")}
    unused = pandas_names - used
    numpy_names = {n for n, q in facts.names.items() if q == "numpy" or q.startswith("numpy.")}
    used_before = names_used(original) if original is not None else numpy_names
    unused_numpy = (numpy_names & used_before) - used

    body: list[cst.CSTNode] = []
    inserted = not needs_polars
    for stmt in module.body:
        if isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1 \
                and isinstance(stmt.body[0], (cst.Import, cst.ImportFrom)) \
                and any(stmt.body[0] is imp for imp in facts.pandas_imports):
            kept = _without_names(stmt.body[0], unused)
            if kept is None and not inserted:
                body.append(stmt.with_changes(body=[_polars_import()]))
                inserted = True
                continue
            if kept is not None:
                body.append(stmt.with_changes(body=[kept]))
                if not inserted:
                    body.append(cst.SimpleStatementLine(body=[_polars_import()]))
                    inserted = True
            continue
        if unused_numpy and isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1 \
                and any(stmt.body[0] is imp for imp in facts.numpy_imports):
            kept = _without_names(stmt.body[0], unused_numpy)  # type: ignore[arg-type]
            if kept is not None:
                body.append(stmt.with_changes(body=[kept]))
            continue
        body.append(stmt)
    if not inserted:
        body = _insert_at_top(body)
    if _reaches_numpy_through_pandas(used, facts, original):
        # pd.np.log became np.log (pandas 2 removed pd.np): numpy imported as the script had not
        body = _insert_after_imports(body, cst.SimpleStatementLine(body=[cst.Import(names=[
            cst.ImportAlias(name=cst.Name("numpy"), asname=cst.AsName(name=cst.Name("np")))])]))
    for constant, definition in ((CSV_LISTS_CONSTANT, CSV_LISTS_DEFINITION),
                                 (CSV_NUMBER_LISTS_CONSTANT, CSV_NUMBER_LISTS_DEFINITION),
                                 (CSV_INTS_CONSTANT, CSV_INTS_DEFINITION),
                                 (CSV_FLOATS_CONSTANT, CSV_FLOATS_DEFINITION),
                                 (CSV_DURATIONS_CONSTANT, CSV_DURATIONS_DEFINITION),
                                 (CSV_DATETIMES_CONSTANT, CSV_DATETIMES_DEFINITION),
                                 (CSV_ZONED_DATETIMES_CONSTANT, CSV_ZONED_DATETIMES_DEFINITION),
                                 (DTYPE_PROBE_CONSTANT, DTYPE_PROBE_DEFINITION),
                                 (WHITESPACE_CONSTANT, WHITESPACE_DEFINITION)):
        if constant in used and not _defines(module, constant):
            body = _insert_after_imports(body, *_constant(definition))
    from porter.rules.datetimes import DURATION_DEFINITION, DURATION_FUNCTION
    for function, definition in ((DIVIDE_FUNCTION, DIVIDE_DEFINITION),
                                 (FLOAT_DIVMOD_FUNCTION, FLOAT_DIVMOD_DEFINITION),
                                 (DURATION_FUNCTION, DURATION_DEFINITION),
                                 (QUANTILE_FUNCTION, QUANTILE_DEFINITION),
                                 (QCUT_NUMBERS_FUNCTION, QCUT_NUMBERS_DEFINITION),
                                 (PERCENTILES_FUNCTION, PERCENTILES_DEFINITION),
                                 (UNSTACKED_FUNCTION, UNSTACKED_DEFINITION),
                                 (MARGINS_FUNCTION, MARGINS_DEFINITION),
                                 (COUNT_MARGINS_FUNCTION, COUNT_MARGINS_DEFINITION),
                                 (DATES_AS_TEXT_FUNCTION, DATES_AS_TEXT_DEFINITION),
                                 (CATEGORY_COUNTS_FUNCTION, CATEGORY_COUNTS_DEFINITION),
                                 (ROW_FUNCTION, ROW_DEFINITION),
                                 (SORT_FUNCTION, SORT_DEFINITION),
                                 (GUESS_FUNCTION, GUESS_DEFINITION),
                                 (GUESS_DAYFIRST_FUNCTION, GUESS_DAYFIRST_DEFINITION),
                                 (TEXT_FUNCTION, TEXT_DEFINITION),
                                 (UPPER_FUNCTION, UPPER_DEFINITION),
                                 (TITLE_FUNCTION, TITLE_DEFINITION),
                                 (GROUP_SUM_FUNCTION, GROUP_SUM_DEFINITION),
                                 (GROUP_SUM_OVER_FUNCTION, GROUP_SUM_OVER_DEFINITION),
                                 (GROUP_SUMS_FUNCTION, GROUP_SUMS_DEFINITION),
                                 (GROUP_MEAN_FUNCTION, GROUP_MEAN_DEFINITION),
                                 (GROUP_QUANTILE_FUNCTION, GROUP_QUANTILE_DEFINITION),
                                 (GROUP_SKEW_FUNCTION, GROUP_SKEW_DEFINITION),
                                 (MEAN_FUNCTION, MEAN_DEFINITION),
                                 (TOTAL_FUNCTION, TOTAL_DEFINITION),
                                 (TOTAL_EXPR_FUNCTION, TOTAL_EXPR_DEFINITION),
                                 (REDUCE_FUNCTION, REDUCE_DEFINITION),
                                 (ALIGNED_FUNCTION, ALIGNED_DEFINITION),
                                 (TEXT_VALUES_FUNCTION, TEXT_VALUES_DEFINITION),
                                 (TEXT_ARRAY_FUNCTION, TEXT_ARRAY_DEFINITION),
                                 (DTYPES_TEXT_FUNCTION, DTYPES_TEXT_DEFINITION),
                                 (LABEL_ROWS_FUNCTION, LABEL_ROWS_DEFINITION),
                                 (LEVEL_ROWS_FUNCTION, LEVEL_ROWS_DEFINITION),
                                 (ROW_SUM_FUNCTION, ROW_SUM_DEFINITION),
                                 (DISTINCT_FUNCTION, DISTINCT_DEFINITION),
                                 (VALUES_FUNCTION, VALUES_DEFINITION),
                                 (APPEND_FUNCTION, APPEND_DEFINITION),
                                 (READ_CSV_FUNCTION, READ_CSV_DEFINITION)):
        if function not in used or _defines(module, function):
            continue
        body = _insert_after_imports(body, _function(definition))
        at = next(i for i, node in enumerate(body) if isinstance(node, cst.FunctionDef)
                  and node.name.value == function)
        if at + 1 < len(body):  # two blank lines after a function, as PEP 8 has it
            after = body[at + 1]
            lines = list(getattr(after, "leading_lines", ()))
            while lines and lines[0].comment is None:
                lines.pop(0)
            body[at + 1] = after.with_changes(leading_lines=[cst.EmptyLine(), cst.EmptyLine(), *lines])
    if NA_CONSTANT in used and not _defines(module, NA_CONSTANT):
        body = _insert_after_imports(body, _na_constant())
    return module.with_changes(body=body)


class _PandasNumpy(cst.CSTTransformer):
    """pd.np -> np and pd.datetime -> datetime.datetime wherever the conversion still has
    them (a statement kept on pandas)."""

    def __init__(self, pandas: set[str], numpy: str) -> None:
        self.pandas, self.numpy = pandas, numpy

    def leave_Attribute(self, original: cst.Attribute, updated: cst.Attribute) -> cst.BaseExpression:
        if updated.attr.value == "np" and isinstance(updated.value, cst.Name) \
                and updated.value.value in self.pandas:
            return cst.Name(self.numpy)
        if updated.attr.value == "datetime" and isinstance(updated.value, cst.Name) \
                and updated.value.value in self.pandas:
            # pd.datetime (pandas' re-export of datetime.datetime, removed in pandas 2.0)
            return cst.parse_expression('__import__("datetime").datetime')
        return updated


def _numpy_through_pandas(module: cst.Module, facts: ImportFacts) -> cst.Module:
    """pandas' re-export of numpy (pd.np, removed in pandas 2.0) written as numpy itself, in
    the code porter kept as the script wrote it too: pandas 3 has no pd.np."""
    pandas = {n for n, q in facts.names.items() if q == "pandas"}
    if not pandas or ".np" not in module.code and not any(
            f"{name}.datetime" in module.code for name in pandas):
        return module
    numpy = next((n for n, q in facts.names.items() if q == "numpy"), "np")
    return module.visit(_PandasNumpy(pandas, numpy))


def _reaches_numpy_through_pandas(used: set[str], facts: ImportFacts,
                                  original: cst.Module | None) -> bool:
    """The conversion names np (written for pd.np) where the script imported no numpy and did
    not use the name np itself."""
    if "np" not in used or any(q == "numpy" for q in facts.names.values()):
        return False
    return original is None or "np" not in names_used(original)


def _defines(module: cst.Module, name: str) -> bool:
    for stmt in module.body:
        if isinstance(stmt, cst.FunctionDef) and stmt.name.value == name:
            return True
        if isinstance(stmt, cst.SimpleStatementLine):
            for small in stmt.body:
                if isinstance(small, cst.Assign) and any(
                        isinstance(t.target, cst.Name) and t.target.value == name for t in small.targets):
                    return True
    return False


def _na_constant() -> cst.SimpleStatementLine:
    lines, current = [], ""
    for token in PANDAS_NA_TOKENS:
        piece = f'"{token}", '
        if len(current) + len(piece) > 80:
            lines.append(current.rstrip())
            current = ""
        current += piece
    lines.append(current.rstrip())
    items = "\n".join(f"    {line}" for line in lines)
    stmt = cst.parse_statement(f"{NA_CONSTANT} = [\n{items}\n]\n")
    assert isinstance(stmt, cst.SimpleStatementLine)
    comment = cst.Comment("# Text that pandas' read_csv reads as a missing value.")
    return stmt.with_changes(leading_lines=[cst.EmptyLine(), cst.EmptyLine(comment=comment)])


def _function(definition: str) -> cst.BaseCompoundStatement:
    stmt = cst.parse_module(definition).body[0]
    assert isinstance(stmt, cst.FunctionDef)
    return stmt.with_changes(leading_lines=[cst.EmptyLine(), cst.EmptyLine()])


def _constant(definition: str) -> list[cst.CSTNode]:
    """The statements of a constant's definition (the function it calls first, if any), its
    comment above the first."""
    module = cst.parse_module(definition)
    first, *rest = module.body
    comments = [line for line in module.header if line.comment is not None]
    blank = [cst.EmptyLine()] * (2 if isinstance(first, cst.FunctionDef) else 1)  # as PEP 8 has it
    return [first.with_changes(leading_lines=[*blank, *comments]), *rest]


def plain_date_constants(module: cst.Module, facts: ImportFacts) -> cst.Module:
    """`START = pd.Timestamp("2024-11-15")` (or pd.to_datetime of one text) at the top of the
    script, whose every use is an
    operand beside a Polars expression (pl.col("day") - START): Python's datetime, which Polars
    reads as the same literal, so that pandas need not be imported for it (a third of a second
    and 90 MiB). (pd.Timedelta constants are the duration rule's already.)"""
    pandas_aliases = {n for n, q in facts.names.items() if q == "pandas"}
    if not pandas_aliases:
        return module
    try:
        tree = ast.parse(module.code)
    except SyntaxError:
        return module
    style = _datetime_module_style(tree)
    if style is None:
        return module
    constants: dict[str, str] = {}
    for stmt in tree.body:
        if isinstance(stmt, ast.Assign) and len(stmt.targets) == 1 \
                and isinstance(stmt.targets[0], ast.Name):
            written = _python_date(stmt.value, pandas_aliases)
            if written is not None:
                constants[stmt.targets[0].id] = written
    if not constants:
        return module
    stores: dict[str, int] = {}
    uses: dict[str, int] = {}
    beside_polars: dict[str, int] = {}
    for node in ast.walk(tree):
        if isinstance(node, ast.Name) and node.id in constants:
            bucket = uses if isinstance(node.ctx, ast.Load) else stores
            bucket[node.id] = bucket.get(node.id, 0) + 1
        operands: list[ast.expr] = []
        if isinstance(node, ast.BinOp) and isinstance(node.op, (ast.Add, ast.Sub)):
            operands = [node.left, node.right]
        elif isinstance(node, ast.Compare):
            operands = [node.left, *node.comparators]
        for operand in operands:
            if isinstance(operand, ast.Name) and operand.id in constants and any(
                    o is not operand and _polars_expression(o) for o in operands):
                beside_polars[operand.id] = beside_polars.get(operand.id, 0) + 1
    plain = {name: text for name, text in constants.items() if stores.get(name) == 1
             and uses.get(name, 0) and uses[name] == beside_polars.get(name, 0)}
    if not plain:
        return module

    body: list[cst.CSTNode] = []
    for stmt in module.body:  # the other statements stay the same objects (facts name them)
        assign = stmt.body[0] if isinstance(stmt, cst.SimpleStatementLine) \
            and len(stmt.body) == 1 else None
        if isinstance(assign, cst.Assign) and len(assign.targets) == 1 \
                and isinstance(assign.targets[0].target, cst.Name) \
                and assign.targets[0].target.value in plain:
            value = cst.parse_expression(plain[assign.targets[0].target.value])
            stmt = stmt.with_changes(body=[assign.with_changes(value=value)])
        body.append(stmt)
    if style == "import":  # a standard library import: before the others, after __future__
        at = next((i for i, node in enumerate(body) if isinstance(node, cst.SimpleStatementLine)
                   and isinstance(node.body[0], (cst.Import, cst.ImportFrom))
                   and not _is_future(node.body[0])), None)
        line = cst.parse_statement("import datetime\n")
        if at is None:
            body = _insert_after_imports(body, line)
        else:
            first = body[at]
            line = line.with_changes(leading_lines=first.leading_lines)  # type: ignore[attr-defined]
            body[at:at + 1] = [line, first.with_changes(leading_lines=[])]  # type: ignore[attr-defined]
    return module.with_changes(body=body)


def _is_future(stmt: cst.BaseSmallStatement) -> bool:
    return isinstance(stmt, cst.ImportFrom) and isinstance(stmt.module, cst.Name) \
        and stmt.module.value == "__future__"


# methods that leave Polars for a Python value (a datetime minus which is a timedelta, where
# a Timestamp would have made a Timedelta)
_PYTHON_RESULTS = frozenset({"item", "collect", "to_list", "to_numpy", "to_series", "row",
                             "rows", "to_pandas", "to_dict", "to_dicts"})


def _polars_expression(node: ast.expr) -> bool:
    """Whether `node` is a Polars expression: a chain of methods on pl.col(...), pl.lit(...),
    pl.when(...)..., or arithmetic with one, that never turns into a Python value."""
    if isinstance(node, ast.BinOp):
        return _polars_expression(node.left) or _polars_expression(node.right)
    while isinstance(node, (ast.Call, ast.Attribute, ast.Subscript)):
        if isinstance(node, ast.Call):
            func = node.func
            if isinstance(func, ast.Attribute) and isinstance(func.value, ast.Name) \
                    and func.value.id == "pl":
                return True
            if isinstance(func, ast.Attribute) and func.attr in _PYTHON_RESULTS:
                return False
            node = func
        else:
            node = node.value
    return False


def _datetime_module_style(tree: ast.Module) -> str | None:
    """How the script can name Python's datetime: "import" (nothing binds `datetime`: import
    it), "module" (import datetime); None when `datetime` is bound otherwise."""
    bound = [node for node in ast.walk(tree) if isinstance(node, (ast.Import, ast.ImportFrom))
             and any((a.asname or a.name) in ("datetime", "timedelta") for a in node.names)]
    others = [node for node in ast.walk(tree) if isinstance(node, ast.Name)
              and node.id in ("datetime", "timedelta") and isinstance(node.ctx, ast.Store)]
    if others:
        return None
    if not bound:
        return "import"
    if all(isinstance(b, ast.Import) and [a.name for a in b.names] == ["datetime"]
           and b.names[0].asname is None for b in bound):
        return "module"
    return None


def _python_date(value: ast.expr, pandas_aliases: set[str]) -> str | None:
    """datetime.datetime(2024, 11, 15) for pd.Timestamp("2024-11-15") or
    pd.to_datetime("2024-11-15") (a date pandas reads, no time zone, no nanoseconds)."""
    if not (isinstance(value, ast.Call) and isinstance(value.func, ast.Attribute)
            and isinstance(value.func.value, ast.Name) and value.func.value.id in pandas_aliases):
        return None
    kind = value.func.attr
    if kind in ("Timestamp", "to_datetime") and len(value.args) == 1 and not value.keywords \
            and isinstance(value.args[0], ast.Constant) and isinstance(value.args[0].value, str):
        import warnings
        import pandas as pd
        try:
            with warnings.catch_warnings():
                warnings.simplefilter("ignore")
                stamp = pd.Timestamp(value.args[0].value)
                # pd.to_datetime("2024-11-15") is that Timestamp where it parses the text the
                # same way (it is its own parser; a text it reads otherwise stays pandas')
                if kind == "to_datetime" and not (
                        isinstance(read := pd.to_datetime(value.args[0].value), pd.Timestamp)
                        and read == stamp and read.tzinfo is None):
                    return None
        except (ValueError, TypeError, OverflowError):
            return None
        if stamp is pd.NaT or stamp.tzinfo is not None or stamp.nanosecond:
            return None
        return f"datetime.datetime({', '.join(map(str, stamp_parts(stamp)))})"
    return None


def _insert_after_imports(body: list[cst.CSTNode], *stmts: cst.CSTNode) -> list[cst.CSTNode]:
    position = 0
    for i, node in enumerate(body):
        if isinstance(node, cst.SimpleStatementLine) and all(
                isinstance(s, (cst.Import, cst.ImportFrom)) for s in node.body):
            position = i + 1
        elif isinstance(node, cst.SimpleStatementLine) and i == 0 and isinstance(
                node.body[0], cst.Expr):
            position = 1
        else:
            break
    # the definitions read `pl`: after polars' import where code comes before it (an import
    # below `os.environ[...] = ...`)
    for i, node in enumerate(body[position:], start=position):
        if isinstance(node, cst.SimpleStatementLine) and any(
                isinstance(s, cst.Import) and any(cst.Module([]).code_for_node(a.name) == "polars"
                                                  for a in s.names) for s in node.body):
            position = i + 1
            break
    return [*body[:position], *stmts, *body[position:]]


def _polars_import() -> cst.Import:
    return cst.Import(names=[cst.ImportAlias(name=cst.Name("polars"),
                                             asname=cst.AsName(name=cst.Name("pl")))])


def _without_names(stmt: cst.Import | cst.ImportFrom, unused: set[str]) -> cst.Import | cst.ImportFrom | None:
    """The import statement without the aliases in `unused`; None when nothing is left."""
    if isinstance(stmt.names, cst.ImportStar):
        return stmt
    kept = []
    for alias in stmt.names:
        local = alias.asname.name.value if alias.asname is not None else (  # type: ignore[union-attr]
            alias.name.value if isinstance(alias.name, cst.Name) else
            cst.Module([]).code_for_node(alias.name).split(".")[0])
        if local not in unused:
            kept.append(alias)
    if not kept:
        return None
    if len(kept) == len(stmt.names):
        return stmt
    kept[-1] = kept[-1].with_changes(comma=cst.MaybeSentinel.DEFAULT)
    return stmt.with_changes(names=kept)


def _insert_at_top(body: list[cst.CSTNode]) -> list[cst.CSTNode]:
    """After the docstring and `from __future__` imports."""
    position = 0
    for i, stmt in enumerate(body):
        if isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1:
            small = stmt.body[0]
            if i == 0 and isinstance(small, cst.Expr) and isinstance(small.value, cst.SimpleString):
                position = 1
                continue
            if isinstance(small, cst.ImportFrom) and small.module is not None \
                    and cst.Module([]).code_for_node(small.module) == "__future__":
                position = i + 1
                continue
        break
    return [*body[:position], cst.SimpleStatementLine(body=[_polars_import()]), *body[position:]]
