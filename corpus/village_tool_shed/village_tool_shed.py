"""Village lending tool shed: how long each tool sat idle between loans, which tools earn
their deposit, and the members with tools out too long.

The shed is open on Saturdays; the loans book says when a tool went out and came back. A
blank or '?' return date means nobody wrote it down; 'lost' is lost. The tool names are
typed by whoever is on duty ('Hedge Trimmer', ' hedge trimmer'). The ladder was bought twice
and the post-hole digger came from a house clearance, so it has no deposit.
"""
import pandas as pd

LATE_AFTER = 14   # days
TODAY = "2024-08-31"   # the day the book was closed for the summer


def longest_idle(out_dates):
    """Longest run of days between two loans of the same tool."""
    days = sorted(out_dates.dropna().unique())
    longest = 0
    for earlier, later in zip(days, days[1:]):
        gap = (later - earlier).days
        if gap > longest:
            longest = gap
    return longest


loans = pd.read_csv("data/loans.csv", na_values=["?"])
tools = pd.read_csv("data/tools.csv")
print("loans in the book:", len(loans))

print("loan slips entered twice:", loans.duplicated(subset=["loan_id"]).sum())
loans["tool"] = loans["tool"].str.strip().str.lower()
loans["condition"] = loans["condition"].str.lower().fillna("not checked")
loans["out_date"] = pd.to_datetime(loans["out_date"], format="%Y-%m-%d")
loans["lost"] = loans["back_date"] == "lost"
loans["broken"] = loans.condition.eq("broken")
loans["back_date"] = pd.to_datetime(loans["back_date"], format="%Y-%m-%d", errors="coerce")
loans["days_out"] = (loans["back_date"].fillna(pd.Timestamp(TODAY)) - loans["out_date"]).dt.days

idle = loans.groupby("tool")["out_date"].agg(longest_idle).reset_index()
idle = idle.rename(columns={"out_date": "longest_idle_days"})
print(idle.head())

# --- per tool: loans, days out, idle spell, against the deposit
stock = tools.groupby("tool", as_index=False).agg(copies=("bought", "count"), deposit=("deposit", "max"))
per_tool = loans.groupby("tool", as_index=False).agg(
    loans=("loan_id", "count"), days_out=("days_out", "sum"), broken=("broken", "sum"),
    lost=("lost", "sum"))
per_tool = per_tool.merge(idle, on="tool").merge(stock, on="tool", how="left")
per_tool["loans_per_deposit_pound"] = per_tool["loans"] / per_tool["deposit"]
per_tool["loans_per_deposit_pound"] = per_tool["loans_per_deposit_pound"].round(3)
per_tool["idle_share"] = (per_tool["longest_idle_days"] / 183).round(3)
per_tool.sort_values(["longest_idle_days", "tool"], ascending=[False, True], inplace=True)
per_tool.to_csv("tool_use.csv", index=False)
print("tools not in the stock list:", per_tool.loc[per_tool["copies"].isna(), "tool"].tolist())

# --- members with a tool out too long (or lost)
late = loans[(loans["days_out"] > LATE_AFTER) | loans["lost"]]
late = late.merge(per_tool[["tool", "deposit"]], on="tool", how="left")
by_member = late.groupby("member").agg(late_loans=("loan_id", "count"), deposits_held=("deposit", "sum"),
                                       worst=("days_out", "max")).reset_index()
by_member = by_member.sort_values(["late_loans", "member"], ascending=[False, True])
by_member.to_csv("late_members.csv", index=False)
late[["loan_id", "tool", "member", "out_date", "days_out", "lost"]].sort_values("loan_id").to_csv("late_loans.csv", index=False)
