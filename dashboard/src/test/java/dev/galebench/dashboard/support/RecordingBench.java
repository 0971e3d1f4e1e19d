package dev.galebench.dashboard.support;

import dev.galebench.dashboard.BenchControl;
import dev.galebench.dashboard.ControlResult;
import dev.galebench.dashboard.SequenceInfo;

import java.util.List;
import java.util.Locale;
import java.util.concurrent.CopyOnWriteArrayList;

/**
 * A bench for the console's own tests: it offers two sequences and writes every call it gets
 * into {@link #calls()}, so a test can check exactly what reached the bench after the console's
 * access and range checks. The real bench (runner, loop, plant) is exercised by the end-to-end
 * test in {@code tests/}.
 */
public final class RecordingBench implements BenchControl {
    private final List<String> calls = new CopyOnWriteArrayList<>();
    private final boolean interactive;
    private volatile boolean running;

    public RecordingBench(boolean interactive) {
        this.interactive = interactive;
    }

    public List<String> calls() {
        return calls;
    }

    @Override
    public List<SequenceInfo> sequences() {
        return List.of(new SequenceInfo("wind-step", "wind 8 to 12 m/s", 10.0),
                new SequenceInfo("deep-dip", "0.2 pu for 150 ms", 6.0));
    }

    @Override
    public boolean interactive() {
        return interactive;
    }

    @Override
    public List<String> linkFaults() {
        return List.of("silence", "corrupt-crc");
    }

    @Override
    public ControlResult startSequence(String name) {
        calls.add("start " + name);
        if (running) {
            return ControlResult.refused("a sequence is already running");
        }
        if (sequences().stream().noneMatch(s -> s.name().equals(name))) {
            return ControlResult.refused("no sequence named " + name);
        }
        running = true;
        return ControlResult.ok("started " + name);
    }

    @Override
    public ControlResult abort() {
        calls.add("abort");
        if (!running) {
            return ControlResult.refused("no run in progress");
        }
        running = false;
        return ControlResult.ok("aborted");
    }

    @Override
    public ControlResult setWind(double windMPerS) {
        calls.add(String.format(Locale.ROOT, "wind %.2f", windMPerS));
        return ControlResult.ok("wind set");
    }

    @Override
    public ControlResult voltageEvent(double levelPu, double durationS) {
        calls.add(String.format(Locale.ROOT, "voltage %.3f %.3f", levelPu, durationS));
        return ControlResult.ok("voltage event scheduled");
    }

    @Override
    public ControlResult stepVoltageDeviationReference(double referencePu) {
        calls.add(String.format(Locale.ROOT, "vdevref %.3f", referencePu));
        return ControlResult.ok("reference stepped");
    }

    @Override
    public ControlResult injectLinkFault(String fault, double durationS) {
        calls.add(String.format(Locale.ROOT, "linkfault %s %.3f", fault, durationS));
        return linkFaults().contains(fault) ? ControlResult.ok("fault injected") : ControlResult.refused("unknown fault " + fault);
    }
}
