"""Ferry line: fares per route, with helper functions and a main()."""
import pandas as pd


def load(path):
    tickets = pd.read_csv(path)
    tickets["fare"] = tickets["fare"].fillna(0)
    return tickets


def per_route(tickets):
    summary = tickets.groupby("route").agg(revenue=("fare", "sum"), trips=("ticket", "count"))
    return summary.reset_index()


def main():
    tickets = load("tickets.csv")
    summary = per_route(tickets)
    summary.to_csv("routes.csv", index=False)
    print(f"{len(tickets)} tickets, {summary.shape[0]} routes")


if __name__ == "__main__":
    main()
