"""Shared timing for the numpy twins of bench/workloads: same JSON line as bench/measure.ts.

run.mjs starts each script in a fresh process with OPENBLAS_NUM_THREADS=1 (and
the other BLAS thread variables), so numbers compare single-threaded work, and
measures wall time and peak RSS itself.
"""
import json
import sys
import time

import numpy as np


def measure(workload, work):
    t0 = time.perf_counter()
    result = work()
    compute_ms = (time.perf_counter() - t0) * 1e3
    sys.stdout.write(json.dumps({"workload": workload, "computeMs": compute_ms, "numpy": np.__version__, "result": result}) + "\n")
