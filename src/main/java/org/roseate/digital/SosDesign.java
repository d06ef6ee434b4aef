package org.roseate.digital;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.roseate.model.Complex;

/**
 * An immutable cascade of second-order sections at one sample rate; H(z) = ∏ sections[i](z).
 * Sections run in list order (section 0 first).
 *
 * @param sections     the sections, at least one
 * @param sampleRateHz sample rate in Hz, finite and &gt; 0
 */
public record SosDesign(List<Biquad> sections, double sampleRateHz) {
    /** Relative tolerance for telling real roots and conjugate pairs apart (scipy's 100·eps). */
    private static final double PAIR_TOLERANCE = 100 * Math.ulp(1.0);
    /** Points of the log-spaced grid on which {@link #withHeadroomScaling()} looks for each peak. */
    private static final int PEAK_GRID_POINTS = 2048;

    public SosDesign {
        sections = List.copyOf(sections);
        if (sections.isEmpty()) {
            throw new IllegalArgumentException("sections must not be empty");
        }
        if (!(sampleRateHz > 0) || !Double.isFinite(sampleRateHz)) {
            throw new IllegalArgumentException("sampleRateHz=" + sampleRateHz + " must be finite and > 0");
        }
    }

    /**
     * Pairs poles and zeros into sections by the 'nearest' rule of scipy.signal.zpk2sos (scipy 1.17):
     * pad with roots at the origin to equal, even counts; repeatedly take the remaining pole closest to
     * the unit circle, pair it with its nearest zero and complete the section with the conjugates (or
     * the next real pole and nearest real zero); fill sections from the last to the first, so the poles
     * closest to the unit circle run last. The overall gain goes into the numerator of section 0, as in
     * scipy; call {@link #withHeadroomScaling()} to spread it for headroom.
     *
     * @param zpk digital zpk; complex roots must come in conjugate pairs
     * @throws IllegalArgumentException if a complex root has no conjugate partner
     */
    public static SosDesign fromZpk(DigitalZpk zpk) {
        List<Complex> zIn = new ArrayList<>(zpk.zeros());
        List<Complex> pIn = new ArrayList<>(zpk.poles());
        if (zIn.isEmpty() && pIn.isEmpty()) {
            return new SosDesign(List.of(new Biquad(zpk.gain(), 0, 0, 0, 0)), zpk.sampleRateHz());
        }
        while (pIn.size() < zIn.size()) {
            pIn.add(Complex.ZERO);
        }
        while (zIn.size() < pIn.size()) {
            zIn.add(Complex.ZERO);
        }
        int nSections = (pIn.size() + 1) / 2;
        if (pIn.size() % 2 == 1) {
            pIn.add(Complex.ZERO);
            zIn.add(Complex.ZERO);
        }
        List<Root> z = splitPairs(zIn, "zero");
        List<Root> p = splitPairs(pIn, "pole");
        Biquad[] out = new Biquad[nSections];
        for (int si = nSections - 1; si >= 0; si--) {
            Root p1 = p.remove(worst(p));
            if (p1.real && countReal(p) == 0) {
                Root z1 = z.remove(nearest(z, p1, Kind.REAL));
                out[si] = section(new Root[] {z1, Root.ORIGIN}, new Root[] {p1, Root.ORIGIN});
            } else if (p.size() + 1 == z.size() && !p1.real && countReal(p) == 1 && countReal(z) == 1) {
                Root z1 = z.remove(nearest(z, p1, Kind.COMPLEX));
                out[si] = section(new Root[] {z1, z1.conj()}, new Root[] {p1, p1.conj()});
            } else {
                Root p2;
                if (p1.real) {
                    List<Root> reals = new ArrayList<>();
                    for (Root r : p) {
                        if (r.real) {
                            reals.add(r);
                        }
                    }
                    p2 = reals.get(worst(reals));
                    p.remove(p2);
                } else {
                    p2 = p1.conj();
                }
                if (!z.isEmpty()) {
                    Root z1 = z.remove(nearest(z, p1, Kind.ANY));
                    if (!z1.real) {
                        out[si] = section(new Root[] {z1, z1.conj()}, new Root[] {p1, p2});
                    } else if (!z.isEmpty()) {
                        Root z2 = z.remove(nearest(z, p1, Kind.REAL));
                        out[si] = section(new Root[] {z1, z2}, new Root[] {p1, p2});
                    } else {
                        out[si] = section(new Root[] {z1}, new Root[] {p1, p2});
                    }
                } else {
                    out[si] = section(new Root[0], new Root[] {p1, p2});
                }
            }
        }
        out[0] = out[0].scaledBy(zpk.gain());
        return new SosDesign(List.of(out), zpk.sampleRateHz());
    }

    /**
     * The same filter with its gain redistributed for headroom: every section after the first is scaled
     * so that its peak magnitude over 0..fs/2 (searched on a 2048-point log grid plus DC and Nyquist) is 1,
     * and the first section takes the remaining gain. The product response is unchanged up to rounding.
     */
    public SosDesign withHeadroomScaling() {
        List<Biquad> scaled = new ArrayList<>(sections.size());
        double carried = 1;
        for (int i = 1; i < sections.size(); i++) {
            double peak = peakMagnitude(sections.get(i));
            if (peak > 0 && Double.isFinite(peak)) {
                scaled.add(sections.get(i).scaledBy(1 / peak));
                carried *= peak;
            } else {
                scaled.add(sections.get(i));
            }
        }
        scaled.add(0, sections.get(0).scaledBy(carried));
        return new SosDesign(scaled, sampleRateHz);
    }

    /** Number of poles of the cascade away from z = 0 (sum of {@link Biquad#order()}). */
    public int order() {
        int n = 0;
        for (Biquad b : sections) {
            n += b.order();
        }
        return n;
    }

    /** H(e^{j2π·hz/fs}) of the cascade, hz in Hz. */
    public Complex response(double hz) {
        double w = 2 * Math.PI * hz / sampleRateHz;
        Complex h = Complex.ONE;
        for (Biquad b : sections) {
            h = h.times(b.response(w));
        }
        return h;
    }

    /**
     * Cascade response at many frequencies (like scipy.signal.freqz_sos with fs given).
     *
     * @param hz    frequencies in Hz
     * @param outRe real parts, length ≥ hz.length
     * @param outIm imaginary parts, length ≥ hz.length
     */
    public void response(double[] hz, double[] outRe, double[] outIm) {
        if (outRe.length < hz.length || outIm.length < hz.length) {
            throw new IllegalArgumentException("output arrays (" + outRe.length + ", " + outIm.length
                    + ") shorter than hz (" + hz.length + ")");
        }
        for (int i = 0; i < hz.length; i++) {
            Complex h = response(hz[i]);
            outRe[i] = h.re();
            outIm[i] = h.im();
        }
    }

    private double peakMagnitude(Biquad b) {
        double nyquist = sampleRateHz / 2;
        double peak = Math.max(b.response(0).abs(), b.response(Math.PI).abs());
        double lo = Math.log(nyquist * 1e-7);
        double step = (Math.log(nyquist) - lo) / (PEAK_GRID_POINTS - 1);
        for (int i = 0; i < PEAK_GRID_POINTS; i++) {
            double hz = Math.exp(lo + i * step);
            peak = Math.max(peak, b.response(2 * Math.PI * hz / sampleRateHz).abs());
        }
        return peak;
    }

    // ---- zpk2sos helpers ----

    private enum Kind { REAL, COMPLEX, ANY }

    /** A root; complex pairs are represented once, by the member with positive imaginary part. */
    private record Root(double re, double im, boolean real) {
        static final Root ORIGIN = new Root(0, 0, true);

        Root conj() {
            return new Root(re, -im, real);
        }

        double abs() {
            return Math.hypot(re, im);
        }

        double distanceTo(Root o) {
            return Math.hypot(re - o.re, im - o.im);
        }
    }

    /** scipy's _cplxreal: pairs (averaged, positive imaginary part, sorted by re then |im|) first, then reals by value. */
    private static List<Root> splitPairs(List<Complex> roots, String what) {
        List<Complex> sorted = new ArrayList<>(roots);
        sorted.sort(Comparator.comparingDouble(Complex::re).thenComparingDouble(c -> Math.abs(c.im())));
        List<Root> reals = new ArrayList<>();
        List<Complex> pos = new ArrayList<>();
        List<Complex> neg = new ArrayList<>();
        for (Complex c : sorted) {
            if (Math.abs(c.im()) <= PAIR_TOLERANCE * c.abs()) {
                reals.add(new Root(c.re(), 0, true));
            } else if (c.im() > 0) {
                pos.add(c);
            } else {
                neg.add(c);
            }
        }
        if (pos.size() != neg.size()) {
            throw new IllegalArgumentException("a complex " + what + " has no conjugate partner: " + roots);
        }
        sortRunsByImag(pos);
        sortRunsByImag(neg);
        List<Root> out = new ArrayList<>(pos.size() + reals.size());
        for (int i = 0; i < pos.size(); i++) {
            Complex a = pos.get(i);
            Complex b = neg.get(i).conjugate();
            if (a.minus(b).abs() > PAIR_TOLERANCE * b.abs()) {
                throw new IllegalArgumentException("a complex " + what + " has no conjugate partner: " + roots);
            }
            Complex mean = a.plus(b).times(0.5);
            out.add(new Root(mean.re(), mean.im(), false));
        }
        out.addAll(reals);
        return out;
    }

    private static void sortRunsByImag(List<Complex> list) {
        int start = 0;
        while (start < list.size()) {
            int stop = start + 1;
            while (stop < list.size()
                    && list.get(stop).re() - list.get(stop - 1).re() <= PAIR_TOLERANCE * list.get(stop - 1).abs()) {
                stop++;
            }
            list.subList(start, stop).sort(Comparator.comparingDouble(c -> Math.abs(c.im())));
            start = stop;
        }
    }

    private static int worst(List<Root> roots) {
        int best = 0;
        double bestD = Double.POSITIVE_INFINITY;
        for (int i = 0; i < roots.size(); i++) {
            double d = Math.abs(1 - roots.get(i).abs());
            if (d < bestD) {
                bestD = d;
                best = i;
            }
        }
        return best;
    }

    private static int countReal(List<Root> roots) {
        int n = 0;
        for (Root r : roots) {
            if (r.real) {
                n++;
            }
        }
        return n;
    }

    private static int nearest(List<Root> from, Root to, Kind kind) {
        int best = -1;
        double bestD = Double.POSITIVE_INFINITY;
        for (int i = 0; i < from.size(); i++) {
            Root r = from.get(i);
            if ((kind == Kind.REAL && !r.real) || (kind == Kind.COMPLEX && r.real)) {
                continue;
            }
            double d = r.distanceTo(to);
            if (d < bestD) {
                bestD = d;
                best = i;
            }
        }
        if (best < 0) {
            throw new IllegalStateException("no " + kind + " root left to pair with " + to);
        }
        return best;
    }

    /** Coefficients of ∏(1 − r·z⁻¹) for up to two roots, right-aligned as scipy's _single_zpksos does. */
    private static Biquad section(Root[] zeros, Root[] poles) {
        double[] b = aligned(zeros);
        double[] a = aligned(poles);
        return new Biquad(b[0], b[1], b[2], a[1], a[2]);
    }

    private static double[] aligned(Root[] roots) {
        double[] c = new double[3];
        switch (roots.length) {
            case 0 -> c[2] = 1;
            case 1 -> {
                c[1] = 1;
                c[2] = -roots[0].re;
            }
            case 2 -> {
                Root r1 = roots[0];
                Root r2 = roots[1];
                c[0] = 1;
                c[1] = -r2.re + -r1.re;
                c[2] = r1.re * r2.re - r1.im * r2.im;
            }
            default -> throw new IllegalStateException("a section holds at most two roots");
        }
        return c;
    }
}
