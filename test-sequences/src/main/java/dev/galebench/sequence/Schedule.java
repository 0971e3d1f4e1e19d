package dev.galebench.sequence;

import dev.galebench.plant.PlantModel;
import dev.galebench.rt.StepHook;
import java.util.ArrayList;
import java.util.Collections;
import java.util.List;
import java.util.SplittableRandom;

/**
 * A sequence's timeline compiled into step-indexed tracks: the {@link StepHook} the real-time
 * loop calls before every plant step. Actions take effect at exact plant steps (an action at
 * time {@code t} acts from step {@code round(t / h)} on), so a run is reproducible bit for bit.
 *
 * <p>Cost on the real-time thread: a few array reads and multiplications per track and step;
 * a plant setter is called only when its value changed (once for a step change, every step
 * during a ramp, gust or turbulence). No allocation, lock, log or exception: everything that can
 * go wrong is refused by {@link #compile}. Turbulence is synthesised at compile time into a
 * table (one value per {@code 1 / (10 f_max)}) and interpolated linearly.
 */
public final class Schedule implements StepHook {
    private static final int GUST = 1, TURBULENCE = 2;

    /**
     * Plant inputs at t = 0 (the settled operating point).
     *
     * @param windMPerS       mean hub wind, m/s
     * @param gridVoltagePu   grid source voltage, all phases, pu
     * @param gridFrequencyHz grid frequency, Hz
     * @param shortCircuitRatio grid SCR
     * @param xOverR          grid X/R
     */
    public record Start(double windMPerS, double gridVoltagePu, double gridFrequencyHz, double shortCircuitRatio,
                        double xOverR) {
    }

    private final long stepPeriodNs;
    private final long totalSteps;
    private final Track wind, va, vb, vc, phase, frequency, scr, xr, vdev;
    private final int[] shapeKind;
    private final long[] shapeStart, shapeEnd;
    private final double[] shapeA, shapeB;
    private final double[][] shapeTable;
    private final long[] linkStart, linkEnd;
    private final LinkFaultKind[] linkKind;
    private final double[] linkRate;
    private final int[] linkDelay;
    private final LinkFaultControl linkControl;
    private final List<String> log;
    private int linkCursor;
    private boolean linkActive;
    private double lastWind, lastVa, lastVb, lastVc, lastPhase, lastFrequency, lastScr, lastXr, lastVdev;

    private Schedule(Builder b, LinkFaultControl linkControl) {
        this.stepPeriodNs = b.stepPeriodNs;
        this.totalSteps = b.totalSteps;
        this.wind = b.wind; this.va = b.va; this.vb = b.vb; this.vc = b.vc; this.phase = b.phase;
        this.frequency = b.frequency; this.scr = b.scr; this.xr = b.xr; this.vdev = b.vdev;
        int ns = b.shapes.size();
        shapeKind = new int[ns]; shapeStart = new long[ns]; shapeEnd = new long[ns];
        shapeA = new double[ns]; shapeB = new double[ns]; shapeTable = new double[ns][];
        for (int i = 0; i < ns; i++) {
            Shape s = b.shapes.get(i);
            shapeKind[i] = s.kind; shapeStart[i] = s.start; shapeEnd[i] = s.end;
            shapeA[i] = s.a; shapeB[i] = s.b; shapeTable[i] = s.table;
        }
        int nl = b.links.size();
        linkStart = new long[nl]; linkEnd = new long[nl]; linkKind = new LinkFaultKind[nl];
        linkRate = new double[nl]; linkDelay = new int[nl];
        for (int i = 0; i < nl; i++) {
            Action.LinkFault f = b.links.get(i);
            linkStart[i] = b.linkStart.get(i); linkEnd[i] = b.linkEnd.get(i); linkKind[i] = f.faultKind();
            linkRate[i] = f.rate(); linkDelay[i] = f.delayExchanges();
        }
        this.linkControl = linkControl;
        this.log = Collections.unmodifiableList(new ArrayList<>(b.log));
        rewind();
    }

    /**
     * Compiles {@code seq} for plant step {@code stepPeriodNs}.
     *
     * @param start       the plant inputs at t = 0 (from the initial operating point and turbine file)
     * @param linkControl where link faults go; may be null only if the sequence has none
     * @throws SequenceException for timings that become impossible at this step (overlaps after
     *                           rounding to steps, a ramp shorter than one step) or link faults
     *                           without a link that can inject them
     */
    public static Schedule compile(Sequence seq, long stepPeriodNs, Start start, LinkFaultControl linkControl) {
        List<Action> actions = seq.actions();
        double[] extent = Timeline.validate(actions, seq.durationS(), start.gridFrequencyHz());
        Builder b = new Builder(stepPeriodNs, Math.round(seq.durationS() * 1e9 / stepPeriodNs), start);
        for (int i = 0; i < actions.size(); i++) {
            b.add(actions.get(i), extent[i]);
        }
        if (!b.links.isEmpty() && linkControl == null) {
            throw new SequenceException(b.links.get(0).mark(), "link faults need a link that can inject them; "
                    + "this board link cannot");
        }
        return new Schedule(b, linkControl);
    }

    /** Resets cursors and last-applied values so the schedule can drive another run from step 0. */
    public void rewind() {
        wind.rewind(); va.rewind(); vb.rewind(); vc.rewind(); phase.rewind(); frequency.rewind();
        scr.rewind(); xr.rewind(); vdev.rewind();
        lastWind = wind.initial(); lastVa = va.initial(); lastVb = vb.initial(); lastVc = vc.initial();
        lastPhase = phase.initial(); lastFrequency = frequency.initial(); lastScr = scr.initial();
        lastXr = xr.initial(); lastVdev = vdev.initial();
        linkCursor = 0;
        linkActive = false;
    }

    /** Plant steps of the whole run. */
    public long totalSteps() {
        return totalSteps;
    }

    public long stepPeriodNs() {
        return stepPeriodNs;
    }

    /** What the schedule does and at which exact plant time, one line per change (for reports). */
    public List<String> log() {
        return log;
    }

    @Override
    public void beforeStep(long stepIndex, PlantModel plant) {
        final long k = stepIndex;
        double w = wind.value(k);
        final int ns = shapeKind.length;
        for (int i = 0; i < ns; i++) {
            if (k >= shapeStart[i] && k < shapeEnd[i]) {
                w += shape(i, k - shapeStart[i]);
            }
        }
        if (w < 0) {
            w = 0;
        }
        if (w != lastWind) {
            lastWind = w;
            plant.setWindSpeed(w);
        }
        final double a = va.value(k), b = vb.value(k), c = vc.value(k);
        if (a != lastVa || b != lastVb || c != lastVc) {
            lastVa = a; lastVb = b; lastVc = c;
            plant.setGridVoltagePu(a, b, c);
        }
        final double ph = phase.value(k);
        if (ph != lastPhase) {
            lastPhase = ph;
            plant.setGridPhaseOffsetRad(ph);
        }
        final double f = frequency.value(k);
        if (f != lastFrequency) {
            lastFrequency = f;
            plant.setGridFrequencyHz(f);
        }
        final double s = scr.value(k), x = xr.value(k);
        if (s != lastScr || x != lastXr) {
            lastScr = s; lastXr = x;
            plant.setGridStrength(s, x);
        }
        final double d = vdev.value(k);
        if (d != lastVdev) {
            lastVdev = d;
            plant.setVoltageDeviationRefPu(d);
        }
        final int lc = linkCursor;
        if (lc < linkStart.length) {
            if (!linkActive && k >= linkStart[lc]) {
                linkActive = true;
                linkControl.begin(linkKind[lc], linkRate[lc], linkDelay[lc]);
            }
            if (linkActive && k >= linkEnd[lc]) {
                linkActive = false;
                linkCursor = lc + 1;
                linkControl.end();
            }
        }
    }

    private double shape(int i, long rel) {
        if (shapeKind[i] == GUST) {
            // IEC 61400-1 ed. 3 extreme operating gust (from memory): -0.37 Vgust sin(3 pi t/T)(1 - cos(2 pi t/T))
            final double x = (double) rel / shapeB[i];
            return -0.37 * shapeA[i] * Math.sin(3.0 * Math.PI * x) * (1.0 - Math.cos(2.0 * Math.PI * x));
        }
        final double[] table = shapeTable[i];
        final double pos = (double) rel / shapeB[i];
        final int j = (int) pos;
        if (j + 1 >= table.length) {
            return table[table.length - 1];
        }
        final double frac = pos - j;
        return table[j] + (table[j + 1] - table[j]) * frac;
    }

    /** Value the wind input has at {@code step} (for tests and plots; same arithmetic as the hook). */
    double windAt(long step) {
        double w = wind.value(step);
        for (int i = 0; i < shapeKind.length; i++) {
            if (step >= shapeStart[i] && step < shapeEnd[i]) {
                w += shape(i, step - shapeStart[i]);
            }
        }
        return Math.max(0, w);
    }

    private static final class Shape {
        int kind;
        long start, end;
        double a, b;
        double[] table;
    }

    /** Compile-time state. */
    private static final class Builder {
        final long stepPeriodNs, totalSteps;
        final double h;
        final Track wind, va, vb, vc, phase, frequency, scr, xr, vdev;
        final List<Shape> shapes = new ArrayList<>();
        final List<Action.LinkFault> links = new ArrayList<>();
        final List<Long> linkStart = new ArrayList<>(), linkEnd = new ArrayList<>();
        final List<String> log = new ArrayList<>();

        Builder(long stepPeriodNs, long totalSteps, Start s) {
            this.stepPeriodNs = stepPeriodNs;
            this.totalSteps = totalSteps;
            this.h = stepPeriodNs * 1e-9;
            wind = new Track(s.windMPerS());
            va = new Track(s.gridVoltagePu());
            vb = new Track(s.gridVoltagePu());
            vc = new Track(s.gridVoltagePu());
            phase = new Track(0.0);
            frequency = new Track(s.gridFrequencyHz());
            scr = new Track(s.shortCircuitRatio());
            xr = new Track(s.xOverR());
            vdev = new Track(0.0);
        }

        long step(double tS) {
            return Math.round(tS / h);
        }

        String at(long k) {
            return String.format(java.util.Locale.ROOT, "%.6f s", k * h);
        }

        void segment(Track t, Action a, long s, long e, double from, double to) {
            if (t.segments() > 0 && s < lastEnd(t)) {
                throw new SequenceException(a.mark(), a.kind() + " at " + at(s) + " overlaps the previous action on its "
                        + "track once rounded to plant steps of " + (stepPeriodNs / 1000.0) + " us");
            }
            t.add(s, e, from, to);
        }

        private final java.util.IdentityHashMap<Track, Long> ends = new java.util.IdentityHashMap<>();

        long lastEnd(Track t) {
            Long e = ends.get(t);
            return e == null ? Long.MIN_VALUE : e;
        }

        void add(Action a, double extentS) {
            final long k0 = step(a.atS());
            if (a instanceof Action.WindStep) {
                double to = ((Action.WindStep) a).toMPerS();
                put(wind, a, k0, k0, to, to);
                log.add(at(k0) + "  wind step to " + to + " m/s");
            } else if (a instanceof Action.WindRamp) {
                Action.WindRamp r = (Action.WindRamp) a;
                long k1 = ramp(a, k0, r.durationS());
                put(wind, a, k0, k1, wind.current(), r.toMPerS());
                log.add(at(k0) + "  wind ramp to " + r.toMPerS() + " m/s, reached at " + at(k1));
            } else if (a instanceof Action.WindGust) {
                Action.WindGust g = (Action.WindGust) a;
                Shape s = new Shape();
                s.kind = GUST;
                s.start = k0;
                s.end = k0 + ramp(a, 0, g.durationS());
                s.a = g.amplitudeMPerS();
                s.b = s.end - s.start;
                shapes.add(s);
                log.add(at(k0) + "  extreme operating gust, Vgust " + g.amplitudeMPerS() + " m/s, T " + g.durationS()
                        + " s, until " + at(s.end));
            } else if (a instanceof Action.Turbulence) {
                Action.Turbulence t = (Action.Turbulence) a;
                Shape s = new Shape();
                s.kind = TURBULENCE;
                s.start = k0;
                s.end = k0 + ramp(a, 0, t.durationS());
                double mean = wind.value(k0);
                wind.rewind();
                double sigma = Double.isNaN(t.sigmaMPerS()) ? t.intensity() * mean : t.sigmaMPerS();
                double dtS = 1.0 / (10.0 * t.maxFrequencyHz());
                s.table = Turbulence.kaimal(t.durationS(), dtS, sigma, Math.max(mean, 0.5), t.lengthScaleM(),
                        t.maxFrequencyHz(), t.seed());
                s.b = dtS / h;
                shapes.add(s);
                log.add(String.format(java.util.Locale.ROOT, "%s  Kaimal turbulence, sigma %.3f m/s around %.2f m/s, "
                        + "seed %d, until %s", at(k0), sigma, mean, t.seed(), at(s.end)));
            } else if (a instanceof Action.GridVoltageEvent) {
                Action.GridVoltageEvent g = (Action.GridVoltageEvent) a;
                long k1 = k0 + ramp(a, 0, g.durationS());
                long k2 = k1 + (g.recoveryS() > 0 ? ramp(a, 0, g.recoveryS()) : 0);
                Track[] ph = {va, vb, vc};
                StringBuilder lv = new StringBuilder();
                for (int i = 0; i < 3; i++) {
                    double pre = ph[i].current();
                    double level = Math.max(0.0, pre + g.deltaPu()[i]);
                    put(ph[i], a, k0, k1, level, level);
                    ph[i].add(k1, k2, level, pre);
                    ends.put(ph[i], k2);
                    lv.append(i == 0 ? "" : "/").append(String.format(java.util.Locale.ROOT, "%.3f", level));
                }
                log.add(at(k0) + "  " + g.kind().replace('_', ' ') + " to " + lv + " pu, recovery from " + at(k1)
                        + " to " + at(k2));
            } else if (a instanceof Action.PhaseJump) {
                double to = phase.current() + Math.toRadians(((Action.PhaseJump) a).angleDeg());
                put(phase, a, k0, k0, to, to);
                log.add(at(k0) + "  phase jump " + ((Action.PhaseJump) a).angleDeg() + " deg");
            } else if (a instanceof Action.FrequencyStep) {
                double to = ((Action.FrequencyStep) a).toHz();
                put(frequency, a, k0, k0, to, to);
                log.add(at(k0) + "  frequency step to " + to + " Hz");
            } else if (a instanceof Action.FrequencyRamp) {
                Action.FrequencyRamp r = (Action.FrequencyRamp) a;
                long k1 = ramp(a, k0, extentS);
                put(frequency, a, k0, k1, frequency.current(), r.toHz());
                log.add(at(k0) + "  frequency ramp to " + r.toHz() + " Hz at " + r.rateHzPerS() + " Hz/s, reached at "
                        + at(k1));
            } else if (a instanceof Action.GridStrength) {
                Action.GridStrength g = (Action.GridStrength) a;
                put(scr, a, k0, k0, g.shortCircuitRatio(), g.shortCircuitRatio());
                put(xr, a, k0, k0, g.xOverR(), g.xOverR());
                log.add(at(k0) + "  grid strength SCR " + g.shortCircuitRatio() + ", X/R " + g.xOverR());
            } else if (a instanceof Action.VoltageRefStep) {
                double to = ((Action.VoltageRefStep) a).deviationPu();
                put(vdev, a, k0, k0, to, to);
                log.add(at(k0) + "  voltage-deviation reference step to " + to + " pu");
            } else {
                Action.LinkFault f = (Action.LinkFault) a;
                long k1 = k0 + ramp(a, 0, f.durationS());
                if (!linkEnd.isEmpty() && k0 < linkEnd.get(linkEnd.size() - 1)) {
                    throw new SequenceException(a.mark(), "link_fault overlaps the previous link fault once rounded "
                            + "to plant steps");
                }
                links.add(f);
                linkStart.add(k0);
                linkEnd.add(k1);
                log.add(at(k0) + "  link fault " + f.faultKind().name().toLowerCase(java.util.Locale.ROOT) + " until "
                        + at(k1));
            }
        }

        private void put(Track t, Action a, long s, long e, double from, double to) {
            segment(t, a, s, e, from, to);
            ends.put(t, e);
        }

        /** End step of something lasting {@code durationS} from {@code k0}; at least one step. */
        private long ramp(Action a, long k0, double durationS) {
            long n = Math.round(durationS / h);
            if (n < 1) {
                throw new SequenceException(a.mark(), a.kind() + " lasts " + durationS + " s, shorter than one plant step ("
                        + (stepPeriodNs / 1000.0) + " us)");
            }
            return k0 + n;
        }
    }

    /** Kaimal turbulence synthesis. */
    static final class Turbulence {
        private Turbulence() {
        }

        /**
         * A zero-mean series of {@code ceil(durationS / dtS) + 2} values, spacing {@code dtS},
         * from the Kaimal spectrum {@code S(f) = 4 sigma^2 (L/V) / (1 + 6 f L/V)^(5/3)} (IEC 61400-1
         * ed. 3 Annex B, from memory) as a sum of cosines at {@code f_j = j / T} up to
         * {@code maxFrequencyHz} with amplitudes {@code sqrt(2 S(f_j) df)} and phases from a
         * {@link SplittableRandom} seeded with {@code seed}. The series is then scaled so its
         * standard deviation is exactly {@code sigma} (the spectrum's tails outside
         * {@code [1/T, f_max]} are otherwise missing) and tapered with half-cosines over the first
         * and last {@code min(1 s, T/10)} so the wind has no jump where the turbulence starts or ends.
         */
        static double[] kaimal(double durationS, double dtS, double sigma, double meanMPerS, double lengthScaleM,
                               double maxFrequencyHz, long seed) {
            final int points = (int) Math.ceil(durationS / dtS) + 2;
            final double df = 1.0 / durationS;
            final int harmonics = Math.max(1, (int) Math.floor(maxFrequencyHz / df));
            final double lv = lengthScaleM / meanMPerS;
            double[] amp = new double[harmonics], phase = new double[harmonics];
            SplittableRandom rnd = new SplittableRandom(seed);
            for (int j = 0; j < harmonics; j++) {
                double f = (j + 1) * df;
                double s = 4.0 * sigma * sigma * lv / Math.pow(1.0 + 6.0 * f * lv, 5.0 / 3.0);
                amp[j] = Math.sqrt(2.0 * s * df);
                phase[j] = 2.0 * Math.PI * rnd.nextDouble();
            }
            double[] u = new double[points];
            for (int i = 0; i < points; i++) {
                double t = i * dtS, sum = 0;
                for (int j = 0; j < harmonics; j++) {
                    sum += amp[j] * Math.cos(2.0 * Math.PI * (j + 1) * df * t + phase[j]);
                }
                u[i] = sum;
            }
            double mean = 0;
            int inRun = Math.min(points, (int) Math.round(durationS / dtS) + 1);
            for (int i = 0; i < inRun; i++) {
                mean += u[i];
            }
            mean /= inRun;
            double var = 0;
            for (int i = 0; i < inRun; i++) {
                var += (u[i] - mean) * (u[i] - mean);
            }
            double std = Math.sqrt(var / inRun);
            double scale = std > 0 ? sigma / std : 0;
            double taperS = Math.min(1.0, durationS / 10.0);
            for (int i = 0; i < points; i++) {
                double t = i * dtS;
                double w = 1.0;
                if (t < taperS) {
                    w = 0.5 - 0.5 * Math.cos(Math.PI * t / taperS);
                } else if (t > durationS - taperS) {
                    w = 0.5 - 0.5 * Math.cos(Math.PI * Math.max(0, durationS - t) / taperS);
                }
                u[i] = (u[i] - mean) * scale * w;
            }
            return u;
        }
    }
}
