package dev.galebench.check;

import dev.galebench.report.CheckOutcome;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * All checks of one run behind one {@link SampleConsumer}: one consumer thread feeds every
 * check in turn, instead of one thread per check on a machine with few cores. Memory is the
 * checks' few fields: flat over any run length.
 *
 * <p>Completeness is part of the verdict: if the ring dropped samples for this consumer, an
 * extra failed outcome {@code sample-stream} says how many; if the run was aborted, every check
 * whose window reaches past the abort is failed with the reason.
 */
public final class CheckSet implements SampleConsumer {
    private final StreamingCheck[] checks;
    private String[] boundNames;
    private long samples;
    private long missed;
    private double lastTimeS = Double.NaN;

    private java.util.function.Consumer<CheckOutcome> decided;
    private final RunFacts provisional = new RunFacts();
    private double[] decideAtS;
    private boolean[] reported;

    public CheckSet(List<StreamingCheck> checks) {
        this.checks = checks.toArray(new StreamingCheck[0]);
    }

    /**
     * Binds every check to the run's layout before the run starts.
     *
     * @throws IllegalArgumentException from the first check naming an unknown signal; the
     *                                  caller adds where it was written
     */
    public void bind(SignalIndex index) {
        for (StreamingCheck c : checks) {
            c.bind(index);
        }
        boundNames = index.names();
    }

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        if (boundNames == null || !Arrays.equals(boundNames, signalNames)) {
            bind(new SignalIndex(signalNames, signalUnits));
        }
    }

    @Override
    public void onSample(Sample sample) {
        final double timeS = sample.plantTimeNs * 1e-9;
        final double[] values = sample.values;
        final StreamingCheck[] cs = checks;
        for (int i = 0; i < cs.length; i++) {
            cs[i].onSample(timeS, values);
        }
        samples++;
        lastTimeS = timeS;
        if (decided != null) {
            publishDecided(timeS);
        }
    }

    /**
     * Hands each check's verdict to {@code listener} as soon as plant time passes the end of the
     * window it judges (checks judged only at the end of a run, timing and link health, wait for
     * {@link #outcomes}). Called on the checker's thread; it allocates when it publishes, never
     * per sample otherwise. The final verdicts of {@link #outcomes} still decide: they may differ
     * if the run is aborted or samples are lost afterwards. For live consoles.
     */
    public void onDecided(java.util.function.Consumer<CheckOutcome> listener) {
        decided = listener;
    }

    private void publishDecided(double timeS) {
        final StreamingCheck[] cs = checks;
        if (decideAtS == null) {
            // the window a check judges is fixed by its definition: ask a verdict before any data
            decideAtS = new double[cs.length];
            reported = new boolean[cs.length];
            for (int i = 0; i < cs.length; i++) {
                final double end = cs[i].finish(provisional).windowEndS();
                decideAtS[i] = Double.isNaN(end) ? Double.POSITIVE_INFINITY : end;
            }
        }
        for (int i = 0; i < cs.length; i++) {
            if (!reported[i] && timeS > decideAtS[i]) {
                reported[i] = true;
                decided.accept(cs[i].finish(provisional));
            }
        }
    }

    @Override
    public void onEnd(long samplesMissed) {
        missed = samplesMissed;
    }

    /** Samples seen. */
    public long samples() {
        return samples;
    }

    /** Plant time of the last sample seen, s (NaN before any). */
    public double lastTimeS() {
        return lastTimeS;
    }

    /** The verdicts, in the order of the sequence file, plus completeness outcomes. */
    public List<CheckOutcome> outcomes(RunFacts facts) {
        List<CheckOutcome> out = new ArrayList<>();
        for (StreamingCheck c : checks) {
            CheckOutcome o = c.finish(facts);
            if (facts.aborted && o.passed() && !Double.isNaN(o.windowEndS()) && !(o.windowEndS() <= lastTimeS)) {
                o = new CheckOutcome(o.name(), o.kind(), false, o.measured(), o.required(), "the run was aborted at "
                        + Fmt.time(lastTimeS) + " (" + facts.abortReason + "), before the window ended at "
                        + Fmt.time(o.windowEndS()), o.signal(), o.windowStartS(), o.windowEndS(), o.bandLow(), o.bandHigh());
            }
            out.add(o);
        }
        if (missed > 0) {
            out.add(new CheckOutcome("sample-stream", "completeness", false, missed + " samples lost",
                    "0 samples lost", "the checker fell behind and lost " + missed + " of " + (samples + missed)
                    + " samples: the verdicts above are not reliable", null, Double.NaN, Double.NaN, Double.NaN, Double.NaN));
        }
        return out;
    }
}
