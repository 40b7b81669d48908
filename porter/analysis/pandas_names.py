"""Public attribute names of pandas 3.1 objects (generated from `dir()`; regenerate with
`python -m porter.analysis.pandas_names` when pandas gains methods)."""

FRAME = frozenset((
    'T', 'abs', 'add', 'add_prefix', 'add_suffix', 'agg', 'aggregate', 'align', 'all', 'any',
    'apply', 'asfreq', 'asof', 'assign', 'astype', 'at', 'at_time', 'attrs', 'axes',
    'between_time', 'bfill', 'boxplot', 'clip', 'columns', 'combine', 'combine_first',
    'compare', 'convert_dtypes', 'copy', 'corr', 'corrwith', 'count', 'cov', 'cummax',
    'cummin', 'cumprod', 'cumsum', 'describe', 'diff', 'div', 'divide', 'dot', 'drop',
    'drop_duplicates', 'droplevel', 'dropna', 'dtypes', 'duplicated', 'empty', 'eq', 'equals',
    'eval', 'ewm', 'expanding', 'explode', 'ffill', 'fillna', 'filter', 'first_valid_index',
    'flags', 'floordiv', 'from_arrow', 'from_dict', 'from_records', 'ge', 'get', 'groupby',
    'gt', 'head', 'hist', 'iat', 'idxmax', 'idxmin', 'iloc', 'index', 'infer_objects', 'info',
    'insert', 'interpolate', 'isetitem', 'isin', 'isna', 'isnull', 'items', 'iterrows',
    'itertuples', 'join', 'keys', 'kurt', 'kurtosis', 'last_valid_index', 'le', 'loc', 'lt',
    'map', 'mask', 'max', 'mean', 'median', 'melt', 'memory_usage', 'merge', 'min', 'mod',
    'mode', 'mul', 'multiply', 'ndim', 'ne', 'nlargest', 'notna', 'notnull', 'nsmallest',
    'nunique', 'pct_change', 'pipe', 'pivot', 'pivot_table', 'plot', 'pop', 'pow', 'prod',
    'product', 'quantile', 'query', 'radd', 'rank', 'rdiv', 'reindex', 'reindex_like',
    'rename', 'rename_axis', 'reorder_levels', 'replace', 'resample', 'reset_index',
    'rfloordiv', 'rmod', 'rmul', 'rolling', 'round', 'rpow', 'rsub', 'rtruediv', 'sample',
    'select', 'select_dtypes', 'sem', 'set_axis', 'set_flags', 'set_index', 'shape', 'shift',
    'size', 'skew', 'sort_index', 'sort_values', 'sparse', 'squeeze', 'stack', 'std', 'style',
    'sub', 'subtract', 'sum', 'swaplevel', 'tail', 'take', 'to_clipboard', 'to_csv', 'to_dict',
    'to_excel', 'to_feather', 'to_hdf', 'to_html', 'to_iceberg', 'to_json', 'to_latex',
    'to_markdown', 'to_numpy', 'to_orc', 'to_parquet', 'to_period', 'to_pickle', 'to_records',
    'to_sql', 'to_stata', 'to_string', 'to_timestamp', 'to_xarray', 'to_xml', 'transform',
    'transpose', 'truediv', 'truncate', 'tz_convert', 'tz_localize', 'unstack', 'update',
    'value_counts', 'values', 'var', 'where', 'xs',
))

SERIES = frozenset((
    'T', 'abs', 'add', 'add_prefix', 'add_suffix', 'agg', 'aggregate', 'align', 'all', 'any',
    'apply', 'argmax', 'argmin', 'argsort', 'array', 'asfreq', 'asof', 'astype', 'at',
    'at_time', 'attrs', 'autocorr', 'axes', 'between', 'between_time', 'bfill', 'case_when',
    'cat', 'clip', 'combine', 'combine_first', 'compare', 'convert_dtypes', 'copy', 'corr',
    'count', 'cov', 'cummax', 'cummin', 'cumprod', 'cumsum', 'describe', 'diff', 'div',
    'divide', 'divmod', 'dot', 'drop', 'drop_duplicates', 'droplevel', 'dropna', 'dt', 'dtype',
    'dtypes', 'duplicated', 'empty', 'eq', 'equals', 'ewm', 'expanding', 'explode',
    'factorize', 'ffill', 'fillna', 'filter', 'first_valid_index', 'flags', 'floordiv',
    'from_arrow', 'ge', 'get', 'groupby', 'gt', 'hasnans', 'head', 'hist', 'iat', 'idxmax',
    'idxmin', 'iloc', 'index', 'infer_objects', 'info', 'interpolate',
    'is_monotonic_decreasing', 'is_monotonic_increasing', 'is_unique', 'isin', 'isna',
    'isnull', 'item', 'items', 'keys', 'kurt', 'kurtosis', 'last_valid_index', 'le', 'list',
    'loc', 'lt', 'map', 'mask', 'max', 'mean', 'median', 'memory_usage', 'min', 'mod', 'mode',
    'mul', 'multiply', 'name', 'nbytes', 'ndim', 'ne', 'nlargest', 'notna', 'notnull',
    'nsmallest', 'nunique', 'pct_change', 'pipe', 'plot', 'pop', 'pow', 'prod', 'product',
    'quantile', 'radd', 'rank', 'rdiv', 'rdivmod', 'reindex', 'reindex_like', 'rename',
    'rename_axis', 'reorder_levels', 'repeat', 'replace', 'resample', 'reset_index',
    'rfloordiv', 'rmod', 'rmul', 'rolling', 'round', 'rpow', 'rsub', 'rtruediv', 'sample',
    'searchsorted', 'sem', 'set_axis', 'set_flags', 'shape', 'shift', 'size', 'skew',
    'sort_index', 'sort_values', 'sparse', 'squeeze', 'std', 'str', 'struct', 'sub',
    'subtract', 'sum', 'swaplevel', 'tail', 'take', 'to_clipboard', 'to_csv', 'to_dict',
    'to_excel', 'to_frame', 'to_hdf', 'to_json', 'to_latex', 'to_list', 'to_markdown',
    'to_numpy', 'to_period', 'to_pickle', 'to_sql', 'to_string', 'to_timestamp', 'to_xarray',
    'tolist', 'transform', 'transpose', 'truediv', 'truncate', 'tz_convert', 'tz_localize',
    'unique', 'unstack', 'update', 'value_counts', 'values', 'var', 'where', 'xs',
))

GROUPBY = frozenset((
    'agg', 'aggregate', 'all', 'any', 'apply', 'bfill', 'boxplot', 'corr', 'corrwith', 'count',
    'cov', 'cumcount', 'cummax', 'cummin', 'cumprod', 'cumsum', 'describe', 'diff', 'dtype',
    'ewm', 'expanding', 'ffill', 'filter', 'first', 'get_group', 'groups', 'head', 'hist',
    'idxmax', 'idxmin', 'indices', 'is_monotonic_decreasing', 'is_monotonic_increasing',
    'keys', 'kurt', 'last', 'level', 'max', 'mean', 'median', 'min', 'ndim', 'ngroup',
    'ngroups', 'nlargest', 'nsmallest', 'nth', 'nunique', 'ohlc', 'pct_change', 'pipe', 'plot',
    'prod', 'quantile', 'rank', 'resample', 'rolling', 'sample', 'sem', 'shift', 'size',
    'skew', 'std', 'sum', 'tail', 'take', 'transform', 'unique', 'value_counts', 'var',
))

STR = frozenset((
    'capitalize', 'casefold', 'cat', 'center', 'contains', 'count', 'decode', 'encode',
    'endswith', 'extract', 'extractall', 'find', 'findall', 'fullmatch', 'get', 'get_dummies',
    'index', 'isalnum', 'isalpha', 'isascii', 'isdecimal', 'isdigit', 'islower', 'isnumeric',
    'isspace', 'istitle', 'isupper', 'join', 'len', 'ljust', 'lower', 'lstrip', 'match',
    'normalize', 'pad', 'partition', 'removeprefix', 'removesuffix', 'repeat', 'replace',
    'rfind', 'rindex', 'rjust', 'rpartition', 'rsplit', 'rstrip', 'slice', 'slice_replace',
    'split', 'startswith', 'strip', 'swapcase', 'title', 'translate', 'upper', 'wrap', 'zfill',
))

DT = frozenset((
    'as_unit', 'ceil', 'components', 'date', 'day', 'day_name', 'day_of_week', 'day_of_year',
    'dayofweek', 'dayofyear', 'days', 'days_in_month', 'daysinmonth', 'floor', 'freq', 'hour',
    'is_leap_year', 'is_month_end', 'is_month_start', 'is_quarter_end', 'is_quarter_start',
    'is_year_end', 'is_year_start', 'isocalendar', 'microsecond', 'microseconds', 'minute',
    'month', 'month_name', 'nanosecond', 'nanoseconds', 'normalize', 'quarter', 'round',
    'second', 'seconds', 'strftime', 'time', 'timetz', 'to_period', 'to_pydatetime',
    'to_pytimedelta', 'total_seconds', 'tz', 'tz_convert', 'tz_localize', 'unit', 'weekday',
    'year',
))

MODULE = frozenset((
    'ArrowDtype', 'BooleanDtype', 'Categorical', 'CategoricalDtype', 'CategoricalIndex',
    'DataFrame', 'DateOffset', 'DatetimeIndex', 'DatetimeTZDtype', 'ExcelFile', 'ExcelWriter',
    'Flags', 'Float32Dtype', 'Float64Dtype', 'Grouper', 'HDFStore', 'Index', 'IndexSlice',
    'Int16Dtype', 'Int32Dtype', 'Int64Dtype', 'Int8Dtype', 'Interval', 'IntervalDtype',
    'IntervalIndex', 'MultiIndex', 'NA', 'NaT', 'NamedAgg', 'NamedFunc', 'Period',
    'PeriodDtype', 'PeriodIndex', 'RangeIndex', 'Series', 'SparseDtype', 'StringDtype',
    'Timedelta', 'TimedeltaIndex', 'Timestamp', 'UInt16Dtype', 'UInt32Dtype', 'UInt64Dtype',
    'UInt8Dtype', 'annotations', 'api', 'array', 'arrays', 'bdate_range', 'col', 'compat',
    'concat', 'core', 'crosstab', 'cut', 'date_range', 'describe_option', 'errors', 'eval',
    'factorize', 'from_dummies', 'get_dummies', 'get_option', 'infer_freq', 'interval_range',
    'io', 'isna', 'isnull', 'json_normalize', 'lreshape', 'melt', 'merge', 'merge_asof',
    'merge_ordered', 'notna', 'notnull', 'offsets', 'option_context', 'options', 'pandas',
    'period_range', 'pivot', 'pivot_table', 'plotting', 'qcut', 'read_clipboard', 'read_csv',
    'read_excel', 'read_feather', 'read_fwf', 'read_hdf', 'read_html', 'read_iceberg',
    'read_json', 'read_orc', 'read_parquet', 'read_pickle', 'read_sas', 'read_spss',
    'read_sql', 'read_sql_query', 'read_sql_table', 'read_stata', 'read_table', 'read_xml',
    'reset_option', 'set_eng_float_format', 'set_option', 'show_versions', 'test', 'testing',
    'timedelta_range', 'to_datetime', 'to_numeric', 'to_pickle', 'to_timedelta', 'tseries',
    'unique', 'util', 'wide_to_long',
))


# DataFrame methods pandas 2 and 3 removed, which old scripts still call (not from dir())
FRAME_REMOVED = frozenset(('append', 'applymap', 'iteritems', 'as_matrix', 'get_value',
                           'set_value', 'lookup', 'sort', 'pad', 'backfill'))
# Series methods pandas removed (rules/legacy.py), read when no method has the name
SERIES_REMOVED = frozenset(('valid', 'order', 'get_value', 'set_value', 'as_matrix', 'pad',
                            'backfill', 'iteritems'))
# GroupBy methods pandas 2 removed (rules/legacy.py), read when no column has the name
GROUPBY_REMOVED = frozenset(('pad', 'backfill'))


def _generate() -> str:  # pragma: no cover - run by hand when pandas changes
    import pandas as pd
    from pandas.core.groupby import DataFrameGroupBy, SeriesGroupBy

    def public(obj: object) -> list[str]:
        return sorted(n for n in dir(obj) if not n.startswith("_"))

    groups = {
        "FRAME": public(pd.DataFrame),
        "SERIES": public(pd.Series),
        "GROUPBY": sorted(set(public(DataFrameGroupBy)) | set(public(SeriesGroupBy))),
        "STR": public(pd.Series.str),
        # the .dt of datetimes and of durations (Timedelta), together
        "DT": sorted(set(public(pd.Series([pd.Timestamp("2020")]).dt))
                     | set(public(pd.Series([pd.Timedelta(1)]).dt))),
        "MODULE": public(pd),
    }
    out = []
    for name, names in groups.items():
        lines, current = [], ""
        for item in names:
            piece = repr(item) + ", "
            if len(current) + len(piece) > 92:
                lines.append(current.rstrip())
                current = ""
            current += piece
        lines.append(current.rstrip())
        out.append(f"{name} = frozenset((\n" + "\n".join("    " + ln for ln in lines) + "\n))\n")
    return "\n".join(out)


if __name__ == "__main__":  # pragma: no cover
    print(_generate())
