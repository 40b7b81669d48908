# picking sheets -> weekly summary for the co-op meeting (quick and dirty, run from this folder)
import pandas as pd
import numpy as np


def clean(df):
    df = df.copy()
    df.columns = [c.strip().lower() for c in df.columns]
    df["variety"] = df["variety"].str.strip().str.title()
    df["grade"] = df["grade"].str.upper().replace("", np.nan)
    df["picked_on"] = pd.to_datetime(df["picked_on"], errors="coerce")
    df["crates"] = pd.to_numeric(df["crates"], errors="coerce").fillna(0).astype(int)
    return df


picks = pd.read_csv("data/picks.csv").pipe(clean)
pickers = pd.read_csv("data/pickers.csv")

picks = (picks.merge(pickers, on="picker", how="left")
              .assign(value=lambda d: d.crates * d.price_per_crate,
                      weekday=lambda d: d.picked_on.dt.day_name()))
picks.loc[picks["grade"] == "C", "value"] = picks["value"] * 0.5
picks["is_russet"] = picks["variety"].str.contains("russet", case=False, na=False)

summary = (picks.groupby(["team", "variety"])
                .agg(crates=("crates", "sum"), value=("value", "sum"), picks=("pick_id", "size"))
                .reset_index()
                .sort_values(["team", "value"], ascending=[True, False]))
summary["value_share"] = summary.groupby("team")["value"].transform(lambda v: v / v.sum())
summary.to_csv("data/summary.csv", index=False)

best_day = picks.groupby("picked_on")["crates"].sum().idxmax()
print("best day:", best_day)

per_picker = picks.pivot_table(index="picker", columns="grade", values="crates", aggfunc="sum", fill_value=0)
per_picker["total"] = per_picker.sum(axis=1)
per_picker = per_picker.sort_values("total", ascending=False)
print(per_picker)
per_picker.to_csv("data/per_picker.csv")

picks["cum_crates"] = picks.sort_values("picked_on").groupby("picker")["crates"].cumsum()
late = picks[picks["picked_on"].dt.day > 20].copy()
late["bonus"] = np.where(late["crates"] >= 10, 5.0, 0.0)
print(late[["picker", "crates", "bonus"]].describe())
late.to_csv("data/late.csv", index=False)
print(picks["variety"].value_counts().head(3))
