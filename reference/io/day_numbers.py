"""Reference day numbers for ISO dates, for org.incipit.io.CsvInput (dates -> day numbers).

Day number = (date - origin).days with Python's datetime (proleptic Gregorian calendar), the
origin being the earliest date of the set. Includes leap-year edge cases (1900 and 2100 are not
leap years, 2000 is) and 40 dates drawn with a fixed seed.

Run: python3 reference/io/day_numbers.py > lib-examples/src/test/resources/org/incipit/io/day_numbers.csv
"""
import datetime
import random
import sys

rng = random.Random(20240501)
fixed = ["1900-02-28", "1900-03-01", "2000-02-28", "2000-02-29", "2000-03-01",
         "2023-12-31", "2024-01-01", "2024-02-29", "2100-02-28", "2100-03-01"]
dates = [datetime.date.fromisoformat(d) for d in fixed]
start = datetime.date(1950, 1, 1).toordinal()
end = datetime.date(2050, 12, 31).toordinal()
dates += [datetime.date.fromordinal(rng.randint(start, end)) for _ in range(40)]
origin = min(dates)
print("# tool: Python %s datetime; call: (date - min(dates)).days; script: reference/io/day_numbers.py"
      % sys.version.split()[0])
print("# origin: %s" % origin.isoformat())
print("date,day")
for d in dates:
    print("%s,%d" % (d.isoformat(), (d - origin).days))
