#!/usr/bin/env python3
"""Times scipy.signal.sosfilt and scipy.signal.welch on the data BenchData wrote (the same seeded
signal and the same eight sections the JMH benchmarks use) and prints the ratios against the JMH
scores in a JMH JSON result file.

usage: compare_with_scipy.py DATA_DIR JMH_RESULT.json [CPU_PROBE_OUTPUT.txt]

With the output of org.roseate.bench.CpuTimeProbe it also prints the cascade ratio in thread CPU time
(best of repeats on both sides), the figure that holds up on a loaded machine.
"""
import json
import os
import sys
import timeit

import numpy as np
import scipy
import scipy.signal


def blas_report():
    try:
        import threadpoolctl
    except ImportError:  # Debian's python3-threadpoolctl is pure Python; use it from the system path
        sys.path.append("/usr/lib/python3/dist-packages")
        try:
            import threadpoolctl
        except ImportError:  # not installed at all: ask the library itself below
            threadpoolctl = None
    import numpy.linalg  # noqa: F401  (loads numpy's BLAS so threadpoolctl can see it)
    import scipy.linalg  # noqa: F401
    info = threadpoolctl.threadpool_info() if threadpoolctl else []
    found = "; ".join(f"{i.get('internal_api')} {i.get('version')} {i.get('architecture')} threads={i.get('num_threads')}"
                      for i in info)
    if not found:  # older threadpoolctl does not know numpy 2's scipy_openblas: ask the library itself
        import ctypes
        import glob
        for lib in glob.glob(os.path.join(os.path.dirname(np.__file__), "..", "numpy.libs", "*openblas*")):
            cdll = ctypes.CDLL(lib)
            for prefix in ("scipy_openblas", "openblas"):
                fn = getattr(cdll, prefix + "_get_corename64_", None) or getattr(cdll, prefix + "_get_corename", None)
                if fn is not None:
                    fn.restype = ctypes.c_char_p
                    found = f"{os.path.basename(lib)} kernel {fn().decode()} (via the library; threadpoolctl saw none)"
                    break
    env = {k: os.environ[k] for k in ("OPENBLAS_CORETYPE", "OPENBLAS_L2_SIZE") if k in os.environ}
    return (found or "no BLAS pools found") + f"; OPENBLAS_* in this process: {env or 'none'}"


def best_thread_cpu_seconds(fn, repeat=10):
    """Best-of-repeat thread CPU time (time.thread_time): on a shared machine this leaves out the waits
    for a core that wall-clock figures include; CpuTimeProbe measures the Java side the same way."""
    fn()
    return min(_thread_time(fn) for _ in range(repeat))


def _thread_time(fn):
    import time
    t0 = time.thread_time()
    fn()
    return time.thread_time() - t0


def best_seconds(fn, repeat=7):
    fn()  # warm-up
    number = 1
    while timeit.timeit(fn, number=number) < 0.2:
        number *= 2
    return min(timeit.repeat(fn, number=number, repeat=repeat)) / number


def main(data_dir, jmh_json, probe_txt=None):
    settings = dict(line.split("=", 1) for line in open(os.path.join(data_dir, "settings.txt")).read().split())
    x = np.fromfile(os.path.join(data_dir, "signal.f64"), dtype="<f8")
    sos = np.loadtxt(os.path.join(data_dir, "sos.txt"), ndmin=2)
    fs = float(settings["rate_hz"])
    nperseg = int(settings["welch_segment"])
    sections = sos.shape[0]
    assert len(x) == int(settings["samples"]) and sections == int(settings["sections"])

    t_sos = best_seconds(lambda: scipy.signal.sosfilt(sos, x))
    t_welch = best_seconds(lambda: scipy.signal.welch(x, fs=fs, nperseg=nperseg))
    scipy_section_samples_per_us = len(x) * sections / t_sos / 1e6
    scipy_welch_ms = t_welch * 1e3
    cpu_sos = best_thread_cpu_seconds(lambda: scipy.signal.sosfilt(sos, x))
    scipy_cpu_section_samples_per_us = len(x) * sections / cpu_sos / 1e6

    scores = {}
    for r in json.load(open(jmh_json)):
        name = r["benchmark"].rsplit(".", 2)
        key = name[-2] + "." + name[-1]
        params = r.get("params") or {}
        if "design" in params:
            key += "[" + params["design"] + "]"
        err = r["primaryMetric"]["scoreError"]
        err = float(err) if not isinstance(err, str) else float("nan")
        scores[key] = (float(r["primaryMetric"]["score"]), err, r["primaryMetric"]["scoreUnit"])

    print(f"numpy {np.__version__}, scipy {scipy.__version__}; {blas_report()}")
    print(f"data: {len(x)} samples (seeded float64), {sections} sections at {settings['sos_rate_hz']} Hz, "
          f"welch nperseg={nperseg} noverlap={nperseg // 2} hann, constant detrend, mean")
    print()
    print(f"{'measure':<46}{'roseate (JMH)':>20}{'scipy':>14}{'ratio':>10}")
    cas = scores.get("SosCascadeBench.cascade")
    if cas:
        print(f"{'SOS cascade, section-samples/us (higher wins)':<46}{cas[0]:>14.1f} ±{cas[1]:<4.1f}"
              f"{scipy_section_samples_per_us:>14.1f}{cas[0] / scipy_section_samples_per_us:>9.2f}x")
    if probe_txt and os.path.exists(probe_txt):
        import re
        for line in open(probe_txt):
            m = re.search(r"SosCascadeBench.cascade: .* = ([0-9.]+) section-samples/us", line)
            if m:
                java_cpu = float(m.group(1))
                print(f"{'SOS cascade, thread CPU time, best of repeats':<46}{java_cpu:>14.1f}      "
                      f"{scipy_cpu_section_samples_per_us:>14.1f}{java_cpu / scipy_cpu_section_samples_per_us:>9.2f}x")
    w = scores.get("WelchBench.welch")
    if w:
        print(f"{'Welch 2^20 samples + snapshot, ms (lower wins)':<46}{w[0]:>14.2f} ±{w[1]:<4.2f}"
              f"{scipy_welch_ms:>14.2f}{scipy_welch_ms / w[0]:>9.2f}x")
    print()
    for k in sorted(scores):
        if k.startswith("ChainBench") or k.startswith("LiveChainBench"):
            ms = scores[k][0]
            print(f"{k:<60} {ms:8.2f} ms per second of 48 kHz stereo audio = {ms / 10:5.2f} % of one core")
    a = scores.get("AnalyzeCliBench.analyzeBenchPink")
    if a:
        print(f"{'AnalyzeCliBench.analyzeBenchPink (in process, warm)':<60} {a[0]:8.2f} ms")


if __name__ == "__main__":
    main(sys.argv[1], sys.argv[2], sys.argv[3] if len(sys.argv) > 3 else None)
