import pandas as pd

spring = pd.read_csv("spring.csv")
summer = pd.read_csv("summer.csv")
season = pd.concat([spring, summer], ignore_index=True)
season = season.drop_duplicates(subset=["hive", "date"], keep="last")
stats = season.describe()
stats.to_csv("season_stats.csv")
