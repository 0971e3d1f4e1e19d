package dev.galebench.runner;

import dev.galebench.link.LinkFaults;
import dev.galebench.sequence.LinkFaultControl;
import dev.galebench.sequence.LinkFaultKind;

/**
 * Maps a schedule's link-fault actions onto the link's {@link LinkFaults} settings. Called on
 * the real-time thread at exact steps: writes primitive fields only.
 */
final class FaultSwitch implements LinkFaultControl {
    private final LinkFaults faults;

    FaultSwitch(LinkFaults faults) {
        this.faults = faults;
    }

    @Override
    public void begin(LinkFaultKind kind, double rate, int delayExchanges) {
        final LinkFaults f = faults;
        f.clear();
        switch (kind) {
            case DROP:
                f.dropRate = rate;
                break;
            case DELAY:
                f.delayRate = rate;
                f.delayExchanges = delayExchanges;
                break;
            case DUPLICATE:
                f.duplicateRate = rate;
                break;
            case CORRUPT:
                f.corruptRate = rate;
                break;
            default:
                f.silent = true;
                break;
        }
    }

    @Override
    public void end() {
        faults.clear();
    }
}
