"""Shared timing for the numpy twins of bench/workloads: same JSON line as bench/measure.ts.

run.mjs starts each script in a fresh process with OPENBLAS_NUM_THREADS=1 (and
the other BLAS thread variables), so numbers compare single-threaded work.
ru_maxrss is in kilobytes on Linux.
"""
import json
import resource
import sys
import time

import numpy as np


def measure(workload, work):
    t0 = time.perf_counter()
    result = work()
    compute_ms = (time.perf_counter() - t0) * 1e3
    rss = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    sys.stdout.write(json.dumps({"workload": workload, "computeMs": compute_ms, "maxRssKb": rss, "numpy": np.__version__, "result": result}) + "\n")
