#!/usr/bin/python3
"""Reference percentiles for tests/reports/stats.test.ts, computed with numpy (Debian python3-numpy).

Run: /usr/bin/python3 tests/reports/make-stats-references.py > tests/reports/stats-references.json
"""
import json
import numpy as np

rng = np.random.default_rng(20261201)
cases = {
    "single": [2.5],
    "two": [1.0, 3.0],
    "seven-with-ties": [3.1, 2.9, 2.9, 3.4, 2.2, 3.1, 2.7],
    "gsd-like-500": list(np.round(rng.normal(3.0, 0.25, 500), 6)),
    "skewed-61": list(np.round(rng.gamma(2.0, 0.6, 61) + 1.5, 6)),
}
qs = [0, 5, 25, 50, 95, 100]
out = {"tool": f"numpy {np.__version__} (numpy.percentile, default method 'linear')", "cases": []}
for name, values in cases.items():
    a = np.array(values, dtype=np.float64)
    lo, hi = 2.7, 3.3
    out["cases"].append({
        "name": name,
        "values": [float(v) for v in a],
        "percentiles": {str(q): float(np.percentile(a, q)) for q in qs},
        "median": float(np.median(a)),
        "min": float(a.min()),
        "max": float(a.max()),
        "band": [lo, hi],
        "shareWithinBand": float(np.mean((a >= lo) & (a <= hi))),
    })
print(json.dumps(out, indent=1))
