"""The benchmark's pandas + numpy counterpart: the same ingestion and analysis on the same file.

Prints one JSON line: ingest and analysis times, peak RSS, and the headline numbers so the two
implementations can be compared for agreement as well as speed.
"""
import json
import resource
import sys
import time

import numpy as np
import pandas as pd

HARMONICS = 50


def fundamental_frequency(x, fs):
    size = 1 << min(16, int(np.log2(len(x))))
    seg = (x[:size] - x[:size].mean()) * np.hanning(size + 1)[:-1]
    mag = np.abs(np.fft.rfft(seg))
    k = int(np.argmax(mag[2:])) + 2
    left, right = mag[k - 1], mag[k + 1]
    if right >= left:
        delta = (2 * right - mag[k]) / (mag[k] + right)
    else:
        delta = -(2 * left - mag[k]) / (mag[k] + left)
    return (k + delta) * fs / size


def main(path):
    start = time.perf_counter()
    frame = pd.read_csv(path)
    t = frame.iloc[:, 0].to_numpy()
    channels = [frame.iloc[:, c].to_numpy() for c in range(1, frame.shape[1])]
    ingested = time.perf_counter()
    fs = (len(t) - 1) / (t[-1] - t[0])
    f0 = fundamental_frequency(channels[0], fs)
    cycles = int((len(t) - 2) * f0 / fs)
    n = int(round(cycles * fs / f0))
    results = []
    phasors = []
    for x in channels:
        w = x[:n]
        spectrum = np.fft.rfft(w)
        bins = cycles * np.arange(1, HARMONICS + 1)
        bins = bins[bins < len(spectrum)]
        comp = spectrum[bins] * 2 / n
        rms_h = np.abs(comp) / np.sqrt(2)
        rms = float(np.sqrt(np.mean(w * w)))
        thd = float(100 * np.sqrt(np.sum(rms_h[1:] ** 2)) / rms_h[0])
        phasors.append(comp[0])
        results.append({"rms": rms, "dc": float(w.mean()), "peak": float(np.abs(w).max()), "thd": thd})
    a = np.exp(2j * np.pi / 3)
    va, vb, vc = phasors[:3]
    v1 = (va + a * vb + a * a * vc) / 3
    v2 = (va + a * a * vb + a * vc) / 3
    vuf = float(100 * abs(v2) / abs(v1))
    done = time.perf_counter()
    print(json.dumps({
        "ingestS": ingested - start,
        "analyseS": done - ingested,
        "totalS": done - start,
        "peakRssMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        "frequencyHz": f0,
        "thdFPercent": results[0]["thd"],
        "rms": results[0]["rms"],
        "vufPercent": vuf,
    }))


if __name__ == "__main__":
    main(sys.argv[1])
