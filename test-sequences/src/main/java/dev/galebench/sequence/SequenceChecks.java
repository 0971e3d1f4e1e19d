package dev.galebench.sequence;

import dev.galebench.check.CheckSet;
import dev.galebench.check.SignalIndex;
import dev.galebench.check.StreamingCheck;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;

/** Builds a run's {@link CheckSet} from a sequence, refusing unknown signals before the run. */
public final class SequenceChecks {
    private SequenceChecks() {
    }

    /**
     * Fresh checks for one run, bound to the run's signal layout.
     *
     * @throws SequenceException at the line where an unknown signal was written, listing the
     *                           valid signal names
     */
    public static CheckSet bind(Sequence seq, SignalIndex index) {
        for (CheckDef d : seq.checks()) {
            for (Map.Entry<String, SourceMark> e : d.signals().entrySet()) {
                if (!index.contains(e.getKey())) {
                    throw new SequenceException(e.getValue(), "check '" + d.name() + "': unknown signal '" + e.getKey()
                            + "'; valid signals: " + String.join(", ", index.names()));
                }
            }
        }
        List<StreamingCheck> checks = new ArrayList<>();
        for (CheckDef d : seq.checks()) {
            checks.add(d.factory().get());
        }
        CheckSet set = new CheckSet(checks);
        set.bind(index);
        return set;
    }
}
