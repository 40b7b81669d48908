import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]

meals = pl.scan_csv("meals.csv", null_values=PANDAS_NA_VALUES, infer_schema_length=None)
meals = meals.rename({"Class": "class_group", "Dish": "dish"}, strict=False)
meals = meals.drop("notes")
meals = meals.with_columns(portions=pl.col("portions").fill_null(0))
meals = meals.drop_nulls("dish")
meals = meals.sort(["class_group", "dish"], nulls_last=True, maintain_order=True)
meals = meals
(
    meals
    .with_columns(pl.selectors.boolean().replace_strict({True: "True", False: "False"}))
    .sink_csv("meals_clean.csv")
)
