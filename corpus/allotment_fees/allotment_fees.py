"""Allotment society: this year's fee for every plot, payments received, and balances per section.

The fee is a rate per square metre plus a surcharge for plots with a water tap.
The payments sheet uses the plot number only, and some payments are for plot
numbers that no longer exist after the re-survey.
"""
import pandas as pd

RATE_PER_M2 = 0.45
TAP_SURCHARGE = {"Y": 15.0, "N": 0.0}


def load_plots(path):
    plots = pd.read_csv(path)
    plots = plots.rename(columns={"water_tap": "tap"})
    plots["section"] = plots["section"].str.strip().str.upper()
    plots["tap"] = plots["tap"].replace({"yes": "Y", "no": "N"}).fillna("N")
    plots["tenant"] = plots["tenant"].fillna("vacant")
    plots["fee"] = (plots["size_m2"] * RATE_PER_M2 + plots["tap"].map(TAP_SURCHARGE)).round(2)
    plots["plot_label"] = "P-" + plots["plot_no"].astype(str)
    return plots


def load_payments(path):
    payments = pd.read_csv(path, parse_dates=["paid_on"])
    payments["method"] = payments["method"].str.strip().str.lower().replace("chq", "cheque")
    return payments[payments["amount"] > 0]


def main():
    plots = load_plots("data/plots.csv")
    payments = load_payments("data/payments.csv")
    print(plots.dtypes)

    paid = payments.groupby("plot", as_index=False).agg(paid=("amount", "sum"), payments=("amount", "count"))
    ledger = plots.merge(paid, left_on="plot_no", right_on="plot", how="left").drop("plot", axis=1)
    ledger = ledger.fillna({"paid": 0, "payments": 0})
    ledger["balance"] = (ledger["fee"] - ledger["paid"]).round(2)
    ledger["label_length"] = ledger["plot_label"].str.len()
    ledger.to_csv("ledger.csv", index=False)
    print(ledger.describe())

    sections = ledger.groupby("section").agg({"fee": "sum", "paid": "sum", "balance": "sum"}).reset_index()
    sections.to_csv("section_balances.csv", index=False)

    arrears = ledger.loc[(ledger["balance"] > 0) & (ledger["tenant"] != "vacant"), ["plot_label", "tenant", "balance"]]
    arrears = arrears.sort_values(by=["balance", "plot_label"], ascending=[False, True]).head(15)
    arrears.to_csv("in_arrears.csv", index=False)

    methods = payments["method"].value_counts()
    print(methods)
    print(payments["amount"].sum(), len(ledger))


if __name__ == "__main__":
    main()
