"""Ferry line: fares per route, with helper functions and a main()."""
import polars as pl

# Text that pandas' read_csv reads as a missing value.
PANDAS_NA_VALUES = [
    "", "#N/A", "#N/A N/A", "#NA", "-1.#IND", "-1.#QNAN", "-NaN", "-nan", "1.#IND",
    "1.#QNAN", "<NA>", "N/A", "NA", "NULL", "NaN", "None", "n/a", "nan", "null",
]


def load(path):
    tickets = pl.scan_csv(path, null_values=PANDAS_NA_VALUES, infer_schema_length=None)
    tickets = tickets.with_columns(fare=pl.col("fare").fill_null(0))
    return tickets


def per_route(tickets):
    summary = (
        tickets
        .drop_nulls("route")
        .group_by("route")
        .agg(
            pl.col("fare").sum().alias("revenue"),
            pl.col("ticket").count().cast(pl.Int64).alias("trips"),
        )
        .sort("route")
    )
    return summary


def main():
    tickets = load("tickets.csv").collect().lazy()
    summary = per_route(tickets).collect().lazy()
    (
        summary
        .with_columns(
            pl.selectors.boolean().replace_strict({True: "True", False: "False"}),
        )
        .sink_csv("routes.csv")
    )
    print(
        f"{tickets.select(pl.len()).collect().item()} tickets, {summary.select(pl.len()).collect().item()} routes",
    )


if __name__ == "__main__":
    main()
