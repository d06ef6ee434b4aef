#!/usr/bin/env python3
"""The numpy + scipy side of the whole-process jobs of issue 17 (interpreter start and imports
included when timed as a command by whole-process.sh):

  render DATA_DIR OUT.wav SECONDS   the job of `roseate render presets/bench-pink.json --bits 32f
      --seconds SECONDS`: seeded Gaussian noise at the chain's oversampled rate (factor M from
      DATA_DIR/bench-pink.txt, written by org.roseate.bench.BenchData), scipy.signal.sosfilt with the
      same sections Roseate runs (DATA_DIR/bench-pink-sos.txt), decimation by M with
      scipy.signal.resample_poly (polyphase FIR), scaled to -20 dBFS RMS (full-scale sine = 0 dBFS),
      written as a 48 kHz 32-bit float WAV by scipy.io.wavfile.write; prints RMS and peak. Filtered
      in blocks of one second; the float32 output is held in memory (115 MB for 600 s) until written.
  measure IN.wav NPERSEG   the job of `roseate measure IN.wav --segment NPERSEG`: scipy.io.wavfile.read,
      scipy.signal.welch (Hann, 50 % overlap, density), IEC 61260-1 base-ten third-octave band levels
      20 Hz - 20 kHz as sums of the density over the bins inside each band times the bin width; prints
      RMS, DC, peak and the band table.
"""
import os
import sys

import numpy as np
import scipy.io.wavfile
import scipy.signal

RATE_HZ = 48000


def render(data_dir, out, seconds):
    settings = dict(line.split("=", 1) for line in open(os.path.join(data_dir, "bench-pink.txt")).read().split())
    factor = int(settings["factor"])
    sos = np.loadtxt(os.path.join(data_dir, "bench-pink-sos.txt"), ndmin=2)
    rng = np.random.default_rng(1)
    zi = np.zeros((sos.shape[0], 2))
    # decimation: the Kaiser-window FIR resample_poly designs for down=M, run polyphase by upfirdn on
    # each block with the previous block's last len(taps)-1 samples in front (exact streaming FIR)
    taps = scipy.signal.firwin(2 * 10 * factor + 1, 1.0 / factor, window=("kaiser", 5.0))
    skip = (len(taps) - 1) // factor
    tail = np.zeros(len(taps) - 1)
    y = np.empty(int(seconds * RATE_HZ), dtype=np.float32)
    pos = 0
    for _ in range(int(seconds)):
        x = rng.standard_normal(RATE_HZ * factor)
        v, zi = scipy.signal.sosfilt(sos, x, zi=zi)
        d = scipy.signal.upfirdn(taps, np.concatenate((tail, v)), up=1, down=factor)[skip:skip + RATE_HZ]
        tail = v[len(v) - len(tail):]
        y[pos:pos + RATE_HZ] = d
        pos += RATE_HZ
    rms = float(np.sqrt(np.mean(y.astype(np.float64) ** 2)))
    y *= np.float32(10 ** (-20 / 20) / np.sqrt(2) / rms)
    scipy.io.wavfile.write(out, RATE_HZ, y)
    print(f"RMS {20 * np.log10(np.sqrt(np.mean(y.astype(np.float64) ** 2)) * np.sqrt(2)):.2f} dBFS, "
          f"peak {20 * np.log10(np.max(np.abs(y))):.2f} dBFS")


def third_octave_bands(lo_hz=20.0, hi_hz=20000.0):
    bands = []
    for k in range(-20, 14):
        fm = 1000.0 * 10 ** (k / 10)
        if lo_hz * 0.99 <= fm <= hi_hz * 1.01:
            bands.append((fm, fm * 10 ** (-1 / 20), fm * 10 ** (1 / 20)))
    return bands


def measure(path, nperseg):
    fs, x = scipy.io.wavfile.read(path)
    if x.ndim > 1:
        x = x[:, 0]
    x = x.astype(np.float64)
    f, pxx = scipy.signal.welch(x, fs=fs, nperseg=nperseg)
    df = f[1] - f[0]
    print(f"RMS {20 * np.log10(np.sqrt(np.mean(x ** 2)) * np.sqrt(2)):.2f} dBFS, DC {np.mean(x):.6f}, "
          f"peak {np.max(np.abs(x)):.4f}")
    for fm, lo, hi in third_octave_bands():
        inside = (f >= lo) & (f < hi)
        p = np.sum(pxx[inside]) * df
        print(f"{fm:10.1f} {lo:10.2f} {hi:10.2f} {10 * np.log10(2 * p):9.3f}")


if __name__ == "__main__":
    if sys.argv[1] == "render":
        render(sys.argv[2], sys.argv[3], float(sys.argv[4]))
    elif sys.argv[1] == "measure":
        measure(sys.argv[2], int(sys.argv[3]))
    else:
        sys.exit("usage: whole_process_jobs.py render DATA_DIR OUT.wav SECONDS | measure IN.wav NPERSEG")
