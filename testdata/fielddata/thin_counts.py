#!/usr/bin/env python3
"""Reference counts for log-spaced thinning (package ui/fielddata, ThinLog),
computed with exact integer arithmetic, independently of the Go code.

Readings every second at t = 1, 2, ..., n s; bins of 1/N log cycle from the
decades: t is in bin k when 10^(k/N) <= t < 10^((k+1)/N), that is when
t^N >= 10^k and t^N < 10^(k+1) - exact in Python integers. The first reading
of each occupied bin is kept, and the last reading. Output: n N count.
"""


def count(n, per):
    kept, last = 0, None
    for t in range(1, n + 1):
        p = t ** per
        k = len(str(p)) - 1  # largest k with 10^k <= p
        if k != last:
            kept += 1
            last = k
            first_of_bin = t
    # the last reading is kept too, if it is not already the first of its bin
    if first_of_bin != n:
        kept += 1
    return kept


for n, per in [(1000, 10), (12400, 20), (3600, 20), (86400, 20), (100, 5)]:
    print(n, per, count(n, per))
