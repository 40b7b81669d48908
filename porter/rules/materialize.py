"""Values out of a frame: s.values, s.to_numpy(), s.tolist(), df.values, df.to_numpy().

These need the data, so they are where porter writes a collect.
"""

from __future__ import annotations

from dataclasses import replace

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.translate import handover
from porter.translate.context import PandasCall, RuleContext, Unsupported
from porter.translate.values import Column, Frame, Opaque, Scalar, Value
from porter.rules.selection import nullable_values_lower


def _series(column: Column) -> Code:
    expr = column.code.method("fill_null", False) if column.null_is_false else column.code
    return column.frame.code.method("select", expr).method("collect").method("to_series")


# porter does not know whether pandas holds the column as a nullable integer (astype("Int64"))
NULLABLE_INT_VALUES = ("the script uses pandas' nullable integers, and porter does not know "
                       "whether this column is one: with a missing value, pandas' nullable column gives ints and "
                       "<NA> ([1, <NA>, 3]), this gives floats and nan ([1.0, nan, 3.0]) as "
                       "a plain one does")


@rule("series.values", "series.to_numpy", "series.tolist", "series.to_list")
def series_values(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.values / to_numpy() / tolist() -> collect the column, .to_numpy() (.tolist()).

    Handles: missing numbers become nan (Polars' to_list would give None), and integer columns
    with missing values become float, as in pandas; a text column's values are pandas' own
    (to_pandas()): a missing text is nan there (true, and 'nan' as text), None in Polars;
    tolist() of True/False with a missing value gives nan for it (pandas' object column).
    A column pandas holds as one of its nullable integers (astype("Int64"), isocalendar())
    gives pandas' own values (to_pandas() with its dtype): ints and <NA>. tolist() of dates,
    times and durations gives pandas' Timestamps, datetime.date objects and Timedeltas, NaT for
    a missing one (to_pandas()); values of dates is pandas' object array of them.
    Categories (pd.cut, astype("category")) are pandas' Categorical: nan for a missing label.
    values of True/False with a missing value is pandas' object array, nan for it.
    Caveats: values of a column of unknown type give None for a missing text where pandas
    gives nan (its tolist() gives nan); in a script that names pandas' nullable string,
    boolean or float types a missing value may be <NA> in pandas (0.8).
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call)
    if column.nullable_int and not column.element:
        ctx.handover = True  # pandas' own values: ints and <NA> ([1, <NA>, 3])
        code = handover.to_pandas(column)
        if call.name == "values":
            return Scalar(code.attr("values"), pytype="array")
        return Scalar(code.method(call.name), pytype="list" if call.name in ("tolist", "to_list")
                      else "array")
    nullable_values_lower(column, ctx)  # pandas' nullable text, True/False, floats: <NA>
    if column.dtype in ("datetime", "duration", "date") and not column.element \
            and (call.name in ("tolist", "to_list") or column.dtype == "date"):
        # pandas' own values: tolist() gives Timestamps and Timedeltas (Polars' datetime and
        # timedelta print otherwise) and NaT for a missing one (Polars: None); dates are
        # datetime.date objects in an object array (Polars' to_numpy: datetime64[D])
        ctx.handover = True
        code = handover.to_pandas(column)
        if call.name == "values":
            return Scalar(code.attr("values"), pytype="array")
        return Scalar(code.method(call.name), pytype="list" if call.name in ("tolist", "to_list")
                      else "array")
    if column.dtype == "str":
        ctx.handover = True
        if call.name == "values":
            # pandas 3's text values are its own ArrowStringArray (printed and compared as
            # such), not a numpy array
            return Scalar(_series(column).method("to_pandas").attr("values"), pytype="array")
        # pandas' own values where a text is missing (nan for it, as the script reads it);
        # otherwise Polars' texts, the same str objects in a list or an object array
        code = emit.call(handover.VALUES_FUNCTION, _series(column))
        if call.name in ("tolist", "to_list"):
            return Scalar(code.method("to_list"), pytype="list", values_of=column)
        return Scalar(code.method("to_numpy"), pytype="array")
    if column.dtype in ("category", "enum") and not column.element:
        # pandas' Categorical: tolist() and to_numpy() give the labels and nan for a missing
        # one (Polars' to_numpy gives None), values is the Categorical itself
        ctx.handover = True
        code = _series(column).method("to_pandas")
        if call.name == "values":
            return Scalar(code.attr("values"), pytype="array")
        return Scalar(code.method("tolist" if call.name == "to_list" else call.name),
                      pytype="list" if call.name in ("tolist", "to_list") else "array")
    if column.dtype == "bool" and not column.null_is_false and call.name in ("values", "to_numpy"):
        # True/False with a missing value is an object array in pandas holding nan (Polars'
        # to_numpy gives None); without one a bool array, as to_pandas gives it
        ctx.handover = True
        return Scalar(_series(column).method("to_pandas").method("fillna", emit.atom('float("nan")'))
                      .method("to_numpy"), pytype="array")
    if (column.dtype in ("bool", None) and not column.null_is_false or column.dtype is not None
            and column.dtype.startswith("list[")) and call.name in ("tolist", "to_list"):
        # True/False with a missing value is an object column in pandas: its nan, not None
        # lists as lists (to_numpy would give numpy arrays), a missing one nan as in pandas;
        # a column of unknown type as numpy gives it (a number column's nan, an integer one
        # with a missing value float), a missing text or True/False nan as in pandas
        if column.dtype is None:
            if ctx.nullable_ints_possible and column.nullable_int is None:
                ctx.lower(NULLABLE_INT_VALUES, 0.9)
            values = _series(column).method("to_numpy").method("tolist")
        else:
            values = _series(column).method("to_list")
        return Scalar(Code(f"[float(\"nan\") if v is None else v for v in {values.text}]"),
                      pytype="list")
    if column.dtype not in ("int", "float", "bool"):
        ctx.lower("a missing text value is None here, nan in pandas", 0.95)
    if column.dtype in ("int", None) and ctx.nullable_ints_possible and column.nullable_int is None:
        ctx.lower(NULLABLE_INT_VALUES, 0.9)
    code = _series(column).method("to_numpy")
    if call.name in ("tolist", "to_list"):
        return Scalar(code.method("tolist"), pytype="list")
    return Scalar(code, pytype="array")


@rule("builtin.list")
def builtin_list(call: PandasCall, ctx: RuleContext) -> Value:
    """list(s) -> s.tolist(): pandas iterates a Series as tolist() gives it (Python numbers,
    Timestamps, nan for a missing value)."""
    if not isinstance(call.receiver, Column) or call.args or call.kwargs:
        raise Unsupported("list() of anything but a Series")
    return series_values(replace(call, name="tolist"), ctx)


@rule("series.items")
def series_items(call: PandasCall, ctx: RuleContext) -> Value:
    """s.items() -> (label, value) pairs of the collected key and value columns, on a Series
    labelled by one key (a groupby's, df.sum()'s column names).

    Handles: whole numbers and floats as Python numbers (pandas gives numpy's, which print,
    format and compute alike), nan for a missing float; text keys and numbers as keys.
    Other values (text that may be missing, dates) are pandas' own: the Series is handed over
    for the loop (to_pandas().items()).
    Caveats: row numbers as labels (a frame's column) and labels of several keys are TODOs."""
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call)
    frame = column.frame
    if len(frame.index) != 1:
        raise ctx.todo("labels that are row numbers or several keys: zip the label columns "
                       "and the values of the collected frame")
    key = frame.index[0]
    if column.dtype in ("int", "float") and frame.dtype(key) in ("int", "str") \
            and not column.nullable_int and column.float_int is None:
        value = column.code if column.dtype == "int" else column.code.method(
            "fill_null", emit.atom('float("nan")'))  # pandas' nan for a missing float
        name = column.name if column.name is not None else "0"
        if value.text != emit.col(name).text:
            value = value.method("alias", name)
        pairs = frame.code.method("select", key, value).method("collect").method("iter_rows")
        return Scalar(pairs, pytype="iterator")
    ctx.handover = True  # pandas' own values (nan for a missing text, Timestamps)
    return Scalar(handover.to_pandas(column).method("items"), pytype="iterator")


@rule("frame.values", "frame.to_numpy")
def frame_values(call: PandasCall, ctx: RuleContext) -> Value:
    """DataFrame.values / to_numpy() -> collect, .to_numpy() for numbers; the array pandas
    makes (to_pandas().to_numpy()) for anything else.

    Handles: missing numbers become nan; a frame of numbers only is Polars' own array; text,
    dates beside other columns (pandas keeps Timestamps in an object array, Polars casts them
    to numbers) and columns of unknown type are handed to pandas for the array, which gives
    pandas' values exactly (dates of s.dt.date as datetime.date objects).
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call)
    if frame.index:
        raise ctx.todo("the frame's index columns would be included (they are not in pandas' values)")
    numbers = frame.dtypes and all(t in ("int", "float", "bool") for _, t in frame.dtypes) \
        and frame.columns is not None and len(frame.dtypes) == len(frame.columns)
    if numbers:
        return Scalar(frame.code.method("collect").method("to_numpy"), pytype="array")
    ctx.handover = True  # pandas' own array: object cells as pandas holds them
    # dates (s.dt.date) are datetime.date objects in pandas, Timestamps from to_pandas()
    dates = {"date_as_object": True} if any(t == "date" for _, t in frame.dtypes) else {}
    return Scalar(frame.code.method("collect").method("to_pandas", **dates).method("to_numpy"),
                  pytype="array")



@rule("series.to_dict")
def series_to_dict(call: PandasCall, ctx: RuleContext) -> Value:
    """Series.to_dict() -> the collected labels and values made a dict by pandas:
    frame.select(key, col).collect().to_pandas().set_index(key)[col].to_dict().

    Handles: the key of a groupby or value_counts result (one key), or the row number of a
    frame labelled 0..n-1; the values are pandas' own (an integer column with a missing value
    is float, a missing value nan, dates Timestamps, dates of s.dt.date datetime.date objects;
    pandas' nullable integers ints and None), as is each key. Only the labels and the
    column cross to pandas, once, where the dict is made.
    Caveats: labels of several keys (tuples in pandas) and a frame whose labels are no longer
    0..n-1 are TODOs.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call)
    frame = column.frame
    name = column.name if isinstance(column.name, str) else None
    expr = column.code.method("fill_null", False) if column.null_is_false else column.code
    if name is None and len(frame.index) == 1 and frame.index[0] != "0":
        name = "0"  # an unnamed Series (df.isna().sum()): its values under a name of their own
    if len(frame.index) == 1 and name is not None and name not in frame.index:
        key = frame.index[0]
        value = name if expr.text == emit.col(name).text else expr.method("alias", name)
        code = frame.code.method("select", key, value).method("collect")
        # pandas' dates (s.dt.date) are datetime.date objects, which to_pandas makes Timestamps
        code = code.method("to_pandas", date_as_object=True) if "date" in (
            frame.dtype(key), column.dtype) else code.method("to_pandas")
        if column.nullable_int and column.dtype == "int":  # pandas' nullable integers: 1, None
            code = code.method("astype", {name: column.nullable_int})
        if frame.dtype(key) in ("bool", None):
            # a missing True/False key is nan in pandas (an object column), None from Polars;
            # a key of unknown type may be one (nan fills nothing else: text, numbers, dates
            # and categories are missing as nan or NaT already)
            code = code.method("fillna", {key: emit.atom('float("nan")')})
        code = code.method("set_index", key).index(name).method("to_dict")
    elif not frame.index and frame.labels_intact:
        code = _series(column).method("to_pandas", **({"date_as_object": True}
                                                      if column.dtype == "date" else {}))
        if column.nullable_int and column.dtype == "int":  # pandas' nullable integers: 1, None
            code = code.method("astype", column.nullable_int)
        code = code.method("to_dict")
    else:
        raise ctx.todo("the row labels are several keys, or no longer 0..n-1: collect the label "
                       "columns and the values and build the dict with zip")
    ctx.handover = True  # pandas makes the dict: its own keys and values
    return Scalar(code, pytype="dict")


@rule("frame.to_dict")
def frame_to_dict(call: PandasCall, ctx: RuleContext) -> Value:
    """df.to_dict(orient) -> the collected frame made a dict by pandas:
    frame.collect().to_pandas().to_dict(orient).

    Handles: orient "records" and "list" (the row labels are not in them) of any frame; the
    default "dict" and "index", "series", "split", "tight" (they hold the labels) of a frame
    labelled 0..n-1 or by labels porter tracks (a groupby's keys, set_index, the row labels a
    filter or sort left), restored as pandas' index; the values are pandas' own (an integer
    column with a missing value is float, a missing value nan, dates Timestamps). The frame
    crosses to pandas once, where the dict is made.
    Caveats: into= and a frame whose labels porter lost are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "orient", "index", positional=1)
    orient = call.const("orient", 0, "dict", kinds=(str,))
    if orient not in ("dict", "list", "series", "split", "tight", "records", "index"):
        raise ctx.todo(f"orient={orient!r} (pandas raises)")
    if orient not in ("records", "list") and not frame.index and not frame.labels_intact:
        raise ctx.todo("the dict holds the row labels, which are no longer 0..n-1 here: "
                       "reset_index() first, or use orient=\"records\"")
    if orient == "series":
        raise ctx.todo("orient=\"series\" holds pandas Series: collect and build the dict of "
                       "columns")
    ctx.handover = True  # pandas makes the dict: its own keys and values
    options = {"index": call.const("index", None)} if call.has("index") else {}
    return Scalar(handover.to_pandas(frame).method("to_dict", orient, **options), pytype="dict"
                  if orient != "records" else "list")


@rule("frame.itertuples")
def frame_itertuples(call: PandasCall, ctx: RuleContext) -> Value:
    """for row in df.itertuples(): -> the rows of the collected frame, made into named tuples
    by pandas: frame.collect().to_pandas().itertuples(...).

    Handles: index= and name= as pandas takes them; the row label first (Index) where the
    frame is labelled 0..n-1 or by labels porter tracks (a groupby's keys, set_index, the
    row labels a filter or sort left); the values are pandas' own (an integer column with a
    missing value is float, a missing value nan, dates Timestamps). The frame crosses to pandas
    once, where the loop starts.
    Caveats: the labels of a frame porter lost (index=True after a step it cannot follow) are
    a TODO.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "index", "name", positional=2)
    index = call.const("index", 0, True)
    if index is not False and not frame.index and not frame.labels_intact:
        raise ctx.todo("each tuple starts with the row label, which is no longer 0..n-1 here: "
                       "reset_index(drop=True) first, or pass index=False")
    ctx.handover = True  # pandas makes the tuples: its own values
    options = {name: call.const(name, None) for name in ("index", "name") if call.has(name)}
    return Scalar(handover.to_pandas(frame).method("itertuples", **options), pytype="iterator")


@rule("series.iloc")
def series_position(call: PandasCall, ctx: RuleContext) -> Value:
    """s.iloc[i] -> the value at position i (pl.col(c).get(i)), as pandas gives it: a numpy
    number, text, True/False, a datetime; a negative position counts from the end in both, and
    a position past the end raises in both.

    A printed value of pandas' nullable integers is pandas' own (<NA> for a missing one); a
    text is pandas' own (nan for a missing one), a missing text again inside expressions.
    A datetime is pandas' Timestamp (NaT for a missing one), read through to_pandas(); a
    True/False with a missing value in its column is pandas' Python bool, nan for the missing
    one (its object column), a numpy bool otherwise.
    Caveats: slices, lists of positions and a position computed at run time are TODOs.
    """
    from porter.rules.groupby import pandas_scalar, scalar_of  # groupby builds on the values taken here
    column = call.receiver
    assert isinstance(column, Column)
    key = call.args[0] if len(call.args) == 1 else None
    if not (isinstance(key, Opaque) and isinstance(key.const, int) and not isinstance(key.const, bool)):
        raise ctx.todo("a position other than one whole number written in the script (slices "
                       "are head / tail / slice of the frame)")
    if column.dtype not in ("int", "float", "str", "bool", "datetime") or column.element:
        raise ctx.todo("a value of a column whose type porter does not know")
    nullable_values_lower(column, ctx)  # pandas' nullable text, True/False, floats: <NA>
    if column.nullable_int and column.dtype == "int" and not column.frame.index and ctx.shown:
        # printed: pandas' nullable integers give np.int64, or <NA> for a missing value
        ctx.handover = True
        return Scalar(handover.to_pandas(column).attr("iloc").index(key.const), pytype="int")
    value = column.code.method("fill_null", False) if column.null_is_false else column.code
    expr = value.method("get", key.const)
    if column.dtype == "str":
        # the value as pandas gives it: a missing text is nan (Polars' item() gives None),
        # which a file name or a printed line shows; only the one value crosses to pandas.
        # Inside Polars expressions it is a missing text again (context.expr_in: "text")
        ctx.handover = True
        one = emit.call(handover.VALUES_FUNCTION, column.frame.code.method("select", expr)
                        .method("collect").method("to_series")).index(0)
        return replace(scalar_of(column, expr, None), code=one, pytype="text")
    if column.dtype == "bool" and not column.null_is_false:
        # True/False with a missing value is an object column in pandas: a Python bool, or nan
        # for the missing one (item() gave None); without one pandas' numpy bool. Whether the
        # column has one decides, so the column is read whole
        one = column.frame.code.method("select", value).method("collect").method("to_series") \
            .method("to_pandas").method("fillna", emit.atom('float("nan")')).attr("iloc") \
            .index(key.const)
        return replace(scalar_of(column, expr, None), code=one)
    if column.dtype == "datetime":
        # pandas' value: a Timestamp (its normalize(), quarter, day_name() are there), NaT for
        # a missing one; item() gave a Python datetime and None (printed "None")
        return pandas_scalar(column, expr, "datetime")
    return scalar_of(column, expr, column.dtype if column.dtype in ("int", "float") else None)
