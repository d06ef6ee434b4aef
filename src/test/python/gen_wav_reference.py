#!/usr/bin/env python3
"""Writes the reference WAV files for WavReaderReferenceTest and their expected samples.

Run from the project root:  python3 src/test/python/gen_wav_reference.py
Made with: Python 3.11 (module wave), numpy 2.4, scipy 1.17.1 (scipy.io.wavfile).

Each NAME.wav comes with NAME.expected.txt: line 1 "rate channels encoding frames", then one
line per frame with the samples normalised to full scale, as decoded by scipy.io.wavfile.read
(the independent reference decoder): integer codes / 2^(container bits - 1), 8-bit as
(code - 128) / 128, float unchanged, printed with 17 significant digits (exact round trip).
Files not written by scipy itself (wave module, hand-built extensible and LIST layouts) are
therefore still checked against scipy's reading of them.
"""
import io
import os
import struct
import wave

import numpy as np
import scipy.io.wavfile as wavfile

OUT = os.path.join(os.path.dirname(__file__), "..", "resources", "io")
RNG = np.random.default_rng(20240611)  # seeded: the files are reproducible


def codes(bits, frames, channels):
    """Random integer codes covering the full range, including both extremes."""
    lo, hi = -(1 << (bits - 1)), (1 << (bits - 1)) - 1
    c = RNG.integers(lo, hi, size=(frames, channels), endpoint=True, dtype=np.int64)
    c[0, 0], c[1, 0] = lo, hi
    return c


def write_with_wave(path, rate, bits, c):
    """PCM via Python's wave module (tag 1, 16-byte fmt chunk)."""
    frames, channels = c.shape
    if bits == 8:
        raw = (c + 128).astype(np.uint8).tobytes()
    else:
        u = (c & ((1 << bits) - 1)).astype(np.uint32)
        b = np.stack([(u >> (8 * k)) & 0xFF for k in range(bits // 8)], axis=-1)
        raw = b.astype(np.uint8).tobytes()
    with wave.open(path, "wb") as w:
        w.setnchannels(channels)
        w.setsampwidth(bits // 8)
        w.setframerate(rate)
        w.writeframes(raw)


def chunk(cid, body):
    pad = b"\x00" if len(body) % 2 else b""
    return cid + struct.pack("<I", len(body)) + body + pad


def write_extensible(path, rate, channels, bits, sub_tag, raw, frames):
    """WAVE_FORMAT_EXTENSIBLE per Microsoft's WAVEFORMATEXTENSIBLE layout, built by hand."""
    block = channels * bits // 8
    guid = struct.pack("<IHH", sub_tag, 0x0000, 0x0010) + bytes.fromhex("800000aa00389b71")
    fmt = struct.pack("<HHIIHHHHI", 0xFFFE, channels, rate, rate * block, block, bits,
                      22, bits, 0x3F if channels == 6 else 0) + guid
    body = b"WAVE" + chunk(b"fmt ", fmt)
    if sub_tag == 3:
        body += chunk(b"fact", struct.pack("<I", frames))
    body += chunk(b"data", raw)
    with open(path, "wb") as f:
        f.write(b"RIFF" + struct.pack("<I", len(body)) + body)


def with_odd_list(src_bytes):
    """Inserts an odd-sized LIST/INFO chunk (plus its pad byte) before 'data', and another after."""
    i = src_bytes.index(b"data")
    # ISFT body of 13 bytes with no inner pad (as some writers do), so the LIST size is odd (29)
    info = b"INFO" + b"ISFT" + struct.pack("<I", 13) + b"roseate ref\x00\x00"
    assert len(info) % 2 == 1
    lst = chunk(b"LIST", info)
    tail = chunk(b"zzzz", b"abc")
    body = src_bytes[12:i] + lst + src_bytes[i:] + tail
    return b"RIFF" + struct.pack("<I", len(body) + 4) + b"WAVE" + body


def expected(path, encoding):
    rate, data = wavfile.read(path)
    if data.ndim == 1:
        data = data[:, None]
    if data.dtype == np.uint8:
        x = (data.astype(np.float64) - 128) / 128
    elif data.dtype.kind == "i":
        x = data.astype(np.float64) / -np.iinfo(data.dtype).min
    else:
        x = data.astype(np.float64)
    name = os.path.splitext(path)[0] + ".expected.txt"
    with open(name, "w") as f:
        f.write(f"{rate} {x.shape[1]} {encoding} {x.shape[0]}\n")
        for row in x:
            f.write(" ".join(f"{v:.17g}" for v in row) + "\n")


def main():
    os.makedirs(OUT, exist_ok=True)
    p = lambda n: os.path.join(OUT, n)

    write_with_wave(p("wave_pcm8_mono.wav"), 8000, 8, codes(8, 33, 1))   # odd data size: pad
    expected(p("wave_pcm8_mono.wav"), "8")

    write_with_wave(p("wave_pcm24_stereo.wav"), 48000, 24, codes(24, 20, 2))
    expected(p("wave_pcm24_stereo.wav"), "24")

    x64 = RNG.uniform(-1, 1, size=24)
    x64[0], x64[1] = -1.0, 1.0
    wavfile.write(p("scipy_float64_mono.wav"), 96000, x64)
    expected(p("scipy_float64_mono.wav"), "64f")

    x32 = RNG.uniform(-1, 1, size=(16, 2)).astype(np.float32)
    wavfile.write(p("scipy_float32_stereo.wav"), 44100, x32)
    expected(p("scipy_float32_stereo.wav"), "32f")

    c24 = codes(24, 10, 6)
    u = (c24 & 0xFFFFFF).astype(np.uint32)
    raw24 = np.stack([(u >> (8 * k)) & 0xFF for k in range(3)], axis=-1).astype(np.uint8)
    write_extensible(p("ext_pcm24_6ch.wav"), 48000, 6, 24, 1, raw24.tobytes(), 10)
    expected(p("ext_pcm24_6ch.wav"), "24")

    xf = RNG.uniform(-1, 1, size=(12, 3)).astype("<f4")
    write_extensible(p("ext_float32_3ch.wav"), 192000, 3, 32, 3, xf.tobytes(), 12)
    expected(p("ext_float32_3ch.wav"), "32f")

    buf = io.BytesIO()
    wavfile.write(buf, 44100, codes(16, 15, 1).astype(np.int16))
    with open(p("scipy_pcm16_odd_list.wav"), "wb") as f:
        f.write(with_odd_list(buf.getvalue()))
    expected(p("scipy_pcm16_odd_list.wav"), "16")


if __name__ == "__main__":
    main()
