package dev.galebench.cli.serve;

import dev.galebench.link.LinkFaults;

import java.util.List;

/**
 * The link faults the console offers, by name, and how each one sets the link's
 * {@link LinkFaults} on the real-time thread. Numbers are our own choice of "clearly visible
 * but survivable" faults; sequences can inject any rate.
 *
 * <table>
 *   <caption>Faults</caption>
 *   <tr><th>name</th><th>effect on each board reply</th></tr>
 *   <tr><td>silence</td><td>every reply dropped (the link watchdog must act)</td></tr>
 *   <tr><td>drop-50pct</td><td>dropped with probability 0.5</td></tr>
 *   <tr><td>delay-3</td><td>every reply held back by 3 exchanges</td></tr>
 *   <tr><td>corrupt-10pct</td><td>one byte changed with probability 0.1 (CRC catches it)</td></tr>
 *   <tr><td>duplicate-20pct</td><td>delivered twice with probability 0.2</td></tr>
 * </table>
 */
final class LinkFaultMenu implements BenchMailbox.FaultSwitch {
    static final List<String> NAMES = List.of("silence", "drop-50pct", "delay-3", "corrupt-10pct", "duplicate-20pct");

    private final LinkFaults faults;

    LinkFaultMenu(LinkFaults faults) {
        this.faults = faults;
    }

    /** Index of {@code name} in {@link #NAMES}, or -1. */
    static int kindOf(String name) {
        return NAMES.indexOf(name);
    }

    @Override
    public void begin(int kind) {
        final LinkFaults f = faults;
        f.clear();
        switch (kind) {
            case 0:
                f.silent = true;
                break;
            case 1:
                f.dropRate = 0.5;
                break;
            case 2:
                f.delayRate = 1.0;
                f.delayExchanges = 3;
                break;
            case 3:
                f.corruptRate = 0.1;
                break;
            case 4:
                f.duplicateRate = 0.2;
                break;
            default:
                break;
        }
    }

    @Override
    public void end() {
        faults.clear();
    }
}
