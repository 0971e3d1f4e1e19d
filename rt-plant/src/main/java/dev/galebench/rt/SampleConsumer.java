package dev.galebench.rt;

/**
 * A consumer of the sample stream (recorder, streaming checker, dashboard feed). Runs on its
 * own thread, never on the real-time thread; if it falls behind, the ring does not wait for
 * it: the samples it missed are counted and reported, never dropped silently.
 */
public interface SampleConsumer {
    /** Called once before the first sample with the signal names and units of every slot. */
    void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps);

    /** One sample; {@code sample} is reused after the call returns. */
    void onSample(Sample sample);

    /** Called once after the last sample; {@code samplesMissed} counts what this consumer lost. */
    void onEnd(long samplesMissed);
}
