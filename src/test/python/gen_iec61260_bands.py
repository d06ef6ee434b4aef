#!/usr/bin/env python3
"""Reference band frequencies for org.roseate.bands tests.

Evaluates the base-ten formulas of IEC 61260-1:2014 (octave ratio G = 10^(3/10),
reference frequency fr = 1000 Hz, odd b: fm = fr * G^(x/b), edges fm * G^(-+1/(2b)))
with Python's decimal module at 40 significant digits, independently of the Java code,
and writes src/test/resources/reference/iec61260_bands.csv.

Columns: b, x, mid_hz, low_hz, high_hz, each printed with 20 significant digits.
Run from the project root:  python3 src/test/python/gen_iec61260_bands.py
"""
from decimal import Decimal, getcontext
from pathlib import Path

getcontext().prec = 40

G = Decimal(10) ** (Decimal(3) / Decimal(10))
FR = Decimal(1000)
# Index ranges supported by Band: third-octave 0.4 Hz (x = -34) .. 100 kHz (x = 20),
# octave 0.5 Hz (x = -11) .. 63 kHz (x = 6).
RANGES = {1: range(-11, 7), 3: range(-34, 21)}


def fmt(d: Decimal) -> str:
    return format(d, ".19e")


def main() -> None:
    out = Path(__file__).resolve().parents[2] / "test" / "resources" / "reference" / "iec61260_bands.csv"
    lines = ["# IEC 61260-1:2014 base-ten band frequencies, Python decimal prec=40, gen_iec61260_bands.py",
             "b,x,mid_hz,low_hz,high_hz"]
    for b, xs in RANGES.items():
        for x in xs:
            mid = FR * G ** (Decimal(x) / Decimal(b))
            half = G ** (Decimal(1) / Decimal(2 * b))
            lines.append(f"{b},{x},{fmt(mid)},{fmt(mid / half)},{fmt(mid * half)}")
    out.write_text("\n".join(lines) + "\n", encoding="utf-8")
    print(f"wrote {len(lines) - 2} bands to {out}")


if __name__ == "__main__":
    main()
