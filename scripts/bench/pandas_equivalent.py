"""The benchmark's pandas + numpy counterpart: the same ingestion checks and the same analysis as
the TypeScript engine, on the same file, written the way numpy is meant to be used.

Prints one JSON line: ingest and analysis times, peak RSS, and the headline numbers so the two
implementations can be compared for agreement as well as for speed.
"""
import json
import resource
import sys
import time

import numpy as np
import pandas as pd

HARMONICS = 50
HARMONIC_WINDOW_SAMPLES = 1 << 18
DEVIATION_CYCLES = 50
CROSSING_SAMPLES = 1 << 20


def coarse_frequency(x, fs):
    """Hann-windowed FFT peak with the three-bin Hann interpolator, as in the engine."""
    size = 1 << min(16, int(np.log2(len(x))))
    seg = (x[:size] - x.mean()) * (0.5 - 0.5 * np.cos(2 * np.pi * np.arange(size) / size))
    mag = np.abs(np.fft.rfft(seg))
    k = int(np.argmax(mag[2:size // 2])) + 2
    left, right = mag[k - 1], mag[k + 1]
    delta = (2 * right - mag[k]) / (mag[k] + right) if right >= left else -(2 * left - mag[k]) / (mag[k] + left)
    return (k + delta) * fs / size


def zero_crossing_frequency(x, fs):
    centred = x - x.mean()
    rising = np.flatnonzero((centred[:-1] < 0) & (centred[1:] >= 0))
    frac = -centred[rising] / (centred[rising + 1] - centred[rising])
    position = rising + frac
    return (len(position) - 1) * fs / (position[-1] - position[0])


def refine_frequency(x, fs, f):
    """Phase drift of the fundamental between the two halves of the record."""
    for _ in range(2):
        spc = fs / f
        half = int(np.floor(len(x) / spc / 2))
        n = int(round(half * spc))
        w = 2 * np.pi * f / fs
        basis = np.exp(-1j * w * np.arange(n))
        a = np.dot(x[:n], basis)
        b = np.dot(x[n:2 * n], basis)
        drift = np.angle(b / a) - w * n
        drift -= 2 * np.pi * np.round(drift / (2 * np.pi))
        f += drift * fs / (2 * np.pi * n)
    return f


def deviation_factor(x, fs, f, dc, ac_rms, phase):
    peak = np.sqrt(2) * ac_rms
    spc = fs / f
    worst = []
    for c in range(DEVIATION_CYCLES):
        first, last = int(np.ceil(c * spc)), int(np.ceil((c + 1) * spc))
        n = np.arange(first, last)
        values = x[first:last] - dc
        phis = phase + np.pi / 2 + np.radians(np.linspace(-30, 30, 61))
        gaps = np.abs(values[None, :] - peak * np.sin(2 * np.pi * f / fs * n[None, :] + phis[:, None])).max(axis=1)
        best = phis[np.argmin(gaps)]
        fine = best + np.radians(np.linspace(-1, 1, 81))
        gaps = np.abs(values[None, :] - peak * np.sin(2 * np.pi * f / fs * n[None, :] + fine[:, None])).max(axis=1)
        worst.append(gaps.min() / peak)
    return 100 * float(np.mean(worst))


def main(path):
    start = time.perf_counter()
    frame = pd.read_csv(path)
    t = frame.iloc[:, 0].to_numpy()
    channels = [frame.iloc[:, c].to_numpy() for c in range(1, frame.shape[1])]
    steps = np.diff(t)
    if not (steps > 0).all():
        raise SystemExit("time stamps not increasing")
    mean_step = (t[-1] - t[0]) / (len(t) - 1)
    if max(steps.max() - mean_step, mean_step - steps.min()) > 0.25 * mean_step:
        raise SystemExit("irregular time stamps")
    ingested = time.perf_counter()

    fs = 1 / mean_step
    reference = channels[0]
    f_zc = zero_crossing_frequency(reference[:CROSSING_SAMPLES], fs)
    f0 = refine_frequency(reference, fs, coarse_frequency(reference, fs))
    spc = fs / f0
    cycles = int(np.floor(len(t) / spc + 1e-6))
    n = int(round(cycles * spc))
    h_cycles = min(cycles, max(10, int(HARMONIC_WINDOW_SAMPLES / spc)))
    n_h = int(round(h_cycles * spc))
    results, phasors = [], []
    for x in channels:
        w = x[:n]
        dc = float(w.mean())
        rms = float(np.sqrt(np.mean(w * w)))
        peak = float(np.abs(w).max())
        head = x[:n_h]
        clipped = int(np.count_nonzero(head == head.max()) + np.count_nonzero(head == head.min()))
        spectrum = np.fft.rfft(x[:n_h])
        bins = h_cycles * np.arange(1, HARMONICS + 1)
        bins = bins[bins < len(spectrum)]
        comp = spectrum[bins] * 2 / n_h
        rms_h = np.abs(comp) / np.sqrt(2)
        thd = float(100 * np.sqrt(np.sum(rms_h[1:] ** 2)) / rms_h[0])
        ac_rms = np.sqrt(max(0.0, rms * rms - dc * dc))
        dev = deviation_factor(x, fs, f0, dc, ac_rms, np.angle(comp[0]))
        phasors.append(comp[0])
        results.append({"rms": rms, "dc": dc, "peak": peak, "thd": thd, "deviation": dev, "clipped": clipped})
    a = np.exp(2j * np.pi / 3)
    va, vb, vc = phasors[:3]
    v1 = (va + a * vb + a * a * vc) / 3
    v2 = (va + a * a * vb + a * vc) / 3
    vuf = float(100 * abs(v2) / abs(v1))
    line_rms = np.array([r["rms"] for r in results[:3]])
    nema = float(100 * np.abs(line_rms - line_rms.mean()).max() / line_rms.mean())
    displacement = [float(np.degrees(np.angle(p / q))) for p, q in ((va, vb), (vb, vc), (vc, va))]
    done = time.perf_counter()
    print(json.dumps({
        "ingestS": ingested - start,
        "analyseS": done - ingested,
        "totalS": done - start,
        "peakRssMb": resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
        "frequencyHz": f0,
        "frequencyZeroCrossingHz": f_zc,
        "thdFPercent": results[0]["thd"],
        "rms": results[0]["rms"],
        "deviationFactorPercent": results[0]["deviation"],
        "vufPercent": vuf,
        "nemaPercent": nema,
        "displacementDeg": displacement,
    }))


if __name__ == "__main__":
    main(sys.argv[1])
