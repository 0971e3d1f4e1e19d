package dev.galebench.rt.support;

import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;

import java.util.ArrayList;
import java.util.List;

/** Keeps a copy of every sample it gets (test consumer; optionally slow). */
public final class CollectingConsumer implements SampleConsumer {
    public final List<double[]> values = new ArrayList<>();
    public final List<long[]> indices = new ArrayList<>();
    public volatile String[] names;
    public volatile long missedAtEnd = -1;
    public volatile boolean ended;
    private final long sleepPerSampleMs;

    public CollectingConsumer() {
        this(0);
    }

    public CollectingConsumer(long sleepPerSampleMs) {
        this.sleepPerSampleMs = sleepPerSampleMs;
    }

    @Override
    public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        names = signalNames;
    }

    @Override
    public void onSample(Sample sample) {
        values.add(sample.values.clone());
        indices.add(new long[] {sample.exchangeIndex, sample.stepIndex, sample.plantTimeNs});
        if (sleepPerSampleMs > 0) {
            try {
                Thread.sleep(sleepPerSampleMs);
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
            }
        }
    }

    @Override
    public void onEnd(long samplesMissed) {
        missedAtEnd = samplesMissed;
        ended = true;
    }

    public int column(String name) {
        for (int i = 0; i < names.length; i++) {
            if (names[i].equals(name)) {
                return i;
            }
        }
        throw new IllegalArgumentException("no signal " + name);
    }
}
