"""Time bins: `df.resample(rule, on="ts")` and `df.groupby([..., pd.Grouper(key="ts",
freq=rule)])` followed by an aggregation (sum, mean, count, size, agg, ...).

Each row's bin is a Polars expression of its timestamp that gives the bin's label as pandas
labels it, so the rows are grouped by the label (group_by, not group_by_dynamic: pandas' bins
do not overlap and a row falls in exactly one). pandas' defaults are kept:

- fixed-length rules (D, nD, h, nh, min, s) are closed and labelled on the left, their bins
  counted from midnight of the first timestamp's day (origin="start_day"): a `dt.truncate`
  where the length divides a day (the bins are then the same from any midnight), otherwise
  the first midnight plus whole bins;
- W (W-MON … W-SUN), ME, QE, YE are closed and labelled on the right, and pandas moves the
  right edge to the end of that day, so a row belongs to its date's period whatever its time of day
  (Sunday 12:00 is in the week ending that Sunday); MS, QS, YS are closed and labelled on the
  left;
- rows with a missing timestamp are left out, the result is ordered by the label;
- resample and a groupby on a Grouper given alone sort the rows by time (stably) before they
  bin them, so first / last are the earliest / latest values of a bin; a Grouper in a list
  keeps the frame's order (pandas 3.1 does so);
- resample (and a groupby on the Grouper alone) makes every bin between the first and the last:
  the labels are made with `pl.datetime_ranges` and the aggregates joined onto them, empty bins
  filled as pandas fills them (0 for sum, count, size and nunique, '' for the sum of text,
  missing otherwise); beside other keys pandas makes only the bins rows fall in.

The result keeps the time column's name; pandas holds it (with the other keys) in the index,
which the frame records (Frame.index), as for a groupby's result.
"""

from __future__ import annotations

from dataclasses import dataclass, replace
import re
from typing import Any

from porter.emit import code as emit
from porter.emit.code import Code
from porter.rules import rule
from porter.rules.groupby import (
    UntypedColumns, agg_dtype, agg_expr, agg_with_sums, how_name, lower_for_group_spread,
)
from porter.rules.legacy import modern_offset
from porter.rules.ops import float32_possible
from porter.translate import handover
from porter.translate.context import PandasCall, RuleContext, Unsupported, column_names, derive, labelled_frame
from porter.translate.values import (
    Column, Frame, Grouped, Indexed, Opaque, Resampled, TimeGrouperSpec, Value, fresh_token,
)

RESAMPLE_AGGREGATIONS = ("sum", "mean", "median", "min", "max", "count", "size", "first", "last",
                         "nunique", "std", "var")
# aggregations whose empty bin pandas fills with 0 (the sum with its default min_count=0)
_ZERO_WHEN_EMPTY = {"sum", "count", "size", "nunique"}

# fixed-length rules: pandas' alias -> (Polars' duration unit, pl.duration's keyword,
# Duration's total_* method, seconds)
_TICKS = {"D": ("d", "days", "total_days", 86400), "h": ("h", "hours", "total_hours", 3600),
          "min": ("m", "minutes", "total_minutes", 60), "s": ("s", "seconds", "total_seconds", 1)}
_WEEKDAYS = {"MON": 1, "TUE": 2, "WED": 3, "THU": 4, "FRI": 5, "SAT": 6, "SUN": 7}  # Polars' numbers
_ANCHORED = {
    # rule: (label of a timestamp t from its period's start, range interval, end-anchored)
    "MS": ("1mo", 1, False), "ME": ("1mo", 1, True),
    "QS": ("1q", 3, False), "QS-JAN": ("1q", 3, False), "QS-APR": ("1q", 3, False),
    "QS-JUL": ("1q", 3, False), "QS-OCT": ("1q", 3, False),
    "QE": ("1q", 3, True), "QE-DEC": ("1q", 3, True), "QE-MAR": ("1q", 3, True),
    "QE-JUN": ("1q", 3, True), "QE-SEP": ("1q", 3, True),
    "YS": ("1y", 12, False), "YS-JAN": ("1y", 12, False),
    "YE": ("1y", 12, True), "YE-DEC": ("1y", 12, True),
}


@dataclass(frozen=True)
class Bins:
    """How a rule's bins are written in Polars."""

    freq: str
    closed: str  # pandas' default closed= and label= for the rule
    label: Any  # (time column code) -> the bin label of each row
    interval: str  # pl.datetime_ranges' interval between two labels (or two periods' starts)
    end_anchored: bool = False  # labels are month ends: the range runs over the months' starts
    caveat: str | None = None  # where the rewrite may differ (lowers the confidence)
    renamed: str | None = None  # the script's alias, which pandas 3 spells `freq` ("M": "ME")
    from_first: bool = False  # bins counted from the first timestamp's midnight (several days)
    business: bool = False  # labels are each month's last weekday (BME; "BM" in older pandas)

    def labels(self, time: Code) -> Code:
        return self.label(time)

    def every_label(self, time: str) -> Code:
        """Every label from the first to the last, as one column named `time`."""
        first, last = emit.col(time).method("min"), emit.col(time).method("max")
        if self.end_anchored:
            first, last = first.attr("dt").method("month_start"), last.attr("dt").method("month_start")
        code = emit.pl("datetime_ranges", first, last, self.interval).method("explode") \
            .method("drop_nulls")
        if self.end_anchored:
            code = code.attr("dt").method("month_end")
        if self.business:
            code = _last_weekday(code)
        return code.method("alias", time)


def _last_weekday(month_end: Code) -> Code:
    """The last weekday (Monday to Friday) on or before a month's last day: pandas'
    BusinessMonthEnd knows no holidays."""
    return month_end.attr("dt").method("add_business_days", 0, roll="backward")


def bins_of(freq: object) -> Bins:
    """The bins of a rule pandas 3.1 reads, or a TODO saying why not. An alias older pandas
    read and pandas 3.1 rejects ("M", "15T", "A-JUN") is read as the offset pandas 3.1 spells
    otherwise ("ME", "15min", "YE-JUN"): what the script meant where it ran."""
    modern = modern_offset(freq)
    if modern is not None:
        try:
            return replace(bins_of(modern), renamed=str(freq))
        except Unsupported as error:
            raise Unsupported(f"{error} (the script's {freq!r}, which pandas 3.1 rejects, "
                              f"is {modern!r} now)") from None
    if not isinstance(freq, str):
        raise Unsupported("the rule must be written out as text (an offset object or a "
                          "Timedelta is not read by porter)")
    match = re.fullmatch(r"(\d*)(D|h|min|s)", freq)
    if match:
        n = int(match.group(1) or 1)
        if n < 1:
            raise Unsupported(f"rule {freq!r}")
        unit, keyword, total, seconds = _TICKS[match.group(2)]
        length = n * seconds
        if 86400 % length == 0:
            # bins that divide a day are the same counted from any midnight (pandas counts
            # from the first timestamp's, dt.truncate from 1970-01-01's)
            return Bins(freq, "left", lambda t: t.attr("dt").method("truncate", f"{n}{unit}"),
                        f"{n}{unit}")

        def counted(t: Code) -> Code:
            # pandas' origin="start_day": whole bins from midnight of the first timestamp's day
            origin = t.method("min").attr("dt").method("truncate", "1d")
            elapsed = emit.binop(t, "-", origin).attr("dt").method(total)
            whole = emit.binop(emit.binop(elapsed, "//", n), "*", n)
            return emit.binop(origin, "+", emit.pl("duration", **{keyword: whole}))
        caveat = None
        if unit == "d":
            caveat = ("with a time zone, pandas counts bins of several days in calendar days "
                      "across a daylight-saving change, porter in hours (the same without one)")
        return Bins(freq, "left", counted, f"{n}{unit}", caveat=caveat, from_first=True)
    week = re.fullmatch(r"W(?:-(MON|TUE|WED|THU|FRI|SAT|SUN))?", freq)
    if week:
        target = _WEEKDAYS[week.group(1) or "SUN"]

        def week_end(t: Code) -> Code:
            # the week ending on the target day that holds the row's date (the right edge
            # covers that whole day in pandas)
            days = emit.binop(emit.binop(target, "-", t.attr("dt").method("weekday")), "%", 7)
            return emit.binop(t.attr("dt").method("truncate", "1d"), "+", emit.pl("duration", days=days))
        return Bins(freq, "right", week_end, "1w")
    if freq == "BME":
        def business_month_end(t: Code) -> Code:
            # the month's last weekday that is on or after the row's day (the right edge covers
            # that whole day in pandas): this month's, or next month's for a day after it
            day = t.attr("dt").method("truncate", "1d")
            this = _last_weekday(day.attr("dt").method("month_end"))
            following = _last_weekday(day.attr("dt").method("month_start").attr("dt")
                                      .method("offset_by", "1mo").attr("dt").method("month_end"))
            return emit.when(emit.binop(day, ">", this), following, this)
        return Bins(freq, "right", business_month_end, "1mo", end_anchored=True, business=True)
    if freq in _ANCHORED:
        period, months, end = _ANCHORED[freq]

        def anchored(t: Code) -> Code:
            start = t.attr("dt").method("truncate", period)
            if not end:
                return start
            if months > 1:
                start = start.attr("dt").method("offset_by", f"{months - 1}mo")
            return start.attr("dt").method("month_end")  # the period's last day, at midnight
        return Bins(freq, "right" if end else "left", anchored, f"{months}mo", end_anchored=end)
    raise Unsupported(f"rule {freq!r}: porter ports D, h, min, s (and multiples), "
                      "W / W-MON … W-SUN, MS, ME, BME, QS, QE, YS, YE (business days, semi-months, "
                      "multiples of weeks or months and lower-case spellings are not ported)")


def _check_options(call: PandasCall, bins: Bins) -> None:
    """closed=, label= and origin= as pandas' defaults for the rule; anything else is a TODO."""
    for name in ("closed", "label"):
        value = call.const(name, None, None)
        if value is not None and value != bins.closed:
            raise Unsupported(f"{name}={value!r} (porter ports the rule's default, "
                              f"{bins.closed!r})")
    origin = call.const("origin", None, "start_day")
    if origin != "start_day":
        raise Unsupported(f"origin={origin!r} (porter ports the default, 'start_day')")


# -- making the resampler ------------------------------------------------------------------------

@rule("frame.resample")
def resample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.resample(rule, on="ts") -> time bins waiting for an aggregation (`resample.sum` ...).

    Handles: the rules D, h, min, s and their multiples, W / W-MON … W-SUN, MS, ME, BME, QS, QE,
    YS, YE
    with pandas' closed= and label= (given or not) and origin="start_day"; the old names
    pandas 3 rejects (M, Q, Y / A, AS, H, T, S) as the rules they name (legacy.py).
    Caveats: resampling the index (no on=), other closed / label / origin, offset=,
    convention=, kind=, group_keys= and business-day rules are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "rule", "on", "closed", "label", "origin", positional=1)
    if not call.has("on"):
        raise ctx.todo("resampling the index: porter ports resample(rule, on=column)")
    on = call.const("on", None, kinds=(str,))
    _not_periods(frame, on, ctx)
    bins = _bins_checked(call, ctx)
    if frame.index:
        raise ctx.todo("the frame keeps an index (after a groupby): call reset_index() first")
    pandas = handover.to_pandas(frame).method(
        "resample", bins.freq, on=on,
        **{k: call.const(k, None) for k in ("closed", "label", "origin") if call.has(k)})
    return Resampled(pandas, frame=frame, keys=(on,), time=on, freq=bins.freq, fill=True)


@rule("pd.Grouper")
def grouper(call: PandasCall, ctx: RuleContext) -> Value:
    """pd.Grouper(key="ts", freq=rule) -> what groupby reads to group by time bins.

    Handles: a column and a rule as df.resample reads them.
    Caveats: level=, a Grouper without freq (a plain key), closed / label / origin other than
    the rule's defaults, offset=, sort=, dropna= and convention= are TODOs.
    """
    ctx.reject_unknown(call, "key", "freq", "closed", "label", "origin", positional=1)
    key = call.const("key", 0, None, kinds=(str,))
    if key is None:
        raise ctx.todo("a Grouper of the index (no key=): porter ports key=column")
    if not call.has("freq"):
        raise ctx.todo("a Grouper without freq= groups by the column's values")
    bins = _bins_checked(call, ctx, "freq")
    if call.node is None:
        raise ctx.todo("the Grouper's text is not known")
    spec = TimeGrouperSpec(key, bins.freq, _grouper_source(call, key, bins.freq))
    return Opaque(emit.atom(spec.source), const=spec)


def _grouper_source(call: PandasCall, key: str, freq: str) -> str:
    """pd.Grouper(...) as pandas code: the script's own name for the module, the arguments."""
    node = call.node
    func = getattr(node, "func", None)
    parts = []
    while func is not None and hasattr(func, "attr"):
        parts.append(func.attr.value)
        func = func.value
    if func is not None and hasattr(func, "value") and isinstance(func.value, str):
        parts.append(func.value)
    name = ".".join(reversed(parts)) or "pd.Grouper"
    options = {k: call.const(k, None) for k in ("closed", "label", "origin") if call.has(k)}
    return emit.call(name, key=key, freq=freq, **options).text


@rule("frame.groupby.grouper")
def groupby_grouper(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby([..., pd.Grouper(key="ts", freq=rule)]) -> time bins and keys, to aggregate.

    Waits for an aggregation (`resample.sum` ...); groupby(pd.Grouper(...)) alone and
    groupby(["station", pd.Grouper(...)]) alike.

    Handles: the Grouper alone makes every bin between the first and the last, as resample
    does; beside other keys only the bins rows fall in (pandas makes no empty ones there);
    rows with a missing key or timestamp left out (dropna=True); keys sorted (sort=True);
    as_index=False.
    Caveats: sort=False, dropna=False and two Groupers are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "by", "sort", "dropna", "as_index", "observed", positional=1)
    by = call.const("by", 0)
    if isinstance(by, tuple):
        raise ctx.todo("keys given as a tuple")
    keys_given = list(by) if isinstance(by, list) else [by]
    specs = [k for k in keys_given if isinstance(k, TimeGrouperSpec)]
    if len(specs) != 1:
        raise ctx.todo("two Groupers among the keys")
    if not all(isinstance(k, (str, TimeGrouperSpec)) for k in keys_given):
        raise ctx.todo("keys other than column names beside the Grouper")
    if call.const("sort", None, True) is not True:
        raise ctx.todo("sort=False: pandas orders the bins as it meets them")
    if call.const("dropna", None, True) is not True:
        raise ctx.todo("dropna=False keeps rows with a missing key")
    as_index = call.const("as_index", None, True, kinds=(bool,))
    spec = specs[0]
    _not_periods(frame, spec.key, ctx)
    keys = tuple(k.key if isinstance(k, TimeGrouperSpec) else k for k in keys_given)
    if len(set(keys)) != len(keys):
        raise ctx.todo("the time column is also a plain key")
    if frame.index:
        raise ctx.todo("the frame keeps an index (after a groupby): call reset_index() first")
    if any(frame.dtype(k) == "category" for k in keys):
        raise ctx.todo("category keys: pandas adds the categories no row has")
    options = {} if as_index else {"as_index": False}
    pandas = handover.to_pandas(frame).method("groupby", by, **options)
    # pandas sorts the rows by time for a Grouper given alone, not for one in a list (even a
    # list of one): first / last read that order
    return Resampled(pandas, frame=frame, keys=keys, time=spec.key, freq=spec.freq,
                     fill=len(keys) == 1, time_order=isinstance(by, TimeGrouperSpec),
                     as_index=bool(as_index))


# -- a frame indexed by its time column ---------------------------------------------------------

@rule("frame.set_index")
def set_index(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts") -> the frame, "ts" kept as a column, for the calls porter ports
    with the row labels: resample(rule), groupby(keys).resample(rule), reset_index().

    Handles: one column as the labels (drop=True, the default).
    Caveats: any other use of the labels (.loc by label, join, alignment, the index written
    out) is a TODO on the frame pandas makes; several keys, drop=False, append=True and
    verify_integrity=True are TODOs.
    """
    frame = call.receiver
    assert isinstance(frame, Frame)
    ctx.reject_unknown(call, "keys", "drop", "append", "verify_integrity", positional=1)
    key = call.const("keys", 0, None)
    named = [key] if isinstance(key, str) else key if isinstance(key, list) else []
    if frame.index and call.const("append", None, False) is False and frame.columns is not None \
            and all(isinstance(k, str) and k not in frame.index for k in named):
        # the new labels replace the index (the row labels a filter or sort left, a groupby's
        # keys), which pandas drops: the columns holding it go
        frame = replace(frame, code=frame.code.method("drop", *frame.index), index=(),
                        index_unnamed=False,
                        columns=tuple(c for c in frame.columns if c not in frame.index),
                        dtypes=tuple((c, t) for c, t in frame.dtypes if c not in frame.index),
                        float_ints=tuple(m for m in frame.float_ints if m[0] not in frame.index),
                        grouped_rows=None, sorted_rows=None, levels_as_met=False,
                        levels_with_missing=False)
    if isinstance(key, list) and len(key) > 1 and all(isinstance(k, str) for k in key) \
            and len(set(key)) == len(key) and call.const("drop", None, True) is True \
            and call.const("append", None, False) is False \
            and call.const("verify_integrity", None, False) is False \
            and not frame.index and frame.columns is not None and set(key) <= set(frame.columns):
        # set_index(["a", "b"]): the table labelled by both keys, held first as its index
        # (as a groupby's keys are; not known to be distinct nor sorted)
        return labelled_frame(frame, tuple(key))
    if not isinstance(key, str):
        raise ctx.todo("keep the key as a column; select or filter on it instead of index "
                       "labels (porter ports one column as the labels, for resample)")
    for name, default in (("drop", True), ("append", False), ("verify_integrity", False)):
        if call.const(name, None, default) is not default:
            raise ctx.todo(f"{name}= other than {default}")
    if frame.index:
        raise ctx.todo("the frame keeps an index (after a groupby): call reset_index() first")
    if frame.columns is not None and key not in frame.columns:
        raise ctx.todo(f"{key!r} is not a column of the frame (pandas raises KeyError)")
    return Indexed(handover.to_pandas(frame).method("set_index", key), frame=frame, key=key)


def _indexed(call: PandasCall) -> Indexed:
    assert isinstance(call.receiver, Indexed)
    return call.receiver


@rule("indexed.reset_index")
def indexed_reset_index(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts").reset_index() -> the column first, as pandas puts the labels back;
    reset_index(drop=True) -> the frame without it."""
    indexed = _indexed(call)
    frame, key = indexed.frame, indexed.key
    ctx.reject_unknown(call, "drop")
    if call.const("drop", None, False):
        columns = tuple(c for c in frame.columns if c != key) if frame.columns is not None else None
        return derive(frame, frame.code.method("drop", key), same_rows=True, columns=columns,
                      labels_intact=True)
    if frame.columns is not None:
        columns = (key, *(c for c in frame.columns if c != key))
        code = frame.code if columns == frame.columns else frame.code.method("select", *columns)
        return derive(frame, code, same_rows=True, columns=columns, labels_intact=True)
    code = frame.code.method("select", key, emit.pl("exclude", key))
    return derive(frame, code, same_rows=True, labels_intact=True)


@rule("indexed.resample")
def indexed_resample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts").resample(rule) -> as df.resample(rule, on="ts")."""
    indexed = _indexed(call)
    ctx.reject_unknown(call, "rule", "closed", "label", "origin", positional=1)
    _not_periods(indexed.frame, indexed.key, ctx)
    bins = _bins_checked(call, ctx)
    return Resampled(indexed.code.method("resample", bins.freq, **_options(call)),
                     frame=indexed.frame, keys=(indexed.key,), time=indexed.key,
                     freq=bins.freq, fill=True)


@rule("series.resample")
def series_resample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts")["kg"].resample(rule) -> as df.resample(rule, on="ts")["kg"]: a column
    of a table labelled by one datetime column (set_index, read_csv(index_col=)), resampled
    on its labels.

    Caveats: a Series labelled otherwise (0..n-1, several keys, a groupby's keys of another
    type), or computed rather than taken from the table, is a TODO.
    """
    column = call.receiver
    assert isinstance(column, Column)
    ctx.reject_unknown(call, "rule", "closed", "label", "origin", positional=1)
    frame = column.frame
    if len(frame.index) != 1 or frame.index_unnamed or frame.dtype(frame.index[0]) != "datetime":
        raise ctx.todo("a Series not labelled by one datetime column (set_index(\"ts\") first)")
    key = frame.index[0]
    name = column.name
    if not isinstance(name, str) or name == key or column.code.text != emit.col(name).text \
            or column.element or (frame.columns is not None and name not in frame.columns):
        raise ctx.todo("a Series computed from the table, not one of its columns")
    _not_periods(frame, key, ctx)
    bins = _bins_checked(call, ctx)
    plain = replace(frame, index=(), index_unnamed=False, labels_intact=False)
    pandas = handover.to_pandas(column).method("resample", bins.freq, **_options(call))
    return Resampled(pandas, frame=plain, keys=(key,), time=key, freq=bins.freq, fill=True,
                     selection=(name,), single=True)


@rule("indexed.groupby")
def indexed_groupby(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts").groupby(keys) -> the groups, waiting for resample(rule)."""
    indexed = _indexed(call)
    ctx.reject_unknown(call, "by", positional=1)
    by = call.const("by", 0, None)
    keys = [by] if isinstance(by, str) else by
    if not (isinstance(keys, list) and keys and all(isinstance(k, str) for k in keys)):
        raise ctx.todo("keys other than column names")
    if indexed.key in keys or len(set(keys)) != len(keys):
        raise ctx.todo("the labels' column among the keys")
    if any(indexed.frame.dtype(k) == "category" for k in keys):
        raise ctx.todo("category keys: pandas adds the categories no row has")
    return replace(indexed, code=indexed.code.method("groupby", by), grouped=tuple(keys),
                   key_prefix="indexed.groupby", sites=())


@rule("indexed.groupby.getitem")
def indexed_groupby_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """…groupby(keys)["kg"] / [["kg", "price"]] -> the columns to resample."""
    indexed = _indexed(call)
    key = call.args[0]
    if not (isinstance(key, Opaque) and isinstance(key.const, (str, list))):
        raise ctx.todo("selecting columns by a computed key")
    names = column_names(key.const, "the selected columns")
    if set(names) & {*indexed.grouped, indexed.key}:
        raise ctx.todo("selecting the labels' column or a group key")
    return replace(indexed, code=indexed.code.index(key.const), selection=tuple(names),
                   single=isinstance(key.const, str), sites=())


@rule("indexed.groupby.resample")
def indexed_groupby_resample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.set_index("ts").groupby(keys).resample(rule) -> time bins within each group.

    Handles: every bin from each group's first timestamp to its last (pandas resamples each
    group on its own), the groups sorted by their keys, rows with a missing key or
    timestamp left out, each bin's rows in time order; a column selected before.
    Caveats: bins of several days (counted from each group's first day) are TODOs.
    """
    indexed = _indexed(call)
    ctx.reject_unknown(call, "rule", "closed", "label", "origin", positional=1)
    _not_periods(indexed.frame, indexed.key, ctx)
    bins = _bins_checked(call, ctx)
    return _group_bins(indexed.code.method("resample", bins.freq, **_options(call)),
                       indexed.frame, indexed.grouped, indexed.key, bins, indexed.selection,
                       indexed.single, ctx)


@rule("groupby.resample")
def groupby_resample(call: PandasCall, ctx: RuleContext) -> Value:
    """df.groupby(keys).resample(rule, on="ts") -> as set_index("ts").groupby(keys).resample."""
    grouped = call.receiver
    assert isinstance(grouped, Grouped)
    ctx.reject_unknown(call, "rule", "on", "closed", "label", "origin", positional=1)
    if not call.has("on"):
        raise ctx.todo("resampling the index: porter ports resample(rule, on=column)")
    on = call.const("on", None, kinds=(str,))
    if not (grouped.sort and grouped.dropna and grouped.as_index) or grouped.prepared:
        raise ctx.todo("groupby options other than the defaults before resample")
    if on in grouped.keys or (grouped.selection and on in grouped.selection):
        raise ctx.todo("the time column among the keys or the selected columns")
    if grouped.frame.index:
        raise ctx.todo("the frame keeps an index (after a groupby): call reset_index() first")
    if any(grouped.frame.dtype(k) == "category" for k in grouped.keys):
        raise ctx.todo("category keys: pandas adds the categories no row has")
    _not_periods(grouped.frame, on, ctx)
    bins = _bins_checked(call, ctx)
    pandas = handover.to_pandas(grouped).method("resample", bins.freq, on=on, **_options(call))
    return _group_bins(pandas, grouped.frame, grouped.keys, on, bins, grouped.selection,
                       grouped.single, ctx)


def _not_periods(frame: Frame, time: str, ctx: RuleContext) -> None:
    """A column of periods (dt.to_period) is binned by pandas with period frequencies ("M" is
    still the month there, and "ME" is refused): porter bins timestamps only."""
    dtype = frame.dtype(time)
    if isinstance(dtype, str) and dtype.startswith("period"):
        raise ctx.todo(f"{time!r} holds periods ({dtype}): pandas resamples them by period "
                       "frequency; porter bins timestamps")


def _bins_checked(call: PandasCall, ctx: RuleContext, name: str = "rule") -> Bins:
    bins = bins_of(call.const(name, 0 if name == "rule" else None))
    _check_options(call, bins)
    if bins.caveat:
        ctx.lower(bins.caveat, 0.95)
    if bins.renamed:
        # pandas 2.2 renamed the alias and pandas 3 rejects the old name: the same offset
        ctx.lower(f"{bins.renamed!r} is read as {bins.freq!r}, its name since pandas 2.2 "
                  "(pandas 3.1 rejects the old one)", 1.0)
    return bins


def _options(call: PandasCall) -> dict[str, Any]:
    return {k: call.const(k, None) for k in ("closed", "label", "origin") if call.has(k)}


def _group_bins(pandas: Code, frame: Frame, keys: tuple[str, ...], time: str, bins: Bins,
                selection: tuple[str, ...] | None, single: bool, ctx: RuleContext) -> Resampled:
    if bins.from_first:
        raise ctx.todo(f"bins of {bins.freq} are counted from each group's first day: porter "
                       "ports bins that divide a day, weeks, months, quarters and years here")
    return Resampled(pandas, frame=frame, keys=(*keys, time), time=time, freq=bins.freq,
                     fill=True, selection=selection, single=single)


@rule("resample.getitem")
def resample_getitem(call: PandasCall, ctx: RuleContext) -> Value:
    """r["kg"] / r[["kg", "price"]] -> the columns to aggregate."""
    resampled = _resampled(call)
    key = call.args[0]
    if not (isinstance(key, Opaque) and isinstance(key.const, (str, list))):
        raise ctx.todo("selecting columns by a computed key")
    names = column_names(key.const, "the selected columns")
    if set(names) & set(resampled.keys):
        raise ctx.todo("selecting the time column or a group key")
    single = isinstance(key.const, str)
    return replace(resampled, code=resampled.code.index(key.const), selection=tuple(names),
                   single=single, sites=())


def _resampled(call: PandasCall) -> Resampled:
    assert isinstance(call.receiver, Resampled)
    return call.receiver


# -- aggregating ---------------------------------------------------------------------------------

def _targets(resampled: Resampled) -> list[str] | None:
    """The columns aggregated; None when they are every column but the keys and porter does
    not know the frame's columns."""
    if resampled.selection is not None:
        return list(resampled.selection)
    if resampled.frame.columns is None:
        return None
    return [c for c in resampled.frame.columns if c not in resampled.keys]


def _others(resampled: Resampled) -> Code:
    """Every column but the keys, for a frame whose columns porter does not know."""
    return emit.pl("all").method("exclude", *resampled.keys)


@dataclass
class _Output:
    name: str  # the output's name
    expr: Code
    how: str
    dtype: str | None  # of the aggregated column
    column: str | None = None  # the aggregated column, when the output is named after it
    others: Code | None = None  # every column but the keys (their names not known)

    def aliased(self) -> Code:
        if self.others is not None or self.column == self.name:
            return self.expr
        return self.expr.method("alias", self.name)

    def output(self) -> Code:
        return self.others if self.others is not None else emit.col(self.name)


def _binned(resampled: Resampled, outputs: list[_Output], ctx: RuleContext,
            *, series: bool, series_name: str | None) -> Value:
    """The aggregates per bin (and per other key), as pandas makes them."""
    frame = resampled.frame
    bins = bins_of(resampled.freq)
    time = resampled.time
    code = frame.code
    if resampled.time_order and any(o.how in ("first", "last") or o.how in ("sum", "mean")
                                    and o.dtype == "float" for o in outputs):
        # pandas sorts the rows by time (stably) before it bins them: first / last are the
        # earliest / latest values of the bin, not the first / last rows of the frame, and a
        # float sum adds the bin's values in time order (pandas_group_sums follows the order)
        code = code.method("sort", time, maintain_order=True)
    # each row's label, before rows are left out: pandas counts fixed bins from the first
    # timestamp of every row (a row whose other key is missing included)
    code = code.method("with_columns", bins.labels(emit.col(time)).method("alias", time))
    code = code.method("drop_nulls", emit.names_arg(resampled.keys))
    # a resample (and a Grouper alone) bins rows sorted by time, within the other keys: pandas
    # adds a bin's floats with numpy's reduceat there unless a value is missing
    binned_in_order = tuple(k for k in resampled.keys if k != time) if resampled.time_order \
        else None
    code = agg_with_sums(code.method("group_by", emit.names_arg(resampled.keys)),
                         *(o.aliased() for o in outputs), sorted_within=binned_in_order,
                         untyped=UntypedColumns(frame))
    dtypes: list[str | None] = [agg_dtype(o.how, o.dtype) for o in outputs]
    if any(o.how == "sum" and o.dtype is None for o in outputs):
        # a sum of a column of unknown type may be a sum of True/False: UInt32 in Polars
        code = code.method("with_columns", emit.atom("pl.selectors.unsigned_integer()").method(
            "cast", emit.atom("pl.Int64")))
    others = [k for k in resampled.keys if k != time]
    if resampled.fill and others:
        # groupby().resample(): every bin from each group's first to its last, the groups in
        # the order of their keys
        keys_text = emit.names_arg(others)
        code = code.method("pipe", emit.atom(
            f"lambda binned: binned.group_by({emit.render(keys_text)})"
            f".agg({bins.every_label(time).text}).explode({emit.lit(time).text})"
            f".sort({emit.render(emit.names_arg(resampled.keys))}).join(binned, "
            f"on={emit.render(emit.names_arg(resampled.keys))}, how=\"left\", "
            "maintain_order=\"left\")"))
    elif resampled.fill:
        code = code.method("pipe", emit.atom(
            f"lambda binned: binned.select({bins.every_label(time).text}).join("
            f"binned, on={emit.lit(time).text}, how=\"left\", maintain_order=\"left\")"))
    if resampled.fill:
        fills = []
        for o in outputs:
            if o.how in _ZERO_WHEN_EMPTY:
                # pandas' sum of no values is 0 (min_count=0), '' for text; a count is 0
                empty: object = "" if o.how == "sum" and o.dtype == "str" else 0
                fills.append(o.output().method("fill_null", emit.as_expr(empty)))
            elif o.dtype not in ("float", "str", "datetime", "date") and o.how in (
                    "min", "max", "first", "last"):
                ctx.lower(f"{o.how} of a column of whole numbers (or of unknown type): pandas "
                          "makes it float when a bin is empty, Polars keeps integers with a "
                          "missing value (the values match)", 0.95)
        if fills:
            code = code.method("with_columns", *fills)
    else:
        code = code.method("sort", emit.names_arg(resampled.keys))
    names = [o.name for o in outputs if o.others is None]
    keys = list(resampled.keys)
    known = [(k, frame.dtype(k)) for k in keys if k != time] + [(time, "datetime")]
    known += list(zip(names, dtypes))
    rows = fresh_token()
    index = tuple(keys) if resampled.as_index else ()
    unknown = any(o.others is not None for o in outputs)
    result = Frame(code, columns=None if unknown else (*keys, *names), index=index,
                   labels_intact=not resampled.as_index,
                   dtypes=tuple((c, t) for c, t in known if t is not None), rows=rows,
                   grouped_rows=rows if index else None)
    if series and resampled.as_index:
        return Column(emit.col(names[0]), frame=result, name=series_name, refs=frozenset(names),
                      dtype=result.dtype(names[0]))
    return result


@rule(*(f"resample.{how}" for how in RESAMPLE_AGGREGATIONS))
def resample_reduce(call: PandasCall, ctx: RuleContext) -> Value:
    """r.sum() / mean / ... / var -> the aggregation per bin, every bin from the first to the last.

    The aggregations: sum, mean, median, min, max, count, size, first, last, nunique, std, var.

    Handles: missing values skipped as pandas skips them; first / last in the order pandas
    bins the rows (by time for resample and a Grouper alone); an empty bin gets 0 from sum,
    count, size and nunique ('' from the sum of text), a missing value otherwise; int sums stay
    int, counts and sizes int, means float; ddof= for std / var.
    Caveats: min / max / first / last of whole numbers are float in pandas when a bin is empty
    (Polars keeps integers with a missing value: 0.95); min_count=, numeric_only=True and
    skipna= are TODOs.
    """
    resampled = _resampled(call)
    how = call.name
    ctx.reject_unknown(call, *(("ddof", "numeric_only") if how in ("std", "var") else
                               ("numeric_only",)))
    if call.const("numeric_only", None, False) is not False:
        raise ctx.todo("numeric_only=True needs the column types")
    ddof = call.const("ddof", None, 1, kinds=(int,))
    if how == "size":
        name = resampled.selection[0] if resampled.single and resampled.selection else None
        output = _Output(name or "size", emit.pl("len").method("cast", emit.atom("pl.Int64")),
                         "size", None)
        return _binned(resampled, [output], ctx, series=True, series_name=name)
    columns = _targets(resampled)
    if columns is None:
        ctx.lower("the non-key columns are not known: text columns would fail in Polars "
                  "(pandas joins or raises); run with --data to know them", 0.85)
        others = _others(resampled)
        lower_for_group_spread(ctx, how, None)
        expr = agg_expr(others, how) if ddof == 1 or how not in ("std", "var") else \
            others.method(how, ddof=ddof)
        return _binned(resampled, [_Output("*", expr, how, None, others=others)], ctx,
                       series=False, series_name=None)
    outputs = []
    for column in columns:
        dtype = resampled.frame.dtype(column)
        lower_for_group_spread(ctx, how, dtype)
        expr = agg_expr(emit.col(column), how, dtype, float32=float32_possible(ctx))
        if how in ("std", "var") and ddof != 1:
            expr = emit.col(column).method(how, ddof=ddof)
        outputs.append(_Output(column, expr, how, dtype, column))
    single = resampled.single and len(outputs) == 1
    return _binned(resampled, outputs, ctx, series=single,
                   series_name=outputs[0].name if single else None)


@rule("resample.agg", "resample.aggregate")
def resample_agg(call: PandasCall, ctx: RuleContext) -> Value:
    """r.agg(...) -> the aggregations per bin in one LazyGroupBy.agg, as resample_reduce.

    The forms: r.agg("sum"), r["kg"].agg(["sum", "mean"]), r.agg({"kg": "sum", "price": "mean"}),
    r.agg(total=("kg", "sum")).

    Handles: the names pandas gives the outputs; empty bins filled per aggregation.
    Caveats: a dict of lists or a list over several columns (MultiIndex columns), functions
    other than the named aggregations, and extra arguments are TODOs.
    """
    resampled = _resampled(call)
    outputs: list[_Output] = []

    def add(column: str, how: Any, name: str) -> None:
        if not isinstance(how, str) or how not in RESAMPLE_AGGREGATIONS:
            raise Unsupported(f"aggregation {how!r}")
        if how == "size":
            expr = emit.pl("len").method("cast", emit.atom("pl.Int64"))
        else:
            lower_for_group_spread(ctx, how, resampled.frame.dtype(column))
            expr = agg_expr(emit.col(column), how, resampled.frame.dtype(column),
                            float32=float32_possible(ctx))
        outputs.append(_Output(name, expr, how, resampled.frame.dtype(column),
                               column if how != "size" else None))

    if call.kwargs and not call.args:
        selected = resampled.selection[0] if resampled.single and resampled.selection else None
        for name, spec in call.kwargs.items():
            if selected is not None and not (isinstance(spec, Opaque) and isinstance(spec.const, tuple)):
                add(selected, how_name(spec), name)  # r["kg"].agg(total="sum")
                continue
            if not (isinstance(spec, Opaque) and isinstance(spec.const, tuple) and len(spec.const) == 2):
                raise ctx.todo("named aggregation needs (column, function) pairs")
            column, how = spec.const
            if column in resampled.keys:
                raise ctx.todo("aggregating the time column or a group key")
            add(column, how, name)
        return _binned(resampled, outputs, ctx, series=False, series_name=None)
    if len(call.args) != 1 or call.kwargs:
        raise ctx.todo("agg with extra arguments")
    spec_value = call.args[0]
    spec = spec_value.const if isinstance(spec_value, Opaque) and spec_value.is_const else None
    if isinstance(spec, dict):
        # any list makes every output a (column, function) pair in pandas: flatten them all,
        # as groupby.agg does
        flattened = any(isinstance(h, list) for h in spec.values())
        if any(isinstance(h, tuple) for h in spec.values()):
            raise ctx.todo("functions given as a tuple")
        pairs = []
        for column, hows in spec.items():
            if not isinstance(column, str) or column in resampled.keys:
                raise ctx.todo("aggregating the time column or a group key")
            for how in hows if isinstance(hows, list) else [hows]:
                name = f"{column}_{how}" if flattened else column
                add(column, how, name)
                pairs.append((name, (column, str(how))))
        result = _binned(resampled, outputs, ctx, series=False, series_name=None)
        if flattened:
            ctx.lower("pandas makes MultiIndex columns here; porter names them column_function",
                      0.9)
            assert isinstance(result, Frame)
            return replace(result, column_pairs=tuple(pairs))
        return result
    if isinstance(spec, list):
        columns = _targets(resampled)
        if columns is None or len(columns) != 1 or not resampled.single:
            raise ctx.todo("a list of functions over several columns makes MultiIndex columns")
        for how in spec:
            add(columns[0], how, str(how))
        return _binned(resampled, outputs, ctx, series=False, series_name=None)
    how = how_name(spec_value)
    if how in ("numpy_std", "numpy_var"):
        # np.std / np.var: pandas 3 calls them on each bin's Series, which numpy hands to
        # Series.std / var with ddof=0
        zero = Opaque(emit.lit(0), const=0)
        return resample_reduce(PandasCall(resampled, how[6:], (), {"ddof": zero}, call.node), ctx)
    if how not in RESAMPLE_AGGREGATIONS:
        raise ctx.todo(f"aggregation {how!r}")
    return resample_reduce(PandasCall(resampled, how, (), {}, call.node), ctx)
