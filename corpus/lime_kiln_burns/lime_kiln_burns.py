"""Lime kiln burns: the restored kiln's firing log cleaned, the peak of every six hours, each
quarter's fuel, each kiln's burns and the fuel per tonne of lime it holds (a pandas 1.x
notebook, kept since 2015, written for pandas 1.5: see reference.txt).

A blank burner is the burner of the line above; a blank temperature is a dropped thermocouple
(the kiln's last reading holds); 'N/A' fuel was not weighed.
"""
import pandas as pd

dateparse = lambda x: pd.datetime.strptime(x, "%d/%m/%Y %H:%M")

kiln = pd.read_csv("data/readings.csv", parse_dates=[["date", "clock"]], date_parser=dateparse,
                   na_values=["N/A"], error_bad_lines=False, warn_bad_lines=False)
kiln.rename(columns={"date_clock": "read_at"}, inplace=True)
kiln.drop_duplicates(subset=["reading"], inplace=True)
kiln["kiln"] = kiln["kiln"].str.strip().str.title()
kiln["burner"] = kiln["burner"].fillna(method="pad")
kiln.sort_values(["kiln", "read_at"], inplace = True)
kiln["temp_c"] = kiln.groupby("kiln")["temp_c"].pad()
kiln["slaking"] = pd.np.where(kiln["temp_c"] >= 900, "yes", "no")
print(kiln.head(10))
print(kiln.shape)

kiln.to_csv("data/readings_clean.csv", index=False)

peaks = kiln.set_index("read_at").resample("6H")["temp_c"].max()
peaks = peaks.dropna().reset_index()
peaks.to_csv("data/six_hour_peaks.csv", index=False)

quarters = kiln.groupby(pd.Grouper(key="read_at", freq="Q")).agg({"fuel_kg": "sum",
                                                                  "reading": "count"})
quarters.rename(columns={"reading":"readings"}, inplace=True)
quarters.reset_index(inplace=True)
quarters.to_csv("data/quarters.csv", index=False)

# one line a kiln (the key comes back as the kiln's name)
per_kiln = pd.DataFrame()
for k, rows in kiln.groupby(["kiln"]):
    per_kiln = per_kiln.append({"kiln": k, "readings": len(rows), "fuel_kg": rows["fuel_kg"].sum(),
                                "burns": rows["read_at"].dt.date.nunique(),
                                "peak_c": rows["temp_c"].max()}, ignore_index=True)

kilns = pd.read_csv("data/kilns.csv")
kilns["kiln"] = kilns["kiln"].str.title()
kilns.drop_duplicates(subset="kiln", keep="last", inplace=True)
per_kiln = per_kiln.merge(kilns, on="kiln", how="left")
per_kiln["kg_per_t"] = (per_kiln["fuel_kg"] / per_kiln["capacity_t"]).round(1)
per_kiln["kg_per_burn"] = (per_kiln["fuel_kg"] / per_kiln["burns"]).round(2)
per_kiln.to_csv("data/per_kiln.csv", index=False)

burners = (kiln.groupby(["burner", "slaking"], as_index=False)
               .agg(readings=("reading", "count"), fuel_kg=("fuel_kg", "sum"), hottest=("temp_c", "max")))
burners.to_csv("data/burners.csv", index=False)
