"""A seed bank's monthly germination trials, one file a month, read with Dask: germination per
plant family, the best rate of each species in a warm cabinet, and the trials that did poorly."""
import dask.dataframe as dd


def with_rates(part):
    part = part.assign(rate=part.germinated / part.sown)
    part["species"] = part.species.str.strip().str.upper()
    return part


trials = dd.read_csv("data/trials-2025-*.csv", dtype={"temp_c": "float64"})
trials = trials.map_partitions(with_rates)
species = dd.read_csv("data/species.csv")
trials = trials.merge(species, left_on="species", right_on="code", how="inner").persist()

by_family = (
    trials.groupby(["family", "dormancy"], sort=True)
    .agg({"sown": "sum", "germinated": "sum", "rate": "mean"})
    .reset_index()
)
by_family = by_family.assign(
    overall=(by_family.germinated / by_family.sown).round(4), rate=by_family.rate.round(4)
)
by_family.compute().to_csv("family_germination.csv", index=False)

warm = trials[trials.temp_c >= 20]
warm.groupby("species_name", sort=True).rate.max().compute().to_csv("warm_best_rates.csv")

poor = trials[trials.rate < 0.25][["month", "accession", "species_name", "rate", "note"]]
poor.to_csv("poor_trials.csv", single_file=True, index=False)
