"""Rope ferry maintenance log: parts and labour per ferry, how often each part is fitted, and deferred work.

Mechanics list the parts they fitted in one cell, separated by ';' (with stray spaces, mixed
case, sometimes a trailing ';'); 'none' or blank when nothing was fitted. Hours '-' means not
booked. The pulley is bought from two suppliers, so it has two prices.
"""
import numpy as np
import pandas as pd

HOURLY_RATE = 38   # per hour, agreed with the ferry board in 2023


def clean_jobs(jobs):
    jobs["ferry"] = jobs["ferry"].str.strip().str.title()
    jobs["status"] = jobs['status'].str.strip().str.lower()
    jobs["mechanic"] = jobs["mechanic"].str.title()
    jobs["labour"] = jobs["hours"] * HOURLY_RATE
    return jobs.drop_duplicates("job_id")


def price_parts(lines, prices):
    # two pulley prices -> a pulley line comes out twice; we take the dearer one below
    lines = lines.merge(prices, on="part", how="left")
    lines = lines.sort_values(["job_id", "part", "unit_cost"], ascending=[True, True, False])
    return lines.drop_duplicates(subset=["job_id", "part"], keep="first")


jobs = pd.read_csv("data/jobs.csv", na_values=["-", "none"], parse_dates=["done_on"])
prices = pd.read_csv("data/parts_prices.csv")
jobs = clean_jobs(jobs)

# one row per part fitted
jobs["part"] = jobs["parts_used"].str.split(";")
lines = jobs.explode("part")
lines["part"] = lines["part"].str.strip().str.lower()
lines = lines[lines["part"] != ""]
lines = price_parts(lines, prices)
lines["unit_cost"] = lines["unit_cost"].fillna(0.0)

parts_per_job = lines.groupby("job_id", as_index=False)["unit_cost"].sum().rename(columns={"unit_cost": "parts_cost"})
job_costs = jobs.merge(parts_per_job, on="job_id", how="left")
job_costs["parts_per_hour"] = job_costs["parts_cost"] / job_costs["hours"]   # hours 0: inspection only

per_ferry = job_costs.groupby("ferry").agg(
    jobs=("job_id", "count"),
    hours=("hours", "sum"),
    labour=("labour", "sum"),
    parts=("parts_cost", "sum"),
    worst_ratio=("parts_per_hour", "max"),
)
per_ferry["total"] = per_ferry["labour"] + per_ferry["parts"]
per_ferry = per_ferry.round(2).reset_index().sort_values(["total", "ferry"], ascending=[False, True])
per_ferry.to_csv("ferry_costs.csv", index=False)

usage = lines[lines.part.notna()].groupby(["part", "supplier"], dropna=False).agg(fitted=("job_id", "count"), spent=("unit_cost", "sum"))
usage = usage.reset_index().sort_values(["fitted", "part"], ascending=[False, True])
usage["spent"] = usage["spent"].round(2)
usage.to_csv("data/part_usage.csv", index=False)

deferred = lines[(lines["status"] == "deferred") & lines["part"].notna()]
deferred = deferred[["job_id", "ferry", "done_on", "mechanic", "part", "unit_cost"]].sort_values(["done_on", "job_id", "part"])
deferred.to_csv("deferred_parts.csv", index=False)
print(deferred.groupby("ferry")["unit_cost"].sum().round(2))
print("parts with no price:", sorted(lines.loc[lines["supplier"].isna() & lines["part"].notna(), "part"].unique()))
