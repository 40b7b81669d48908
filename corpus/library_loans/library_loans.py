"""Community library: lateness per member, and loan counts per branch and month.

'returned_on' is typed by volunteers: blanks mean still out, and words like
'lost' or impossible dates are treated as unknown.
"""
import pandas as pd


def load_loans(path):
    loans = pd.read_csv(path)
    loans["borrowed_on"] = pd.to_datetime(loans["borrowed_on"], format="%Y-%m-%d")
    loans["due_on"] = pd.to_datetime(loans["due_on"], format="%Y-%m-%d")
    loans["returned_on"] = pd.to_datetime(loans["returned_on"], format="%Y-%m-%d", errors="coerce")
    return loans


def flag_loans(loans):
    loans["still_out"] = loans["returned_on"].isna()
    loans["late"] = loans["returned_on"] > loans["due_on"]
    loans["year"] = loans["borrowed_on"].dt.year
    loans["month"] = loans["borrowed_on"].dt.month
    loans["branch"] = loans["branch"].str.lower()
    return loans


def main():
    loans = flag_loans(load_loans("data/loans.csv"))
    members = pd.read_csv("data/members.csv", parse_dates=["joined_on"])

    joined = loans.merge(members, left_on="member_id", right_on="member_no", how="inner")
    print(len(loans), len(joined))

    by_member = joined.groupby(["member_no", "full_name", "member_type"], as_index=False).agg(
        loans=("loan_id", "count"),
        late=("late", "sum"),
        still_out=("still_out", "sum"),
        last_return=("returned_on", "max"),
    )
    by_member = by_member.sort_values(
        by=["member_type", "last_return"], ascending=[True, False], na_position="first"
    )
    by_member.to_csv("member_lateness.csv", index=False)
    print(by_member.head(8))

    per_branch = loans.groupby(["branch", "year", "month"], as_index=False).size()
    per_branch.to_csv("branch_month_loans.csv", index=False)

    unknown_members = loans[~loans["member_id"].isin(members["member_no"])]
    unknown_members[["loan_id", "member_id", "borrowed_on"]].to_csv("unknown_members.csv", index=False)
    print(len(unknown_members))


if __name__ == "__main__":
    main()
