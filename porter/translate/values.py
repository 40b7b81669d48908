"""Symbolic values: what a pandas expression stands for, and the Polars code it becomes.

The translator evaluates each pandas expression into one of these before it decides what to
write (see docs/design.md, "evaluating pandas code symbolically").
"""

from __future__ import annotations

from dataclasses import dataclass, field, replace
import itertools
from typing import Any, ClassVar

from porter.emit.code import Code
from porter.model import SiteDraft

_tokens = itertools.count(1)


def fresh_token() -> int:
    """A new identity for a set of rows or a column version."""
    return next(_tokens)


MISSING: Any = object()


@dataclass(frozen=True)
class Value:
    code: Code
    sites: tuple[SiteDraft, ...] = field(default=(), kw_only=True)

    def with_sites(self, *sites: SiteDraft) -> Any:
        return replace(self, sites=self.sites + tuple(sites))


@dataclass(frozen=True)
class Frame(Value):
    """A LazyFrame-valued expression standing for a pandas DataFrame.

    rows      identity of the rows: two frames with the same token have the same rows in the
              same order, so a column of one is an expression of the other.
    columns   column names in order, when known.
    dtypes    porter's dtype names ("int", "float", "str", "bool", "datetime", "date",
              "category" for a Polars Categorical made like astype("category"), "enum" for
              the ordered labels of pd.cut) for the columns whose type is known.
    versions  per column, a token that changes when the column is overwritten.
    index     the columns that hold what pandas keeps in the index (after a groupby);
              empty for a default RangeIndex.
    labels_intact
              the RangeIndex still reads 0..n-1 (no filter, sort or slice since it was made).
    """

    rows: int = field(default_factory=fresh_token, kw_only=True)
    columns: tuple[str, ...] | None = field(default=None, kw_only=True)
    dtypes: tuple[tuple[str, str], ...] = field(default=(), kw_only=True)
    versions: tuple[tuple[str, int], ...] = field(default=(), kw_only=True)
    index: tuple[str, ...] = field(default=(), kw_only=True)
    labels_intact: bool = field(default=True, kw_only=True)
    binding: int | None = field(default=None, kw_only=True)  # the assignment that named it
    index_unnamed: bool = field(default=False, kw_only=True)  # pandas' index has no name
    # the name pandas gives the columns of a pivoted table (pivot_table(columns="sp"): "sp"),
    # which .T, .stack() and print show
    columns_name: str | None = field(default=None, kw_only=True)
    # a pivot of several value columns (pivot_table(values=[...], columns=k)): pandas labels
    # its columns by two levels, the value column then the key's value; Polars names them
    # "<value>_<key value>" (the pivot's own names). Each value column, in pandas' order
    value_levels: tuple[str, ...] = field(default=(), kw_only=True)
    # the type of the key whose values label the columns of a pivoted table (unstack): the
    # labels stack brings back as a column
    columns_kind: str | None = field(default=None, kw_only=True)
    # columns pandas labels with the integers 0, 1, … (Polars names them "0", "1", …)
    number_labels: tuple[str, ...] = field(default=(), kw_only=True)
    # columns pandas labels with a (column, function) pair of MultiIndex columns, flattened
    # here to "column_function": each flat name with its pair
    column_pairs: tuple[tuple[str, tuple[str, str]], ...] = field(default=(), kw_only=True)
    # the rows token under which the rows are pandas' groupby(sort=True) result: each
    # combination of the index keys once, none missing, their labels made in sorted order
    # (what unstack lays out); a filter or sort since gives the frame other rows
    grouped_rows: int | None = field(default=None, kw_only=True)
    # pandas made the levels of the index in the order it met the keys (a groupby(sort=False)
    # on two or more keys), not sorted as set_index makes them; unstack lays them out so
    levels_as_met: bool = field(default=False, kw_only=True)
    # pandas' groupby(dropna=False) on two or more keys made a missing key a value of its level
    # (sorted last), where set_index codes it as missing: sort_index and unstack read the two
    # differently, so a hand-over makes the levels as the groupby made them
    levels_with_missing: bool = field(default=False, kw_only=True)
    # the rows are sorted ascending by all the index keys, as sort_index() leaves them
    # (pandas' MultiIndex is then lexsorted: its levels can be sliced): the rows token and
    # each key with its version then (sorted_by_keys); any other rows, keys or values of a
    # key since, and it no longer holds
    sorted_rows: tuple[Any, ...] | None = field(default=None, kw_only=True)

    def sorted_mark(self) -> tuple[Any, ...]:
        """What sorted_rows holds while the rows are sorted by the index keys as they are."""
        versions = dict(self.versions)
        return (self.rows, tuple((k, versions.get(k)) for k in self.index))

    def sorted_by_keys(self) -> bool:
        return self.sorted_rows is not None and self.sorted_rows == self.sorted_mark()
    # a pivot (pivot_table, crosstab, unstack) on an integer key made the columns not named
    # here: pandas labels them with the key's values (2024), Polars names them as text
    # ("2024"); the names here (the index keys, a margin, columns written since) are text in
    # both. None: no such columns
    int_labels_except: tuple[str, ...] | None = field(default=None, kw_only=True)
    # integer columns pandas holds as float64 when a step gave them a missing value, which
    # depends on the data (a merge left a row unmatched, where() without other): Polars keeps
    # Int64 with nulls, and the run-time checks (PANDAS_CSV_INTS, astype(str), printing) read
    # those nulls. Each with what made it so; a step that removes the nulls (fillna, dropna, a
    # filter, a group key) lowers its confidence and clears the mark (lost_float_ints)
    float_ints: tuple[tuple[str, str], ...] = field(default=(), kw_only=True)
    # columns whose type porter does not know but which hold numbers, int64 or float64 as the
    # data decides, with Polars' type pandas' own (a merge that may leave a row unmatched made
    # an int column Float64 where it did: rules/merge.py), each with the column's version
    # then; a column written since is no longer one (context.holds_numbers)
    numbers: tuple[tuple[str, Any], ...] = field(default=(), kw_only=True)
    # columns pandas holds as its nullable integers (astype("Int64"), dtype={"c": "Int64"},
    # dt.isocalendar() parts), each with pandas' dtype name: with a missing value pandas
    # writes and prints them as ints (2024, <NA>) where a plain int column is float64 (2024.0,
    # nan). None when porter does not know which columns are (a frame built by a step that
    # does not follow them, or back from pandas); `unsure_ints` names the columns of a known
    # frame that a step wrote without saying (see context.nullable_mark)
    nullable_ints: tuple[tuple[str, str], ...] | None = field(default=None, kw_only=True)
    unsure_ints: tuple[str, ...] = field(default=(), kw_only=True)
    # a pivoted table whose columns porter does not know (unstack, crosstab) holds numbers in
    # every column but its index keys: the code of the frame that is that table (a step since
    # writes other code, so the mark no longer holds; context.number_cells) and the cells'
    # type ("int", "float", or None when it depends on the data)
    number_cells: tuple[str, str | None] | None = field(default=None, kw_only=True)
    # a pivot on a date key whose new columns are named here by the dates written with this
    # strftime format, as the statement after it names them (df.columns =
    # df.columns.strftime(format)); pandas labels them with the dates until then
    dates_as_text: str | None = field(default=None, kw_only=True)
    # a Dask DataFrame (dd.read_csv over a glob, ...) until .compute() makes it pandas':
    # groupby leaves its groups in the order met, head() reads the first partition, and the
    # methods only Dask has are the `dd.frame.*` keys (rules/dask.py)
    dask: bool = field(default=False, kw_only=True)
    # a Dask frame that may have several partitions (read over a glob or a list of files):
    # a merge of two such frames shuffles their rows (rules/dask.py)
    dask_many: bool = field(default=False, kw_only=True)
    # no two rows share a label (pandas' row labels of a frame without an index of its own,
    # or the one key of its index): the rows token and the index keys for which that was
    # shown, a filter or sort of a frame whose labels are 0..n-1 or distinct
    # (labels_distinct), value counts. A step that gives other rows makes a new token, and
    # one that labels the rows otherwise (set_index) other index keys, so the mark no longer
    # holds unless that step says so again
    distinct_labels: tuple[int, tuple[str, ...]] | None = field(default=None, kw_only=True)
    # every row of another frame, in another order (a sort of it): this frame's rows token
    # and the other's (reordered_from). A Series computed on this frame is set into the other
    # by each row's place there, as pandas aligns it on the (distinct) labels
    reorders: tuple[int, int] | None = field(default=None, kw_only=True)

    def labels_distinct(self) -> bool:
        """No two rows share a label (the frame has no index of its own, and no Dask
        partitions, whose labels restart in each)."""
        if self.index or self.dask:
            return False
        return self.labels_intact or self.distinct_labels == (self.rows, ())

    def reordered_from(self) -> int | None:
        """The rows token of the frame whose rows this one holds, all of them, in another
        order (a sort), or None."""
        if self.reorders is not None and self.reorders[0] == self.rows:
            return self.reorders[1]
        return None

    def dtype(self, column: str) -> str | None:
        return dict(self.dtypes).get(column)

    def version(self, column: str) -> int:
        return dict(self.versions).get(column, 0)


@dataclass(frozen=True)
class Column(Value):
    """A pandas Series that is a column expression over `frame`.

    `code` is the Polars expression (for example `pl.col("kg") * 2`). `null_is_false` marks a
    boolean expression that is null where pandas has False (a comparison with a missing value),
    so it needs `fill_null(False)` before it is negated or used as a value.
    """

    frame: Frame = field(kw_only=True)
    name: str | None = field(default=None, kw_only=True)
    dtype: str | None = field(default=None, kw_only=True)
    null_is_false: bool = field(default=False, kw_only=True)
    refs: frozenset[str] = field(default=frozenset(), kw_only=True)
    versions: tuple[tuple[str, int], ...] = field(default=(), kw_only=True)
    element: bool = field(default=False, kw_only=True)  # the parameter of a lambda: one value
    python_int: bool = field(default=False, kw_only=True)  # int() of one value: a Python int
    binding: int | None = field(default=None, kw_only=True)  # the assignment that named it
    # an integer column pandas holds as float64 when a value went missing (Frame.float_ints):
    # what made it so, or None
    float_int: str | None = field(default=None, kw_only=True)
    # pandas' nullable integer dtype of the column ("Int64", "UInt32"; Frame.nullable_ints),
    # NOT_NULLABLE when it is known not to be one, None when porter does not know
    nullable_int: str | None = field(default=None, kw_only=True)
    # of a type porter does not know, but numbers, int64 or float64 as the data decides, with
    # Polars' type pandas' own (Frame.numbers)
    number: bool = field(default=False, kw_only=True)
    # the values of a pandas Index (s.index, df.index of one key) and what is computed from
    # them: an Index has no labels, so idx[0] is the first value by position (never the row
    # whose key is 0), and it goes over to pandas as an Index, not a Series labelled by itself
    index_values: bool = field(default=False, kw_only=True)


# Column.nullable_int of a column known not to be one of pandas' nullable integers
NOT_NULLABLE = ""


@dataclass(frozen=True)
class Grouped(Value):
    """A pending groupby: `code` is the frame being grouped (or a prepared LazyGroupBy)."""

    frame: Frame = field(kw_only=True)
    keys: tuple[str, ...] = field(kw_only=True)
    sort: bool = field(default=True, kw_only=True)
    dropna: bool = field(default=True, kw_only=True)
    as_index: bool = field(default=True, kw_only=True)
    # group_keys=False: only apply reads it (a result like-indexed to the groups keeps no keys)
    group_keys: bool = field(default=True, kw_only=True)
    selection: tuple[str, ...] | None = field(default=None, kw_only=True)
    single: bool = field(default=False, kw_only=True)
    prepared: bool = field(default=False, kw_only=True)  # `code` is already a LazyGroupBy
    # the keys were given as a list (`groupby(["k"])`): pandas' group keys are tuples then
    key_list: bool = field(default=False, kw_only=True)
    # grouped by a computed Series (`df.groupby(df["ts"].dt.date)`), made a key column of
    # `frame`: pandas' own groupby for code porter hands over, and whether the key's name is
    # a column the key hides (pandas still aggregates that column)
    pandas: Code | None = field(default=None, kw_only=True)
    hides_column: bool = field(default=False, kw_only=True)
    # kept in a name while its frame's name is changed in place later (df["c"] = ...): pandas'
    # DataFrameGroupBy sees the frame as it is at each use, so each use groups the frame held
    # then (a groupby with a column taken holds that column as it was, and is not live)
    live: bool = field(default=False, kw_only=True)


@dataclass(frozen=True)
class Scalar(Value):
    """A plain Python value computed from a frame (already collected in `code`)."""

    # kept as it is (only its code becomes the name) when bound to a name: what it says holds
    # for as long as its frame's rows do (a row label's position: rules/groupby.RowPosition)
    kept_when_bound: ClassVar[bool] = False

    pytype: str | None = field(default=None, kw_only=True)
    agg: Column | None = field(default=None, kw_only=True)  # the reduction as an expression of its frame
    of: Frame | None = field(default=None, kw_only=True)  # the frame it describes (its column names)
    # the value as a Polars expression usable in any frame (a constant: pl.duration(days=7) for
    # pd.Timedelta(days=7)); `code` stays the plain Python value for code outside expressions
    expr: Code | None = field(default=None, kw_only=True)
    # an array of pandas' values (unique() of text or categories): "text" when its items are
    # text with nan for a missing one, which a loop variable over it keeps (context.expr_in)
    items: str | None = field(default=None, kw_only=True)
    # the list of a column's values (list(s), s.tolist()) as written where it is made (a name
    # bound to it loses the mark: the list may change in place)
    values_of: "Column | None" = field(default=None, kw_only=True)


@dataclass(frozen=True)
class PandasValue(Value):
    """A real pandas object at run time: code porter handed over to pandas.

    rows      set when the object is a Series with one value per row of the frame with these
              rows, in the same order and under the same labels (an element-wise or window
              result of one of its columns): only then can it be put back by position.
    """

    rows: int | None = field(default=None, kw_only=True)
    # a name holding a frame that a statement kept on pandas changed: the frame as porter knew
    # it afterwards, so that the next statement porter can rewrite takes it back to Polars
    frame: "Frame | None" = field(default=None, kw_only=True)
    # df.loc[label] of a table labelled by key columns: (the rows picked in Polars, the
    # label), so that a reduction of the row can be computed without pandas
    label_rows: "tuple[Frame, Any] | None" = field(default=None, kw_only=True)


@dataclass(frozen=True)
class Module(Value):
    """The pandas or numpy module (or a function imported from it)."""

    qualname: str = field(kw_only=True)


@dataclass(frozen=True)
class Accessor(Value):
    """`series.str` / `series.dt`, or a window (`series.rolling(3)`, `series.expanding()`):
    waiting for its method. `options` are a window's arguments as the rule read them (keyword
    names pandas takes), so a hand-over to pandas can make the same window."""

    column: Column = field(kw_only=True)
    kind: str = field(kw_only=True)
    options: tuple[tuple[str, Any], ...] = field(default=(), kw_only=True)
    # `df.index` of a table indexed by one date key: its dt methods are the DatetimeIndex's;
    # anything else is handed over as pandas' index of the frame (not a Series' .dt)
    index_of: "Frame | None" = field(default=None, kw_only=True)


@dataclass(frozen=True)
class Indexer(Value):
    """`df.loc` / `df.iloc` (or a Series' `s.iloc`, `column` set): waiting for its subscript."""

    frame: Frame = field(kw_only=True)
    kind: str = field(kw_only=True)
    column: "Column | None" = field(default=None, kw_only=True)


@dataclass(frozen=True)
class Parts(Value):
    """The DataFrame pandas makes of one column's text (`s.str.extract(pat)`,
    `s.str.split(sep, expand=True)`): each of its columns is an expression over the rows of
    `source`'s frame, so a subscript (`parts[0]`, `parts["name"]`) is a Column of that frame.

    `code` is the whole result as one Polars expression (a struct or a list per row); `fields`
    maps pandas' labels to a struct field of it (empty for a list: label i is list element i);
    `singles` the code of each label when `code` is not kept in a name (`str.extract(pat, 1)`);
    `width_known`: pandas' number of columns is len(fields) whatever the data (extract), not
    the parts of the longest row (split); `pandas` recomputes the DataFrame for code that needs
    the pandas object; `bound`: `code` is a name holding the expression.
    """

    source: "Column" = field(kw_only=True)
    fields: tuple[tuple[Any, str], ...] = field(default=(), kw_only=True)
    singles: tuple[tuple[Any, Code], ...] = field(default=(), kw_only=True)
    width_known: bool = field(default=False, kw_only=True)
    pandas: Code = field(kw_only=True)
    bound: bool = field(default=False, kw_only=True)
    binding: int | None = field(default=None, kw_only=True)  # the assignment that named it
    # the result as a Polars frame, where its columns are kept in the text's frame
    # (engine.parts_as_columns): what reads it as a whole (parts.head()) reads this
    whole: "Frame | None" = field(default=None, kw_only=True)
    # parts that are pandas' nullable integers (s.dt.isocalendar(): year Int32, week and day
    # UInt32), by label, with that dtype name; the other parts are text
    ints: tuple[tuple[Any, str], ...] = field(default=(), kw_only=True)


@dataclass(frozen=True)
class Opaque(Value):
    """Anything porter does not model; `const` holds its value when it is a literal."""

    const: Any = field(default=MISSING, kw_only=True)
    node: Any = field(default=None, kw_only=True, compare=False)  # the libcst node, for lambdas
    pytype: str | None = field(default=None, kw_only=True)  # "str" for a loop over names
    # the texts a function's parameter receives from its calls, when each call passes one
    choices: tuple[str, ...] = field(default=(), kw_only=True)

    @property
    def is_const(self) -> bool:
        return self.const is not MISSING


@dataclass(frozen=True)
class Items(Value):
    """A list or tuple written out in the code that holds pandas values (frames to concatenate)."""

    items: tuple[Value, ...] = field(kw_only=True)
    brackets: str = field(default="[]", kw_only=True)
    # per item, the pandas code that keeps its row labels when it is handed over (a filtered
    # frame written inline: pandas runs the filter), or None
    labelled: tuple[Code | None, ...] = field(default=(), kw_only=True)


@dataclass(frozen=True)
class FrameList(Value):
    """A list the script fills with frames by `append` for pd.concat (analysis.frame_lists):
    a Python list of LazyFrames at run time. `members` are the frames appended to it, as
    porter knows them (their columns and types)."""

    members: tuple["Frame", ...] = field(kw_only=True)


@dataclass(frozen=True)
class BoundMethod(Value):
    """`receiver.name` waiting to be called."""

    receiver: Value = field(kw_only=True)
    name: str = field(kw_only=True)


@dataclass(frozen=True)
class TimeGrouperSpec:
    """What `pd.Grouper(key="ts", freq="D")` says, kept as the constant of the Opaque value
    the call evaluates to (rules/resample.py), so it survives a list (`["station", grouper]`)
    and a name. `source` is the call as written: its repr, so a list of keys holding one is
    written out as pandas code again."""

    key: str
    freq: str
    source: str

    def __repr__(self) -> str:
        return self.source


@dataclass(frozen=True)
class Resampled(Value):
    """`df.resample(rule, on="ts")` or `df.groupby([..., pd.Grouper(key="ts", freq=rule)])`,
    waiting for its aggregation (keys `resample.<method>`, rules/resample.py). `code` is the
    pandas object itself (the frame handed over, resampled or grouped the same way), so code
    porter does not port gets what pandas made; `frame` is the Polars side.

    keys      the group keys in order, the time column among them (the bins' labels)
    time      the time column, grouped by bins of `freq`
    fill      pandas makes every bin between the first and the last (resample, or a groupby
              on the Grouper alone), of each group for groupby().resample(); beside other
              keys in a groupby it makes only the bins rows fall in
    time_order
              each bin's rows are in time order (first / last read it), as resample and a
              groupby on a Grouper not in a list sort them; in a list they keep the frame's
    """

    frame: Frame = field(kw_only=True)
    keys: tuple[str, ...] = field(kw_only=True)
    time: str = field(kw_only=True)
    freq: str = field(kw_only=True)
    fill: bool = field(kw_only=True)
    time_order: bool = field(default=True, kw_only=True)
    as_index: bool = field(default=True, kw_only=True)
    selection: tuple[str, ...] | None = field(default=None, kw_only=True)
    single: bool = field(default=False, kw_only=True)
    key_prefix: str = field(default="resample", kw_only=True)


@dataclass(frozen=True)
class Indexed(Value):
    """`df.set_index("ts")`: a frame whose row labels are one of its columns, waiting for a
    call porter ports with them (rules/resample.py: resample, groupby().resample,
    reset_index). `code` is the pandas object itself (the frame handed over, set_index as
    written), so code porter does not port gets what pandas made; `frame` is the Polars side,
    the column still in it.

    key       the column that became the row labels
    grouped   the keys of a groupby on the indexed frame (only resample follows it)
    """

    frame: Frame = field(kw_only=True)
    key: str = field(kw_only=True)
    grouped: tuple[str, ...] = field(default=(), kw_only=True)
    selection: tuple[str, ...] | None = field(default=None, kw_only=True)
    single: bool = field(default=False, kw_only=True)
    key_prefix: str = field(default="indexed", kw_only=True)


PANDAS_KINDS = (Frame, Column, Grouped, Accessor, Indexer, Items, BoundMethod, Parts, Resampled,
                Indexed)


def is_pandas(value: Value) -> bool:
    """A value that stands for a pandas object porter models (and must not leak as is)."""
    return isinstance(value, PANDAS_KINDS)
