package dev.galebench.testsupport;

import dev.galebench.check.SignalIndex;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;
import java.util.function.DoubleUnaryOperator;

/**
 * Feeds a {@link SampleConsumer} with samples computed from analytic functions of time, one
 * per signal slot (unset slots stay 0), like the loop would: one reused {@link Sample}, time
 * stamped at the end of each exchange.
 */
public final class AnalyticFeed {
    private final SignalIndex layout;
    private final DoubleUnaryOperator[] functions;
    private final long periodNs;

    public AnalyticFeed(SignalIndex layout, long periodNs) {
        this.layout = layout;
        this.functions = new DoubleUnaryOperator[layout.size()];
        this.periodNs = periodNs;
    }

    /** Sets the function of time (s) for {@code signal}. */
    public AnalyticFeed with(String signal, DoubleUnaryOperator f) {
        functions[layout.of(signal)] = f;
        return this;
    }

    /** Runs {@code onStart}, {@code samples} samples (exchange k at time (k+1) * period), {@code onEnd(missed)}. */
    public void run(SampleConsumer c, long samples, long missed) {
        String[] units = new String[layout.size()];
        for (int i = 0; i < units.length; i++) {
            units[i] = layout.unit(i);
        }
        c.onStart(layout.names(), units, periodNs, 1);
        Sample s = new Sample(layout.size());
        for (long k = 0; k < samples; k++) {
            s.exchangeIndex = k;
            s.stepIndex = k + 1;
            s.plantTimeNs = (k + 1) * periodNs;
            double t = s.plantTimeNs * 1e-9;
            for (int i = 0; i < functions.length; i++) {
                if (functions[i] != null) {
                    s.values[i] = functions[i].applyAsDouble(t);
                }
            }
            c.onSample(s);
        }
        c.onEnd(missed);
    }
}
