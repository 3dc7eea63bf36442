#!/usr/bin/env python3
"""Writes the logger-file fixtures of package ui/fielddata.

Every file is of our own making: an invented site (Larkspur Flats), invented
wells (LF-PW1, LF-OB1, LF-OB2) and invented logger serial numbers (FX-204xx,
FB-3301), in plain generic layouts. The readings follow the formulas below so
that the tests know what each file holds. Run from this folder:

    python3 make_fixtures.py
"""
import math
from datetime import datetime, timedelta

RHO, G = 999.97, 9.80665  # reference section 9: water at 4 degC, standard gravity


def write(name, text, encoding="utf-8", newline="\n"):
    data = text.replace("\n", newline).encode(encoding)
    with open(name, "wb") as f:
        f.write(data)


# 1. Semicolons, decimal comma, a preamble, day-first dates in a date column
#    and clock times in another, crossing midnight. Depth = 12.300 + 0.005 i m.
rows = ["Site;Larkspur Flats", "Well;LF-OB1", "Logger serial;FX-20417", "Exported;16.05.2024",
        "Date;Time;Depth to water (m);Temperature (°C)"]
t0 = datetime(2024, 5, 14, 23, 55)
for i in range(11):
    t = t0 + timedelta(minutes=i)
    rows.append("%s;%s;%s;%s" % (t.strftime("%d.%m.%Y"), t.strftime("%H:%M:%S"),
                                 ("%.3f" % (12.300 + 0.005 * i)).replace(".", ","), "11,2"))
write("semicolon-comma.csv", "\n".join(rows) + "\n")

# 2. UTF-16 LE with a byte order mark, tabs, CR LF, a preamble of key: value
#    lines (the unit of the level column is only there), ISO times with an
#    offset and fractions of seconds. Level = 101.250 - 0.004 i m, every 30.25 s.
rows = ["Logger export", "Serial number: FX-20418", "Site: Larkspur Flats", "Well: LF-PW1", "Units: m", "",
        "Date and time\tLevel\tTemperature"]
t0 = datetime(2024, 5, 14, 8, 0, 0)
for i in range(40):
    t = t0 + timedelta(seconds=30.25 * i)
    rows.append("%s.%02d+02:00\t%.3f\t11.%d" % (t.strftime("%Y-%m-%dT%H:%M:%S"), t.microsecond // 10000,
                                             101.250 - 0.004 * i, i % 10))
write("utf16le-preamble.txt", "\ufeff" + "\n".join(rows) + "\n", "utf-16-le", "\r\n")

# 3. UTF-16 BE without a byte order mark, commas, ISO times in UTC (Z),
#    pressure in psi = 14.500 + 0.100 i.
rows = ["Timestamp,Pressure (psi)"]
for i in range(10):
    rows.append("2024-05-14T06:%02d:00Z,%.3f" % (i, 14.5 + 0.1 * i))
write("utf16be-nobom.csv", "\n".join(rows) + "\n", "utf-16-be")

# 4. Month-first dates with a 12-hour clock crossing noon and midnight;
#    depth in feet = 40.00 + 0.01 i.
rows = ["Date and time,Depth to water (ft)"]
times = [datetime(2024, 5, 14, 11, 55) + timedelta(minutes=i) for i in range(10)]
times += [datetime(2024, 5, 14, 13, 0), datetime(2024, 5, 14, 13, 30), datetime(2024, 5, 15, 0, 30)]
for i, t in enumerate(times):
    rows.append("%s,%.2f" % (t.strftime("%m/%d/%Y %I:%M:%S %p"), 40.00 + 0.01 * i))
write("month-first.csv", "\n".join(rows) + "\n")

# 5. Dates whose day and month are all 12 or less: 05/06/2024 and 06/06/2024.
rows = ["Date,Time,Level (m)"]
for d in (5, 6):
    for h in (8, 12, 16, 20):
        rows.append("%02d/06/2024,%02d:00,%.3f" % (d, h, 45.120 - 0.01 * h))
write("ambiguous-dates.csv", "\n".join(rows) + "\n")

# 6. Elapsed seconds, log-spaced, two readings before pumping;
#    depth = 8.000 + 0.45 log10(1 + t/30) m for t > 0, else 8.000.
ts = [-120, -60, 0, 1, 2, 3, 4, 5, 6, 8, 10, 12, 15, 20, 25, 30, 40, 50, 60, 80, 100, 120, 150, 200, 250,
      300, 400, 500, 600, 800, 1000, 1200, 1500, 1800, 2400, 3000, 3600]
rows = ["# Larkspur Flats, well LF-OB1, manual logger download", "Elapsed time (s),Depth to water (m)"]
for t in ts:
    d = 8.0 + (0.45 * math.log10(1 + t / 30) if t > 0 else 0.0)
    rows.append("%g,%.4f" % (t, d))
write("elapsed-seconds.csv", "\n".join(rows) + "\n")

# 7. An unvented pressure logger in kPa and a barometric logger in mbar,
#    local times (UTC+02:00) without offsets.
#    Barometer, every 5 min from 06:50 to 12:10: b_k = 1012.0 + 1.5 sin(2 pi k/40) mbar, 0.1 mbar.
#    Water logger, every minute from 07:00 to 12:00; pump on at 08:00, off at 11:00.
#    Head above the sensor h(t) = 6.500 + r (t - t_on) - s(t), r = 0.002 m/h (a rising trend),
#    s = 0.8 log10(1 + t/60) while pumping (t s since 08:00), and after 11:00
#    s' = 0.8 log10(1 + t/60) - 0.8 log10(1 + t'/60) (t' s since 11:00); s = 0 before 08:00.
#    Pressure = baro (linear between readings, in kPa) + rho g h / 1000, 0.001 kPa.
b0 = datetime(2024, 5, 14, 6, 50)
baro = [round(1012.0 + 1.5 * math.sin(2 * math.pi * k / 40), 1) for k in range(65)]
rows = ["Barometric logger FB-3301", "Site: Larkspur Flats", "Date time,Barometric pressure (mbar)"]
for k, b in enumerate(baro):
    rows.append("%s,%.1f" % ((b0 + timedelta(minutes=5 * k)).strftime("%Y-%m-%d %H:%M:%S"), b))
write("baro-mbar.csv", "\n".join(rows) + "\n")


def baro_kpa(sec_since_b0):
    k = int(sec_since_b0 // 300)
    w = (sec_since_b0 - 300 * k) / 300
    if k >= 64:
        return baro[64] / 10
    return (baro[k] + w * (baro[k + 1] - baro[k])) / 10


def drawdown(t):  # t: s since 08:00
    if t <= 0:
        return 0.0
    s = 0.8 * math.log10(1 + t / 60)
    if t > 10800:
        s -= 0.8 * math.log10(1 + (t - 10800) / 60)
    return s


rows = ["Logger FX-20417 (unvented)", "Well: LF-OB1", "Clock: UTC+02:00", "Date time,Pressure (kPa),Temperature (°C)"]
w0 = datetime(2024, 5, 14, 7, 0)
for i in range(301):
    t = 60 * i - 3600  # s since 08:00
    h = 6.5 + 0.002 / 3600 * t - drawdown(t)
    p = baro_kpa(600 + 60 * i) + RHO * G * h / 1000
    rows.append("%s,%.3f,11.4" % ((w0 + timedelta(minutes=i)).strftime("%Y-%m-%d %H:%M:%S"), p))
write("pressure-kpa.csv", "\n".join(rows) + "\n")

# 8. Gaps, duplicated times and a step back: level = 100.000 - 0.002 m per minute.
rows = ["Timestamp,Level (m)"]
def lv(m):
    return "%.3f" % (100.0 - 0.002 * m)
t0 = datetime(2024, 5, 14, 8, 0)
for m in range(31):
    rows.append("%s,%s" % ((t0 + timedelta(minutes=m)).strftime("%Y-%m-%d %H:%M:%S"), lv(m)))
    if m == 10:
        rows.append("%s,%s" % ((t0 + timedelta(minutes=m)).strftime("%Y-%m-%d %H:%M:%S"), lv(m)))
    if m == 20:
        rows.append("%s,%s" % ((t0 + timedelta(minutes=m)).strftime("%Y-%m-%d %H:%M:%S"), lv(m + 0.5)))
for m in list(range(75, 81)) + [79.5] + list(range(81, 91)):
    rows.append("%s,%s" % ((t0 + timedelta(minutes=m)).strftime("%Y-%m-%d %H:%M:%S"), lv(m)))
write("gaps-duplicates.csv", "\n".join(rows) + "\n")

# 9. Rows that cannot be read, among good ones (see the test for the list).
write("garbage-rows.csv", """Time,Depth to water (m)
2024-05-14 08:00:00,5.120
2024-05-14 08:01:00,5.125
2024-05-14 08:02:00,n/a
2024-05-14 08:03:00,5.135

2024-05-14 08:04:00,
2024-05-14 08:05:00
2024-13-01 08:06:00,5.150
2024-05-14 08:07:00,5.155
ERR,ERR
2024-05-14 08:08:00,5.160
2024-05-14 08:09:00,5.1.65
2024-05-14 25:10:00,5.170
2024-05-14 08:11:00,"5.175"
2024-05-14 08:12:00,5.180
END OF DATA
""")

# 10. Latin-1 (ISO 8859-1) bytes in the header, semicolons, decimal comma.
rows = ["Site;Larkspur Flats", "Serial;FX-20420", "Date/heure;Water level (m);Température (°C)"]
for i in range(10):
    rows.append("2024-05-14 08:%02d:00;%s;11,2" % (i, ("%.3f" % (101.25 - 0.01 * i)).replace(".", ",")))
write("latin1.csv", "\n".join(rows) + "\n", "latin-1")

# 11. Columns aligned with spaces, a comment line, date and time apart.
rows = ["# Larkspur Flats, well LF-OB2, logger FX-20419", "Date       Time      Level(m)   Temp(C)"]
for i in range(12):
    rows.append("2024-05-14 %s  %-9s  11.3" % ((datetime(2024, 5, 14, 8) + timedelta(minutes=5 * i)).strftime("%H:%M:%S"),
                                               "%.3f" % (98.412 - 0.02 * i)))
write("spaces.txt", "\n".join(rows) + "\n")
