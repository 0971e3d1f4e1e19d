package dev.galebench.cli.serve;

import dev.galebench.board.BoardControllers;
import dev.galebench.dashboard.BenchControl;
import dev.galebench.dashboard.ControlResult;
import dev.galebench.dashboard.Dashboard;
import dev.galebench.dashboard.SequenceInfo;
import dev.galebench.dashboard.TimingSource;
import dev.galebench.runner.SequenceRunner;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkFaults;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleLayout;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceLibrary;

import java.io.IOException;
import java.io.OutputStream;
import java.io.PrintStream;
import java.io.UncheckedIOException;
import java.io.Writer;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.atomic.AtomicInteger;
import java.util.concurrent.atomic.AtomicReference;

/**
 * The bench behind {@code galebench serve}: owns the plant, the board link and the real-time
 * loop, and answers the console's {@link BenchControl} calls.
 *
 * <p>Between sequences the plant runs freely in real time (a loop "until aborted") from the
 * steady state at the current wind; bench controls go through a {@link BenchMailbox} into that
 * loop and take effect at the next plant step. Starting a sequence ends the free run and runs
 * the sequence with the project's {@link SequenceRunner} (same plant, checks, recorders and
 * run folder as {@code galebench run}, under the session folder), the console's feed added as
 * one more ring consumer; its verdicts and a link to its report go to every console, then the
 * free run resumes. Bench controls are refused while a sequence runs: the sequence's schedule
 * owns the plant's inputs then. Each accepted control is appended to
 * {@code controls.log} in the session folder with the wall time and the plant time at which
 * it took effect (the control thread waits up to {@value #APPLY_WAIT_MS} ms for the real-time
 * thread to apply it, so the log says when, not only that).
 *
 * <p>Threads: the bench thread ("galebench-serve") builds and runs one loop after another; the
 * console's control thread calls the {@link BenchControl} methods. Neither is the real-time
 * thread, which the loop starts itself.
 */
public final class ServeBench implements BenchControl, AutoCloseable {
    static final long APPLY_WAIT_MS = 250;

    /**
     * What the bench runs.
     *
     * @param turbine        validated turbine parameters
     * @param stepPeriodNs   plant step, ns
     * @param board          {@code virtual} (in-process virtual board) or a link URI ({@code udp://HOST:PORT}, {@code serial:DEV[@BAUD]})
     * @param controller     control law of the virtual board (one of the virtual board's names)
     * @param windMPerS      wind of the first free run, m/s
     * @param sessionDir     folder for {@code controls.log} and sequence runs
     * @param holdAfterSequenceS how long a finished sequence's plots stay before the free run resumes, s
     * @param pinCpu         CPU for the loop thread (the process's other threads kept off it), -1 = no pinning
     */
    public record Settings(TurbineParameters turbine, long stepPeriodNs, String board, String controller,
                           double windMPerS, Path sessionDir, double holdAfterSequenceS, int pinCpu) {
    }

    private final Settings settings;
    private final List<SequenceInfo> sequences;
    private final Writer controlLog;
    private final Thread benchThread;
    private volatile Dashboard dashboard;
    private volatile boolean closing;
    private volatile RealTimeLoop freeRun;
    private volatile BenchMailbox mailbox;
    private volatile double windMPerS;
    private volatile String lastProblem = "";
    private volatile long holdUntilNs;
    private final AtomicReference<String> requested = new AtomicReference<>();
    private final AtomicInteger runCount = new AtomicInteger();
    private volatile String runningSequence;

    public ServeBench(Settings settings) {
        this.settings = settings;
        this.windMPerS = settings.windMPerS();
        List<SequenceInfo> list = new ArrayList<>();
        for (String name : SequenceLibrary.names()) {
            Sequence s = SequenceLibrary.load(name);
            list.add(new SequenceInfo(s.name(), firstSentence(s.purpose()), s.durationS()));
        }
        this.sequences = List.copyOf(list);
        try {
            Files.createDirectories(settings.sessionDir());
            this.controlLog = Files.newBufferedWriter(settings.sessionDir().resolve("controls.log"), StandardCharsets.UTF_8,
                    StandardOpenOption.CREATE, StandardOpenOption.APPEND);
        } catch (IOException e) {
            throw new UncheckedIOException("cannot write the session folder " + settings.sessionDir(), e);
        }
        this.benchThread = new Thread(this::benchLoop, "galebench-serve");
        this.benchThread.setDaemon(true);
    }

    /** Starts the bench thread, streaming every run to {@code console}. */
    public void start(Dashboard console) {
        this.dashboard = console;
        logLine("session started: board " + describeBoard() + ", step " + settings.stepPeriodNs() / 1000.0 + " us");
        benchThread.start();
    }

    /** The default control law of the in-process virtual board: {@code reference} when built in, else the first listed. */
    public static String defaultController() {
        List<String> names = Arrays.asList(BoardControllers.names().split("[,\\s]+"));
        return names.contains("reference") ? "reference" : names.get(0);
    }

    private String describeBoard() {
        return "virtual".equals(settings.board()) ? "virtual board (" + settings.controller() + ", in-process)" : settings.board();
    }

    private void benchLoop() {
        while (!closing) {
            try {
                String next = requested.get();
                if (next != null) {
                    runSequence(next);
                    holdAfterSequence();
                    continue;
                }
                runFree();
            } catch (InterruptedException e) {
                Thread.currentThread().interrupt();
                return;
            } catch (RuntimeException e) {
                lastProblem = e.getMessage();
                logLine("free run could not start: " + e.getMessage() + " (retrying in 2 s)");
                sleepQuietly(2000);
            }
        }
    }

    /**
     * Keeps the finished sequence's waveforms on the consoles for {@code holdAfterSequenceS}
     * before the free run (a new stream) replaces them; a start request or shutdown ends the
     * hold at once.
     */
    private void holdAfterSequence() {
        final long untilNs = System.nanoTime() + Math.round(settings.holdAfterSequenceS() * 1e9);
        holdUntilNs = untilNs;
        while (!closing && requested.get() == null && System.nanoTime() < untilNs) {
            sleepQuietly(20);
        }
        holdUntilNs = 0;
    }

    private void runFree() throws InterruptedException {
        final TurbineParameters p = settings.turbine();
        final LinkFaults faults = new LinkFaults();
        final BoardLink link = openLink(faults);
        try {
            final TurbinePlant plant = new TurbinePlant(p, settings.stepPeriodNs());
            final double wind = windMPerS;
            plant.initialise(SteadyState.solve(p, wind, 1.0, 0.0));
            final BenchMailbox box = new BenchMailbox(new LinkFaultMenu(faults));
            final LoopConfig cfg = LoopConfig.builder().stepPeriodNs(settings.stepPeriodNs()).realTime(true)
                    .pinCpu(settings.pinCpu()).build();
            final RealTimeLoop loop = new RealTimeLoop(cfg, plant, link, box, List.of(dashboard.feed()), SampleLayout.of(plant));
            dashboard.timingSource(TimingSource.of(loop, link));
            mailbox = box;
            freeRun = loop;
            logLine(String.format(Locale.ROOT, "free run started from the steady state at %.2f m/s", wind));
            LoopResult r;
            try {
                if (closing || requested.get() != null) {
                    return;
                }
                r = loop.run();
            } finally {
                freeRun = null;
                mailbox = null;
            }
            logLine("free run ended: " + r.stopReason + (r.stopDetail.isEmpty() ? "" : " (" + r.stopDetail + ")")
                    + String.format(Locale.ROOT, ", %d exchanges, %d overruns", r.exchanges, r.overruns));
            if (r.stopReason != LoopResult.StopReason.ABORTED && !closing && requested.get() == null) {
                sleepQuietly(1000); // a run that ended by itself (trip, error): restart settled, not in a tight loop
            }
        } finally {
            link.close();
        }
    }

    /** Runs the requested sequence with the project's runner and reports it to the consoles. */
    private void runSequence(String name) {
        final String runId = "run-" + runCount.incrementAndGet();
        runningSequence = name;
        try (PrintStream runnerLog = new PrintStream(new LineLog(), true, StandardCharsets.UTF_8)) {
            Sequence seq = SequenceLibrary.load(name);
            SequenceRunner.Options o = new SequenceRunner.Options();
            o.board = settings.board();
            o.outBase = settings.sessionDir();
            o.pinCpu = settings.pinCpu();
            o.progress = false;
            o.err = runnerLog;
            logLine("sequence " + name + " started (" + runId + ")");
            SequenceRunner.Result r = WatchedRun.run(dashboard, runId, seq, o);
            String outcome = r.abortReason() != null ? "aborted" : r.passed() ? "passed" : "failed";
            logLine("sequence " + name + " " + outcome + (r.abortReason() == null ? "" : " (" + r.abortReason() + ")")
                    + "; run folder " + r.folder());
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
            logLine("sequence " + name + " interrupted");
        } catch (Exception e) {
            logLine("sequence " + name + " could not run: " + e.getMessage());
        } finally {
            runningSequence = null;
            requested.set(null);
            dashboard.bench(this); // the runner lent the console its watch-and-abort bench for the run
        }
    }

    /** The runner's messages, one controls.log line each. */
    private final class LineLog extends OutputStream {
        private final java.io.ByteArrayOutputStream line = new java.io.ByteArrayOutputStream();

        @Override
        public void write(int b) {
            if (b == '\n') {
                flushLine();
            } else if (b != '\r') {
                line.write(b);
            }
        }

        private void flushLine() {
            if (line.size() > 0) {
                logLine("runner: " + line.toString(StandardCharsets.UTF_8));
                line.reset();
            }
        }

        @Override
        public void close() {
            flushLine();
        }
    }

    private BoardLink openLink(LinkFaults faults) {
        LinkOptions o = LinkOptions.defaults().faults(faults);
        if ("virtual".equals(settings.board())) {
            return BoardLinks.inProcess(BoardControllers.create(settings.controller()), o);
        }
        return BoardLinks.open(settings.board(), o);
    }

    @Override
    public List<SequenceInfo> sequences() {
        return sequences;
    }

    @Override
    public boolean interactive() {
        return true;
    }

    @Override
    public List<String> linkFaults() {
        return LinkFaultMenu.NAMES;
    }

    @Override
    public ControlResult startSequence(String name) {
        if (sequences.stream().noneMatch(s -> s.name().equals(name))) {
            return ControlResult.refused("no sequence named '" + name + "' in the library");
        }
        if (closing) {
            return ControlResult.refused("the bench is shutting down");
        }
        if (!requested.compareAndSet(null, name)) {
            return ControlResult.refused("sequence " + requested.get() + " is already running");
        }
        RealTimeLoop l = freeRun;
        if (l != null) {
            l.abort("sequence " + name + " starts");
        }
        logLine("start " + name + " requested from the console");
        return ControlResult.ok("starting " + name);
    }

    @Override
    public ControlResult abort() {
        String name = runningSequence;
        if (name == null) {
            return ControlResult.refused("no sequence is running");
        }
        // once its loop runs, the runner answers abort itself (its bench replaces this one on the console)
        return ControlResult.refused("sequence " + name + " is still preparing (JIT warm-up); abort again in a moment");
    }

    @Override
    public ControlResult setWind(double w) {
        if (runningSequence != null) {
            return sequenceOwnsPlant();
        }
        BenchMailbox m = mailbox;
        if (m == null) {
            return notRunning();
        }
        windMPerS = w;
        long before = m.appliedCount();
        m.postWind(w);
        return applied(m, before, String.format(Locale.ROOT, "wind %.2f m/s", w));
    }

    @Override
    public ControlResult voltageEvent(double levelPu, double durationS) {
        if (runningSequence != null) {
            return sequenceOwnsPlant();
        }
        BenchMailbox m = mailbox;
        if (m == null) {
            return notRunning();
        }
        long before = m.appliedCount();
        m.postVoltageEvent(levelPu, steps(durationS));
        return applied(m, before, String.format(Locale.ROOT, "%s: source %.3f pu for %.3f s",
                levelPu < 1 ? "dip" : "swell", levelPu, durationS));
    }

    @Override
    public ControlResult stepVoltageDeviationReference(double referencePu) {
        if (runningSequence != null) {
            return sequenceOwnsPlant();
        }
        BenchMailbox m = mailbox;
        if (m == null) {
            return notRunning();
        }
        long before = m.appliedCount();
        m.postVoltageDeviationRef(referencePu);
        return applied(m, before, String.format(Locale.ROOT, "voltage-deviation reference %.3f pu", referencePu));
    }

    @Override
    public ControlResult injectLinkFault(String fault, double durationS) {
        int kind = LinkFaultMenu.kindOf(fault);
        if (kind < 0) {
            return ControlResult.refused("unknown link fault '" + fault + "' (known: " + String.join(", ", LinkFaultMenu.NAMES) + ")");
        }
        if (runningSequence != null) {
            return sequenceOwnsPlant();
        }
        BenchMailbox m = mailbox;
        if (m == null) {
            return notRunning();
        }
        long before = m.appliedCount();
        m.postLinkFault(kind, steps(durationS));
        return applied(m, before, String.format(Locale.ROOT, "link fault %s for %.3f s", fault, durationS));
    }

    private ControlResult sequenceOwnsPlant() {
        return ControlResult.refused("sequence " + runningSequence + " is running; bench controls act between sequences");
    }

    private ControlResult notRunning() {
        long hold = holdUntilNs;
        if (hold != 0) {
            return ControlResult.refused(String.format(Locale.ROOT,
                    "showing the last sequence; the free run resumes in %.0f s", Math.max(0, (hold - System.nanoTime()) * 1e-9)));
        }
        return ControlResult.refused("the plant is not running right now" + (lastProblem.isEmpty() ? "" : ": " + lastProblem));
    }

    private long steps(double durationS) {
        return Math.max(1L, Math.round(durationS * 1e9 / settings.stepPeriodNs()));
    }

    /** Waits briefly for the real-time thread to apply the request, then logs when it did. */
    private ControlResult applied(BenchMailbox m, long before, String what) {
        long deadline = System.nanoTime() + APPLY_WAIT_MS * 1_000_000L;
        while (m.appliedCount() == before && System.nanoTime() < deadline) {
            sleepQuietly(1);
        }
        if (m.appliedCount() == before) {
            logLine(what + " (posted; not applied within " + APPLY_WAIT_MS + " ms)");
            return ControlResult.ok(what + ": posted");
        }
        double tS = m.lastAppliedStep() * settings.stepPeriodNs() * 1e-9;
        String text = String.format(Locale.ROOT, "%s, applied at plant t = %.4f s", what, tS);
        logLine(text);
        return ControlResult.ok(text);
    }

    /** Appends one line to controls.log (wall time first). */
    synchronized void logLine(String text) {
        try {
            controlLog.write(Instant.now() + "  " + text + System.lineSeparator());
            controlLog.flush();
        } catch (IOException e) {
            lastProblem = "controls.log: " + e.getMessage();
        }
    }

    /** Folder of this session. */
    public Path sessionDir() {
        return settings.sessionDir();
    }

    @Override
    public void close() {
        closing = true;
        RealTimeLoop l = freeRun;
        if (l != null) {
            l.abort("bench closed");
        }
        Dashboard d = dashboard;
        if (runningSequence != null && d != null && d.currentBench() != this && d.currentBench() != null) {
            d.currentBench().abort(); // the runner's own bench: stops the sequence's loop
        }

        try {
            benchThread.join(15_000);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
        logLine("session closed");
        synchronized (this) {
            try {
                controlLog.close();
            } catch (IOException ignored) {
                // nothing more to log to
            }
        }
    }

    private static void sleepQuietly(long ms) {
        try {
            Thread.sleep(ms);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    static String firstSentence(String text) {
        String t = text == null ? "" : text.replaceAll("\\s+", " ").trim();
        int dot = t.indexOf(". ");
        return dot < 0 ? t : t.substring(0, dot + 1);
    }
}
