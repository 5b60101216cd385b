"""Vectorised numpy re-implementation of Sondage's selection contract, for the engine benchmark.

Reads float64 book values from argv[1]; argv[2..] = seed, sampleSize, interval, runs.
Prints JSON: median timings (ms) and the selections, so the caller can check they agree.
"""
import json
import sys
import time

import numpy as np


def select_random(n_items, sample_size, seed):
    u = np.random.RandomState(seed).random_sample(n_items)
    part = np.argpartition(u, sample_size - 1)[:sample_size]
    return part[np.lexsort((part, u[part]))]


def select_pps(book, interval, seed):
    cents = np.round(book * 100).astype(np.int64)
    frame = np.flatnonzero(cents > 0)
    cumulative = np.cumsum(cents[frame])
    j = int(round(interval * 100))
    start = 1 + int(np.floor(np.random.RandomState(seed).random_sample() * j))
    points = np.arange(start, cumulative[-1] + 1, j, dtype=np.int64)
    hit = frame[np.searchsorted(cumulative, points, side="left")]
    items, counts = np.unique(hit, return_counts=True)
    return items, counts


def median_ms(fn, runs):
    times = []
    for _ in range(runs):
        t = time.perf_counter()
        fn()
        times.append((time.perf_counter() - t) * 1000)
    return float(np.median(times))


def main():
    book = np.fromfile(sys.argv[1], dtype=np.float64)
    seed, sample_size, interval, runs = int(sys.argv[2]), int(sys.argv[3]), float(sys.argv[4]), int(sys.argv[5])
    random_ms = median_ms(lambda: select_random(book.size, sample_size, seed), runs)
    pps_ms = median_ms(lambda: select_pps(book, interval, seed), runs)
    items, counts = select_pps(book, interval, seed)
    print(json.dumps({
        "numpy": np.__version__,
        "randomMs": random_ms,
        "ppsMs": pps_ms,
        "random": select_random(book.size, sample_size, seed).tolist(),
        "ppsItems": items.tolist(),
        "ppsCounts": counts.tolist(),
    }))


main()
