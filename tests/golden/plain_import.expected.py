import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def pandas_group_sums(values, mean=False, sorted_within=None, in_key_order=None, floats=True):
    """Each group's sum of floats (mean=True: mean) as pandas computes it, from the group's
    values as a list (pl.col(...) in an agg). pandas adds a group with a compensated (Kahan)
    sum in row order, missing values skipped; where the rows reach it grouped in the order
    of the sorted keys and none is missing, with numpy's reduceat: the first value plus
    numpy's pairwise sum of the rest. That is a resample (sorted_within names the keys whose
    rows are binned together, [] for all rows) where no value of those rows is missing, or a
    groupby whose in_key_order says so (computed on the rows before grouping). Polars' own
    sum adds in another order and can end a unit in the last digit away (212.40000000000003
    for 212.4). floats=False: the column's type is not known; whole numbers and True/False
    are added as Polars adds them (exactly), into Int64."""
    import numpy as np

    def add(columns):
        lists = columns[0]
        if lists.dtype.inner != pl.Float64:  # whole numbers, True/False: exact sums
            total = lists.list.mean() if mean else lists.list.sum()
            return total.cast(pl.Int64) if total.dtype.is_unsigned_integer() else total
        sizes = lists.list.len().cast(pl.Int64).to_numpy()
        flat = lists.explode().cast(pl.Float64).to_numpy()  # an empty list: one NaN
        starts = np.concatenate(([0], np.maximum(sizes, 1).cumsum()[:-1])).astype(np.int64)
        if len(columns) > 1 and len(sizes) and (columns[1].to_numpy() & (sizes > 0)).all():
            with np.errstate(invalid="ignore"):  # every group by reduceat: no loop at all
                total = np.add.reduceat(flat, starts)
            return pl.Series(total / sizes).fill_nan(None) if mean else pl.Series(total)
        order = np.argsort(-sizes, kind="stable")  # the longest groups first
        total, carry, count = (np.zeros(len(sizes)) for _ in range(3))
        step, longest = 0, int(sizes[order[0]]) if len(sizes) else 0
        with np.errstate(invalid="ignore"):  # inf - inf: a NaN carry, set back to 0
            while step < longest:  # the groups side by side, one value of each per step
                at = order[:int(np.searchsorted(-sizes[order], -step))]  # the longer ones
                if len(at) <= 100:
                    break  # a few long groups are quicker one at a time
                x = flat[starts[at] + step]
                seen = x == x
                y = x - carry[at]
                t = total[at] + y
                c = (t - total[at]) - y
                total[at] = np.where(seen, t, total[at])
                carry[at] = np.where(seen, np.where(c == c, c, 0.0), carry[at])
                count[at] += seen
                step += 1
            rest = order[:int(np.searchsorted(-sizes[order], -step))] if step < longest else ()
            for g in rest:  # each long group on its own, from where the steps stopped
                t, c, k = float(total[g]), float(carry[g]), float(count[g])
                segment = flat[starts[g] + step:starts[g] + sizes[g]]
                if np.isfinite(segment).all():  # no missing or infinite value to step over
                    for x in segment.tolist():
                        y = x - c
                        s = t + y
                        c = (s - t) - y
                        t = s
                    k += len(segment)
                else:
                    for x in segment.tolist():
                        if x == x:
                            y = x - c
                            s = t + y
                            c = (s - t) - y
                            c, t, k = c if c == c else 0.0, s, k + 1
                total[g], count[g] = t, k
            if len(columns) > 1 and len(sizes):
                clean = columns[1].to_numpy() & (sizes > 0)
                total = np.where(clean, np.add.reduceat(flat, starts), total)
        if not mean:
            return pl.Series(total)
        return pl.Series(total / np.where(count > 0, count, np.nan)).fill_nan(None)

    kind = pl.Float64 if floats else None
    if sorted_within is None and in_key_order is None:
        return values.map_batches(lambda lists: add([lists]), return_dtype=kind)
    missing = values.list.eval(pl.element().cast(pl.Float64).fill_nan(None).is_null()).list.any()
    if in_key_order is not None:
        clean = in_key_order & ~missing.any()
    else:
        clean = ~(missing.any().over(sorted_within) if sorted_within else missing.any())
    return pl.map_batches([values, clean], add, return_dtype=kind)


landings = pl.scan_csv(
    "landings.csv",
    null_values=PANDAS_NA_VALUES + ["-"],
    infer_schema_length=None,
)
landings = landings.drop_nulls("kg")
by_boat = (
    landings
    .drop_nulls("boat")
    .group_by("boat")
    .agg(pl.col("kg"))
    .with_columns(pandas_group_sums(pl.col("kg"), floats=False))
    .with_columns(pl.selectors.unsigned_integer().cast(pl.Int64))
    .sort("boat")
)
print(by_boat.collect())
