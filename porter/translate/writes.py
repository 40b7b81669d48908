"""Consecutive writes become one pl.collect_all, so the plans they share run once."""

from __future__ import annotations

import textwrap
from typing import Any

import libcst as cst


SINKS = ("sink_csv", "sink_parquet", "sink_ndjson", "sink_ipc")


def _sink_call(stmt: Any) -> cst.Call | None:
    """The write of a statement that is only `frame.sink_*(path, ...)` with a literal path."""
    if not (isinstance(stmt, cst.SimpleStatementLine) and len(stmt.body) == 1
            and isinstance(stmt.body[0], cst.Expr)):
        return None
    call = stmt.body[0].value
    if isinstance(call, cst.Call) and isinstance(call.func, cst.Attribute) \
            and call.func.attr.value in SINKS and call.args \
            and isinstance(call.args[0].value, cst.SimpleString) and not any(
                a.keyword is not None and a.keyword.value == "lazy" for a in call.args):
        return call
    return None


def is_sink_text(text: str) -> bool:
    """Whether code porter wrote is one write that batch_writes would batch with its
    neighbours."""
    try:
        return _sink_call(cst.parse_statement(text.strip() + "\n")) is not None
    except cst.ParserSyntaxError:
        return False


def batch_writes(out: list[Any], original: Any) -> list[Any]:
    """Consecutive writes porter made become one pl.collect_all, so plans they share run once.

    Only writes to distinct literal paths with nothing but blank lines between them are
    batched: the files are then the same as when written one after the other.
    """
    rewritten = {id(s) for s in out} - {id(s) for s in original}
    result: list[Any] = []
    run: list[tuple[Any, cst.Call]] = []

    def flush() -> None:
        paths = [c.args[0].value.evaluated_value for _, c in run]  # type: ignore[union-attr]
        if len(run) >= 2 and len(set(paths)) == len(paths):
            result.append(_collect_all(run))
        else:
            result.extend(stmt for stmt, _ in run)
        run.clear()

    for stmt in out:
        call = _sink_call(stmt) if id(stmt) in rewritten else None
        has_comment = any(line.comment for line in getattr(stmt, "leading_lines", ()))
        if call is not None and (not run or not has_comment):
            run.append((stmt, call))
            continue
        flush()
        if call is not None:
            run.append((stmt, call))
        else:
            result.append(stmt)
    flush()
    return result


def _collect_all(run: list[tuple[Any, cst.Call]]) -> cst.SimpleStatementLine:
    module = cst.Module([])
    lines = []
    for _, call in run:
        args = [*call.args]
        args[-1] = args[-1].with_changes(comma=cst.MaybeSentinel.DEFAULT)
        lazy = cst.Arg(keyword=cst.Name("lazy"), value=cst.Name("True"),
                       equal=cst.AssignEqual(cst.SimpleWhitespace(""), cst.SimpleWhitespace("")))
        with_lazy = call.with_changes(args=[*(a.with_changes(comma=cst.Comma(
            whitespace_after=cst.SimpleWhitespace(" "))) for a in args), lazy])
        # a write laid out over several lines keeps its layout, one level in
        lines.append(textwrap.indent(module.code_for_node(with_lazy), "    ") + ",")
    text = "pl.collect_all([\n" + "\n".join(lines) + "\n])\n"
    stmt = cst.parse_statement(text)
    first = run[0][0]
    return stmt.with_changes(leading_lines=first.leading_lines,
                             trailing_whitespace=run[-1][0].trailing_whitespace)
