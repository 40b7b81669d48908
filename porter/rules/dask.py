"""Dask DataFrame scripts (`import dask.dataframe as dd`): the reads over globs, and the methods
only Dask's frames have or that differ from pandas' there. A Dask frame is a `Frame` marked
`dask` (values.py); the rest of its API is pandas' and takes pandas' rules.

What Dask does differently, checked against dask 2026.8 with pandas 3.1:
- dd.read_csv("data/t-*.csv") reads the files in the order of their sorted names (t-1, t-10,
  t-2), as Polars' scan over the glob does; each file (each block of 64 MB) is a partition
  whose row labels start again at 0, so the labels repeat;
- groupby does not sort its groups (sort=None): their order depends on the partitions and on
  the aggregation (rules/groupby.py lowers it to 0.5 unless sort=True);
- sort_values is not stable over partitions, drop_duplicates / unique work per partition first,
  and a merge of two frames of several partitions shuffles the rows (evaluate.py lowers them);
- head(n) reads the first partition only (npartitions=1) and gives fewer rows when it has
  fewer than n;
- value_counts() is not sorted by count over the whole result;
- to_csv writes one file per partition unless single_file=True;
- set_index sorts the rows by the new index.
"""

from __future__ import annotations

import ast
from dataclasses import replace

import libcst as cst

from porter.rules import registry, rule
from porter.translate.context import PandasCall, RuleContext, Unsupported
from porter.translate.values import Column, Frame, Indexed, Opaque, Scalar, Value

# read_csv options Dask adds to pandas'
_PARTITIONING = ("blocksize", "sample", "sample_rows")

LABELS_REPEAT = ("Dask's row labels start again at 0 in each partition (each file, each 64 MB "
                 "block), so they repeat over the files")


def _delegate(key: str, call: PandasCall, ctx: RuleContext) -> Value:
    return registry()[key](call, ctx)


def _dask_frame(value: Value, many: bool = True) -> Frame:
    if not isinstance(value, Frame):
        raise Unsupported("the read is not a frame porter follows")
    return replace(value, dask=True, dask_many=many, labels_intact=False)


def _one_file(call: PandasCall, name: str) -> bool:
    """The read names one file (no glob, not a list), of one partition: Dask's blocks are 64 MB,
    or blocksize=None (one partition a file)."""
    path = call.const(name, 0, None)
    return isinstance(path, str) and not any(c in path for c in "*?[")


@rule("dd.read_csv")
def read_csv(call: PandasCall, ctx: RuleContext) -> Value:
    """dd.read_csv("data/t-*.csv") -> pl.scan_csv over the same glob (or list of files).

    Handles: the files in the order of their sorted names, as Dask reads them; pandas'
    read_csv options as pd.read_csv takes them (rules/io.py), which Dask passes to pandas for
    each file; blocksize and sample (partitioning only). The row labels repeat over the files
    (each partition starts at 0): a step that writes or reads them is a TODO.
    Caveats: assume_missing=True and include_path_column are TODOs; index_col is not Dask's.
    Dask infers the types from the first file's first 256 kB and stops on a file that does not
    fit them; Polars infers them from the first file too.
    """
    if call.has("index_col"):
        raise ctx.todo("index_col: Dask's read_csv does not take it (set_index after reading)")
    if call.const("include_path_column", None, False) is not False:
        raise ctx.todo("include_path_column: each row's file name as a category column "
                       "(pl.scan_csv(include_file_paths=...) names it with the full path)")
    if call.const("assume_missing", None, False, kinds=(bool,)):
        raise ctx.todo("assume_missing=True: Dask reads integer columns whose type is not given "
                       "as float64")
    kwargs = {k: v for k, v in call.kwargs.items()
              if k not in (*_PARTITIONING, "assume_missing", "include_path_column")}
    one_file = _one_file(call, "urlpath")
    if not one_file and ctx.schema_lookup is None:
        # (with --data porter reads every file and gives the scan the types they share)
        ctx.lower("over several files Polars infers the types from the first file: a column "
                  "blank there is text to it, and the numbers of the later files stay text "
                  "(Dask reads it as float64, 5.0); run with --data", 0.9)
    return _dask_frame(_delegate("pd.read_csv", replace(call, kwargs=kwargs), ctx),
                       many=not one_file)


@rule("dd.read_parquet")
def read_parquet(call: PandasCall, ctx: RuleContext) -> Value:
    """dd.read_parquet("data/*.parquet") -> pl.scan_parquet over the same glob.

    Handles: columns=. Caveats: Dask reads the files in natural order (p-2 before p-10), Polars
    in the order of their names (0.7 over a glob); Dask may make a column the index from pandas'
    metadata in the files (index=None): 0.9; its other options are TODOs.
    """
    ctx.reject_unknown(call, "path", "columns", positional=1)
    ctx.lower("Dask makes the index pandas wrote into the files' metadata the frame's index "
              "again; porter reads the columns as Polars sees them", 0.9)
    if not _one_file(call, "path"):
        ctx.lower("Dask reads the files of a glob in natural order (p-2 before p-10), Polars in "
                  "the order of their names (p-10 before p-2): the same rows in the same order "
                  "where the numbers in the names have the same width (p-02, p-10)", 0.7)
    return _dask_frame(_delegate("pd.read_parquet", call, ctx),
                       many=not _one_file(call, "path"))


@rule("dd.from_pandas")
def from_pandas(call: PandasCall, ctx: RuleContext) -> Value:
    """dd.from_pandas(df, npartitions=n) -> the frame itself (Polars has no partitions).

    Handles: npartitions / chunksize (partitioning only), a frame with its default labels.
    Caveats: sort=True (the default) sorts a frame labelled by a column; that is a TODO.
    """
    ctx.reject_unknown(call, "data", "npartitions", "chunksize", "sort", positional=2)
    frame = call.arg("data", 0)
    if isinstance(frame, Column):
        frame_of = frame.frame
        if frame_of.index or not frame_of.labels_intact:
            raise ctx.todo("a Series with labels: Dask sorts by them (sort=True)")
        return replace(frame, frame=replace(frame_of, dask=True,
                                            dask_many=_several(call)))
    if not isinstance(frame, Frame):
        raise ctx.todo("from_pandas of something porter does not hold as a frame")
    if (frame.index or not frame.labels_intact) and call.const("sort", None, True) is not False:
        raise ctx.todo("sort=True sorts the rows by the frame's labels, which are not 0..n-1 here")
    return replace(frame, dask=True, dask_many=_several(call))


def _several(call: PandasCall) -> bool:
    """from_pandas makes more than one partition (npartitions > 1, or chunksize=)."""
    return call.has("chunksize") or call.const("npartitions", 1, 1) != 1


@rule("dd.frame.compute", "dd.series.compute", "dd.frame.persist", "dd.series.persist",
      "dd.scalar.compute", "dd.scalar.persist")
def compute(call: PandasCall, ctx: RuleContext) -> Value:
    """.compute() -> the same plan (porter collects where the values are needed: a write
    sinks it, a print collects it); .persist() -> the same plan.

    Handles: the computed frame is pandas' from there on (a groupby on it sorts again); a
    reduction's value (ddf.fare.sum().compute()), which porter computes where it is made.
    """
    ctx.reject_unknown(call, "scheduler", "num_workers", "optimize_graph")
    value = call.receiver
    if call.name == "persist":
        return value  # type: ignore[return-value]
    if isinstance(value, Frame):
        return replace(value, dask=False)
    if isinstance(value, Column):
        return replace(value, frame=replace(value.frame, dask=False))
    if isinstance(value, Scalar):
        return value
    raise ctx.todo("compute of a value porter does not follow")


@rule("dd.frame.head", "dd.series.head")
def head(call: PandasCall, ctx: RuleContext) -> Value:
    """ddf.head(n) -> .head(n), computed (pandas' frame from there on).

    Handles: npartitions=-1 (the first n rows of all partitions): exact.
    Caveats: with Dask's default npartitions=1 head reads the first partition only (the
    first file over a glob) and gives fewer than n rows when it has fewer: 0.8.
    """
    ctx.reject_unknown(call, "n", "npartitions", "compute", positional=1)
    if call.const("compute", None, True, kinds=(bool,)) is not True:
        raise ctx.todo("head(compute=False) is a Dask frame of one partition")
    parts = call.const("npartitions", None, 1, kinds=(int,))
    if parts != -1:
        ctx.lower("Dask's head(n) takes rows from the first partition only (npartitions=1; the "
                  "first file of a glob): when it holds fewer than n rows Dask gives fewer, where "
                  "this gives the first n of all the files (head(n, npartitions=-1))", 0.8)
    is_frame = isinstance(call.receiver, Frame)
    result = _delegate("frame.head" if is_frame else "series.head",
                       replace(call, kwargs={k: v for k, v in call.kwargs.items()
                                             if k not in ("npartitions", "compute")}), ctx)
    if isinstance(result, Frame):
        return replace(result, dask=False)
    if isinstance(result, Column):
        return replace(result, frame=replace(result.frame, dask=False))
    return result


@rule("dd.frame.repartition", "dd.series.repartition")
def repartition(call: PandasCall, ctx: RuleContext) -> Value:
    """.repartition(npartitions=n) -> nothing (Polars has no partitions; the rows and their
    order stay).

    Caveats: repartition(divisions=...) and partition_size= move rows between partitions by
    the index: TODOs.
    """
    ctx.reject_unknown(call, "npartitions")
    return call.receiver  # type: ignore[return-value]



@rule("dd.frame.to_csv", "dd.series.to_csv")
def to_csv(call: PandasCall, ctx: RuleContext) -> Value:
    """ddf.to_csv(path, single_file=True) -> sink_csv(path) (pandas' to_csv rule, rules/io.py).

    Caveats: without single_file=True Dask writes one file per partition (the `*` in the name
    numbered 0, 1, ...): a TODO.
    """
    if call.const("single_file", None, False, kinds=(bool,)) is not True:
        raise ctx.todo("Dask writes one file per partition (the `*` of the name numbered 0, 1, "
                       "...) unless single_file=True")
    kwargs = {k: v for k, v in call.kwargs.items() if k not in ("single_file", "compute")}
    if call.const("compute", None, True, kinds=(bool,)) is not True:
        raise ctx.todo("to_csv(compute=False) returns delayed writes")
    return _delegate("frame.to_csv" if isinstance(call.receiver, Frame) else "series.to_csv",
                     replace(call, kwargs=kwargs), ctx)



@rule("dd.frame.reset_index")
def reset_index(call: PandasCall, ctx: RuleContext) -> Value:
    """ddf.reset_index() -> pandas' reset_index rule on a frame labelled by keys (a groupby's
    result, one partition: labels 0..n-1 as pandas).

    Caveats: on a frame of several partitions Dask's new labels start again at 0 in each
    partition: drop=True keeps that mark (a later write of the labels is a TODO); drop=False
    writes them into a column: TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    if frame.index:
        result = _delegate("frame.reset_index", call, ctx)
        return result
    if call.const("drop", None, False, kinds=(bool,)) is not True:
        raise ctx.todo(f"reset_index() writes the row labels into a column: {LABELS_REPEAT}")
    result = _delegate("frame.reset_index", call, ctx)
    return replace(result, labels_intact=False) if isinstance(result, Frame) else result


@rule("dd.series.reset_index")
def series_reset_index(call: PandasCall, ctx: RuleContext) -> Value:
    """s.reset_index() of a Dask Series -> pandas' rule, where the labels are a groupby's keys."""
    column = call.receiver
    assert isinstance(column, Column)
    if not column.frame.index:
        raise ctx.todo(f"reset_index of a column of several partitions: {LABELS_REPEAT}")
    return _delegate("series.reset_index", call, ctx)




# pandas methods that read other rows than the row itself: per partition they see one file's
# rows only, so a function that calls them gives what no whole-frame rewrite gives
_NOT_ROW_WISE = frozenset({
    "sum", "mean", "median", "min", "max", "std", "var", "sem", "quantile", "count", "nunique",
    "size", "prod", "shift", "diff", "pct_change", "cumsum", "cumprod", "cummax", "cummin",
    "rank", "rolling", "expanding", "ewm", "groupby", "sort_values", "sort_index", "head",
    "tail", "drop_duplicates", "duplicated", "value_counts", "transform", "ffill", "bfill",
    "interpolate", "iloc", "loc", "idxmax", "idxmin", "nlargest", "nsmallest", "sample",
    "describe", "unique", "mode", "first", "last", "reset_index", "index", "len", "agg",
    "aggregate", "apply", "pivot_table", "merge", "join", "concat", "fillna", "set_index",
    "reindex", "resample", "explode", "melt", "pivot", "stack", "unstack", "corr", "cov",
    "qcut", "cut", "factorize", "iterrows", "itertuples", "shape", "any", "all",
})


def _names_in(node: ast.AST) -> set[str]:
    found: set[str] = set()
    for sub in ast.walk(node):
        if isinstance(sub, ast.Attribute):
            found.add(sub.attr)
        elif isinstance(sub, ast.Name):
            found.add(sub.id)
    return found


@rule("dd.frame.map_partitions", "dd.series.map_partitions")
def map_partitions(call: PandasCall, ctx: RuleContext) -> Value:
    """ddf.map_partitions(f) -> f's pandas code, ported, on the whole frame, where f works row
    by row (what f does to each partition it then does to the whole).

    Handles: f a function of the script's (one frame parameter) or a lambda, whose body uses
    no method that reads other rows (a reduction, a shift, a sort, a groupby, a fillna...);
    meta= (the result's types, for Dask's planning).
    Caveats: extra arguments, and a function that reads other rows, are TODOs.
    """
    ctx.reject_unknown(call, "func", "meta", "align_dataframes", "enforce_metadata",
                       "transform_divisions", "clear_divisions", positional=1)
    node = call.first_node("func")
    if node is None or ctx.evaluate is None:
        raise ctx.todo("the function is not written in the call")
    if isinstance(node, cst.Lambda):
        code = cst.Module(body=[]).code_for_node(node)
        try:
            tree: ast.AST = ast.parse(code.strip(), mode="eval")
        except SyntaxError:
            raise ctx.todo("the function's code could not be read") from None
    elif isinstance(node, cst.Name) and ctx.function_def is not None \
            and ctx.function_def(node.value) is not None:
        definition = ctx.function_def(node.value)
        code = cst.Module(body=[definition]).code
        tree = ast.parse(code)
    else:
        raise ctx.todo("the function is not the script's own (def or lambda)")
    other_rows = sorted(_names_in(tree) & _NOT_ROW_WISE)
    if other_rows:
        raise ctx.todo(f"the function reads other rows than its own ({', '.join(other_rows)}): "
                       "Dask runs it on each partition (each file) apart, so its result depends "
                       "on how the rows are split")
    receiver = call.receiver
    assert receiver is not None
    if isinstance(node, cst.Lambda):
        params = node.params.params
        if len(params) != 1 or node.params.star_arg not in (None, cst.MaybeSentinel.DEFAULT) \
                or node.params.kwonly_params or node.params.posonly_params:
            raise ctx.todo("a lambda of other than one parameter")
        result = ctx.evaluate(node.body, {params[0].name.value: receiver})
    else:
        applied = cst.Call(func=node, args=[cst.Arg(value=cst.Name("__porter_partition"))])
        result = ctx.evaluate(applied, {"__porter_partition": receiver})
    if any(site.status == "todo" for site in getattr(result, "sites", ())
           if site not in receiver.sites):
        raise ctx.todo("the function's pandas code does not port")
    if isinstance(result, Frame):
        # (a filter keeps or drops each row by itself: per partition as on the whole frame)
        return replace(result, dask=True)
    if isinstance(result, Column) and isinstance(receiver, (Frame, Column)):
        return result
    if isinstance(result, (Indexed, Opaque)):
        raise ctx.todo("the function's result is not a frame or column porter follows")
    raise ctx.todo("the function's result is not a frame or column porter follows")
