"""Integer results pandas makes float64 when a value is missing where they are computed: a
date part of NaT (dt.month, dt.year, dt.day, dt.hour, dt.dayofweek, ...), a length or count of
missing text (str.len, str.count), a count in a group whose key is missing (cumcount). pandas
keeps the column float64 after the rows with the missing value are dropped (written 3.0), and
int where nothing was missing (written 3): the converted script writes the same text."""

from __future__ import annotations

import pytest

from support import same_text

# a lock-keeper's log of boats through a canal lock: one passage has no date, one boat no name
PASSAGES = ("passage,boat,at,length_m\n"
            "1,Teal,2025-03-04 07:15,18.5\n"
            "2,Kestrel,2025-03-09 16:40,21.0\n"
            "3,,2025-04-01 11:05,12.0\n"
            "4,Ébène,n/a,19.5\n"
            "5,Teal,2025-04-20 09:30,18.5\n"
            "6,Grebe,2025-12-31 23:59,15.0\n")
COMPLETE = "\n".join(line for line in PASSAGES.splitlines() if "n/a" not in line
                     and ",," not in line) + "\n"

PARTS = ["month", "year", "day", "hour", "dayofweek", "quarter", "day_of_year",
         "days_in_month"]


@pytest.mark.parametrize("part", PARTS)
@pytest.mark.parametrize("with_data", [True, False])
def test_a_date_part_of_nat_stays_float_when_the_row_is_dropped(tmp_path, part, with_data):
    same_text(f"""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log["part"] = log["at"].dt.{part}
        log.to_csv("all.csv", index=False)
        dated = log.dropna(subset=["part"])
        dated.to_csv("dated.csv", index=False)
        dated[["passage", "part"]].to_csv("parts.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES}, with_data=with_data)


@pytest.mark.parametrize("part", ["month", "year", "hour", "dayofweek"])
def test_a_date_part_with_every_date_present_stays_int(tmp_path, part):
    same_text(f"""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log["part"] = log["at"].dt.{part}
        log = log.dropna(subset=["part"])
        log.to_csv("dated.csv", index=False)
        """, tmp_path, {"passages.csv": COMPLETE})


def test_a_date_part_of_a_frame_filtered_to_no_rows(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log = log[log["length_m"] > 100]
        log["month"] = log["at"].dt.month
        log.to_csv("none.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


def test_a_group_sum_by_a_month_of_nat(tmp_path):
    # the canal yard's case: a month with NaT is float64, a group key of it too (3.0)
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log["month"] = log["at"].dt.month
        log["month_len"] = log.groupby(["boat", "month"])["length_m"].transform("sum")
        month = log.dropna(subset=["boat", "month"]).drop_duplicates(["boat", "month"])
        month = month[["boat", "month", "month_len"]].copy()
        month = month.sort_values(["month", "boat"])
        month.to_csv("month.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


def test_days_of_a_missing_duration_stay_float(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log["since"] = (log["at"] - pd.Timestamp("2025-01-01")).dt.days
        log.dropna(subset=["since"]).to_csv("since.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


@pytest.mark.parametrize("count", ['str.len()', 'str.count("e")'])
def test_a_count_of_missing_text_stays_float(tmp_path, count):
    same_text(f"""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["n"] = log["boat"].{count}
        log.dropna(subset=["n"]).to_csv("named.csv", index=False)
        log.groupby("length_m", as_index=False)["n"].sum().to_csv("sums.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


def test_a_count_of_text_never_missing_stays_int(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log = log.dropna(subset=["boat"])
        log["n"] = log["boat"].str.len()
        log.to_csv("named.csv", index=False)
        log.groupby("length_m", as_index=False)["n"].sum().to_csv("sums.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


def test_a_running_count_by_a_missing_key_stays_float(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["seq"] = log.groupby("boat").cumcount() + 1
        log.dropna(subset=["boat"]).to_csv("seq.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})


def test_several_parts_set_at_once(tmp_path):
    same_text("""
        import pandas as pd
        log = pd.read_csv("passages.csv")
        log["at"] = pd.to_datetime(log["at"], errors="coerce")
        log["m"], log["n"] = log["at"].dt.month, log["boat"].str.len()
        log.dropna().to_csv("both.csv", index=False)
        """, tmp_path, {"passages.csv": PASSAGES})
