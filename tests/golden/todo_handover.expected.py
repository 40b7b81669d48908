import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

cheeses = pl.scan_csv(
    "cheeses.csv",
    null_values=PANDAS_NA_VALUES,
    infer_schema_length=None,
)
cheeses = cheeses.with_columns(age_weeks=pl.col("age_days") // 7)
# TODO(porter): frame.pivot_table: sum without fill_value of a column not known to be numbers:
#   pandas makes every cell float when one is missing; group_by the keys, then DataFrame.pivot(on,
#   index, values) with the columns sorted
pivot = (
    cheeses.collect()
    .to_pandas()
    .pivot_table(index="cellar", columns="kind", values="weight", aggfunc="sum")
)
pivot.to_csv("cellar_pivot.csv")
# TODO(porter): frame.iterrows: only a loop whose body appends one value per row to lists is ported;
#   row loops have no lazy form: express the loop body as column expressions, or collect and use
#   iter_rows(named=True)
for _, row in cheeses.collect().to_pandas().iterrows():
    print(row["name"])
