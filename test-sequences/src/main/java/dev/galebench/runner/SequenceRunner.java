package dev.galebench.runner;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import dev.galebench.board.control.ControllerFile;
import dev.galebench.board.control.ControllerSettings;
import dev.galebench.board.control.ReferenceController;
import dev.galebench.check.CheckSet;
import dev.galebench.check.RunFacts;
import dev.galebench.check.SignalIndex;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkFaults;
import dev.galebench.link.LinkOptions;
import dev.galebench.plant.OperatingPoint;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.report.CheckOutcome;
import dev.galebench.report.RunEnvironment;
import dev.galebench.report.RunReportInput;
import dev.galebench.report.RunReports;
import dev.galebench.report.recording.ComtradeRecorder;
import dev.galebench.report.recording.ComtradeSettings;
import dev.galebench.report.recording.CsvRecorder;
import dev.galebench.report.recording.SignalRanges;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.Percentiles;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.sequence.Schedule;
import dev.galebench.sequence.Sequence;
import dev.galebench.sequence.SequenceChecks;
import dev.galebench.sequence.SequenceException;
import dev.galebench.sequence.SourceMark;
import java.io.IOException;
import java.io.PrintStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Instant;
import java.time.ZoneOffset;
import java.time.ZonedDateTime;
import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * Runs one sequence end to end: turbine file, settled operating point, plant, board link
 * (in-process reference controller, a board over UDP or serial, or a recorded board for a
 * replay), compiled schedule, real-time loop with the streaming checks and the recorders as
 * consumers, then the verdicts and the run folder:
 *
 * <pre>
 * runs/&lt;sequence&gt;-&lt;yyyyMMdd-HHmmss&gt;/
 *   report.html  junit.xml  summary.json      (report writers)
 *   recording.cfg  recording.dat              (COMTRADE, streamed during the run)
 *   signals.csv                               (on request)
 *   timing.hlog                               (loop timing, HdrHistogram interval log)
 *   board-replies.bin                         (every reply of the board, for replay)
 *   waveform-digest.txt                       (bit-exact fingerprint of the waveforms)
 *   sequence.yaml  run.json  schedule.txt     (what was run, how, and when each action acted)
 * </pre>
 *
 * A latched hardware trip the sequence does not allow aborts the run at once; the verdict
 * says which trip. Not thread-safe; one run at a time per instance.
 */
public final class SequenceRunner {
    /** What the command line can change about a run. */
    public static final class Options {
        /** {@code virtual} (in-process reference controller), {@code udp://HOST:PORT} or {@code serial:DEVICE[@BAUD]}. */
        public String board = "virtual";
        /** Run as fast as possible with the in-process controller (no clock). */
        public boolean offline;
        /** Parent of run folders. */
        public Path outBase = Path.of("runs");
        /** Exact run folder (used instead of a new one under outBase when set). */
        public Path folder;
        /** Plant step override, us (NaN: the sequence's). */
        public double stepUs = Double.NaN;
        /** Exchange-every override (0: the sequence's). */
        public int exchangeEvery;
        /** Also write {@code signals.csv}. */
        public boolean csv;
        /** Progress bar and messages. */
        public PrintStream err = System.err;
        /** Draw the progress bar. */
        public boolean progress = true;
        /** stderr is a terminal (redraw with CR) rather than a log. */
        public boolean terminal = System.console() != null;
        /** Replay: answer from this recorded reply file instead of a board. */
        public Path replayReplies;
        /**
         * Real-time runs: warm up first (see {@code warmUp}): one offline pass of the sequence,
         * then, with a board, this many seconds in real time against the board. 0 = no warm-up.
         */
        public double warmupS = 2.0;
        /**
         * Real-time runs with a board: 0 = strict real time (a reply that misses its exchange is
         * stepped past with the last good command). &gt; 0 = paced exchange: wait up to this many
         * microseconds for a late reply, pausing plant time (counted as overruns); see LoopConfig.
         */
        public double replyWaitUs;
        /**
         * Real-time runs: pin the loop thread to this CPU and keep this process's other threads
         * off it for the run ({@code LoopConfig.pinCpu}); -1 = no pinning.
         */
        public int pinCpu = -1;
        /** Live web console to feed (started by the command's --dashboard option), or null. */
        public dev.galebench.dashboard.Dashboard dashboard;
        /** Gets each check's verdict as soon as its window has passed (live consoles), or null. */
        public java.util.function.Consumer<CheckOutcome> verdictListener;
        /** More consumers. */
        public List<SampleConsumer> extraConsumers = List.of();
    }

    /** What a run produced. */
    public record Result(Path folder, boolean passed, List<CheckOutcome> outcomes, LoopResult loop,
                         String abortReason, WaveformDigest digest) {
        /** 0 when every check passed, 1 otherwise. */
        public int exitCode() {
            return passed ? 0 : 1;
        }
    }

    /** Plant, controller and link settings resolved from a sequence (before anything runs). */
    static final class Setup {
        TurbineParameters turbine;
        String turbineSource;
        ControllerSettings controller;
        String controllerSource;
        long stepPeriodNs;
        int exchangeEvery;
        OperatingPoint op;
    }

    /** Resolves turbine and controller files, step and the settled operating point; bad input throws. */
    static Setup setup(Sequence seq, Options o) {
        Setup s = new Setup();
        SourceMark top = new SourceMark(seq.source(), 1, 1);
        if (seq.turbine().equals("default")) {
            s.turbine = TurbineFile.defaults();
            s.turbineSource = "default";
        } else {
            Path p = resolve(seq, seq.turbine());
            s.turbine = TurbineFile.load(p);
            s.turbineSource = p.toString();
        }
        if (seq.controller().equals("default")) {
            s.controller = ControllerFile.defaults();
            s.controllerSource = "default";
        } else {
            Path p = resolve(seq, seq.controller());
            s.controller = ControllerFile.load(p);
            s.controllerSource = p.toString();
        }
        double stepUs = Double.isNaN(o.stepUs) ? seq.stepUs() : o.stepUs;
        s.stepPeriodNs = Math.round(stepUs * 1000.0);
        s.exchangeEvery = o.exchangeEvery > 0 ? o.exchangeEvery : seq.exchangeEvery();
        Sequence.Initial in = seq.initial();
        try {
            s.op = SteadyState.solve(s.turbine, in.windMPerS(), in.gridVoltagePu(), in.reactivePowerPu());
        } catch (IllegalArgumentException e) {
            throw new SequenceException(top, "the initial operating point cannot be settled: " + e.getMessage());
        }
        return s;
    }

    private static Path resolve(Sequence seq, String file) {
        Path p = Path.of(file);
        if (!p.isAbsolute() && seq.baseDir() != null) {
            p = seq.baseDir().resolve(p);
        }
        return p;
    }

    /**
     * Runs {@code seq}. Bad input (files, timings, signals, options) throws
     * {@link IllegalArgumentException} (exit 2) before anything runs.
     */
    public Result run(Sequence seq, Options o) throws IOException, InterruptedException {
        final Setup s = setup(seq, o);
        final boolean virtual = o.replayReplies == null && o.board.equals("virtual");
        if (o.offline && !virtual && o.replayReplies == null) {
            throw new IllegalArgumentException("--offline runs the virtual board in-process; it cannot be combined with "
                    + "--board " + o.board);
        }
        final TurbinePlant plant = new TurbinePlant(s.turbine, s.stepPeriodNs);
        plant.initialise(s.op);
        final SampleLayout layout = SampleLayout.of(plant);
        final CheckSet checks = SequenceChecks.bind(seq, new SignalIndex(layout.names(), layout.units()));
        if (o.verdictListener != null) {
            checks.onDecided(o.verdictListener);
        }
        final LinkFaults faults = new LinkFaults().reseed(0x5EED_0001L);
        final Schedule schedule = Schedule.compile(seq, s.stepPeriodNs, new Schedule.Start(seq.initial().windMPerS(),
                seq.initial().gridVoltagePu(), s.turbine.gridFrequencyHz, s.turbine.shortCircuitRatio,
                s.turbine.gridXOverR), o.replayReplies != null ? NO_FAULTS : new FaultSwitch(faults));

        final Path dir = o.folder != null ? Files.createDirectories(o.folder)
                : RunFolder.create(o.outBase, seq.name(), ZonedDateTime.now(ZoneOffset.UTC));
        final Instant startedAt = Instant.now();
        final BoardLink board;
        if (o.replayReplies != null) {
            board = new ReplayLink(o.replayReplies);
        } else if (virtual) {
            ReferenceController controller = new ReferenceController(s.turbine, s.controller);
            controller.setSamplePeriod(s.stepPeriodNs * s.exchangeEvery * 1e-9);
            board = BoardLinks.inProcess(controller, LinkOptions.defaults().faults(faults));
        } else {
            board = BoardLinks.open(o.board, LinkOptions.defaults().faults(faults));
        }
        if (!o.offline && o.replayReplies == null && o.warmupS > 0) {
            warmUp(seq, s, o, virtual ? null : board);
        }
        final RecordingLink link = o.replayReplies != null ? null
                : new RecordingLink(board, dir.resolve(ReplyLog.FILE_NAME), s.stepPeriodNs, s.exchangeEvery);
        writeRunDescription(dir, seq, s, o, schedule);

        final WaveformDigest digest = new WaveformDigest();
        final ComtradeRecorder comtrade = new ComtradeRecorder(dir, "recording",
                ComtradeSettings.defaults(seq.name(), s.turbine.gridFrequencyHz, new SignalRanges(s.turbine)));
        final List<SampleConsumer> consumers = new ArrayList<>(List.of(checks, comtrade, digest));
        CsvRecorder csv = null;
        if (o.csv) {
            csv = new CsvRecorder(dir.resolve("signals.csv"), List.of(layout.names()), 1);
            consumers.add(csv);
        }
        consumers.addAll(o.extraConsumers);
        if (o.dashboard != null) {
            consumers.add(o.dashboard.feed());
        }

        final LoopConfig cfg = LoopConfig.builder().stepPeriodNs(s.stepPeriodNs).exchangeEverySteps(s.exchangeEvery)
                .durationSteps(schedule.totalSteps()).realTime(!o.offline && o.replayReplies == null)
                .watchdogNs(Math.round(seq.watchdogUs() * 1000.0))
                .pitchRefLimitsRad(s.turbine.pitchMinRad - Math.toRadians(1), s.turbine.pitchMaxRad + Math.toRadians(1))
                .replyWaitNs(Math.round(o.replyWaitUs * 1000.0))
                .pinCpu(o.offline || o.replayReplies != null ? -1 : o.pinCpu)
                .build();
        final TripAbortHook hook = new TripAbortHook(schedule, seq.allowedTripMask());
        final RealTimeLoop loop = new RealTimeLoop(cfg, plant, link != null ? link : board, hook, consumers, layout);
        hook.attach(loop);
        if (o.dashboard != null) {
            o.dashboard.timingSource(dev.galebench.dashboard.TimingSource.of(loop, link != null ? link : board));
            o.dashboard.bench(dev.galebench.dashboard.BenchControl.watchOnly(seq.name(),
                    () -> loop.abort("aborted from the live console")));
        }
        final LoopResult r;
        try (Progress bar = o.progress ? new Progress(o.err, loop, seq.name(), schedule.totalSteps(),
                s.stepPeriodNs, o.terminal) : null) {
            r = loop.run();
        } finally {
            board.close();
            if (link != null) {
                link.finish();
            }
        }

        String abort = null;
        if (hook.tripSeen() != 0) {
            abort = "hardware trip (" + TripAbortHook.names(hook.tripSeen()) + ") at "
                    + String.format(java.util.Locale.ROOT, "%.4f s", hook.tripStep() * s.stepPeriodNs * 1e-9);
        } else if (r.aborted()) {
            abort = r.stopReason.name().toLowerCase(java.util.Locale.ROOT) + ": " + r.stopDetail;
        }
        final RunFacts facts = facts(r, abort);
        final List<CheckOutcome> outcomes = new ArrayList<>(checks.outcomes(facts));
        if (link != null && link.lost() > 0) {
            outcomes.add(new CheckOutcome("reply-recording", "completeness", false, link.lost() + " replies lost",
                    "0 replies lost", "the reply recorder fell behind: the recording cannot be replayed exactly", null,
                    Double.NaN, Double.NaN, Double.NaN, Double.NaN));
        }
        if (comtrade.failure() != null) {
            o.err.println("galebench: COMTRADE recording failed: " + comtrade.failure().getMessage());
        }
        boolean passed = abort == null;
        for (CheckOutcome c : outcomes) {
            passed &= c.passed();
        }
        r.writeTimingLog(dir.resolve("timing.hlog"));
        digest.write(dir.resolve(WaveformDigest.FILE_NAME));
        RunReportInput.Builder in = RunReportInput.builder(seq.name()).sequenceFile(seq.source())
                .description(seq.purpose()).fromLoop(r).passed(passed).checks(outcomes)
                .environment(environment(s, o)).startedAt(startedAt)
                .comtradeBaseName("recording").timingLogFileName("timing.hlog")
                .csvFileName(csv != null ? "signals.csv" : null)
                .plotSignals(List.of("v_term_pu", "v_dc_v", "p_grid_pu", "q_grid_pu", "wind_m_s"));
        if (abort != null) {
            in.abortedReason(abort);
        }
        RunReports.writeAll(dir, in.build());
        return new Result(dir, passed, outcomes, r, abort, digest);
    }

    /**
     * JIT warm-up before a real-time run (a cold JVM makes the first exchanges milliseconds
     * late, and a plant whose board replies late holds its last duties while the grid turns,
     * which drives it into a trip within milliseconds). First the whole sequence runs once
     * offline with the in-process controller into a throwaway folder, so every class and branch
     * of this run (plant, schedule, checks, recorders, reply recorder, report writers) is
     * compiled; then, with a board, {@code o.warmupS} seconds run in real time against the board
     * in steady state (the board restarts its controller when the next run's sequence numbers
     * start again at 0). Late replies of the warm-up are drained and the link's counters reset,
     * so the verdicts count only the run.
     */
    private void warmUp(Sequence seq, Setup s, Options o, BoardLink board) throws IOException, InterruptedException {
        Path tmp = Files.createTempDirectory("galebench-warmup-");
        try {
            Options w = new Options();
            w.offline = true;
            w.folder = tmp.resolve("run");
            w.progress = false;
            w.stepUs = s.stepPeriodNs / 1000.0;
            w.exchangeEvery = s.exchangeEvery;
            w.err = o.err;
            run(seq, w);
        } finally {
            try (var walk = Files.walk(tmp)) {
                walk.sorted(java.util.Comparator.reverseOrder()).forEach(f -> f.toFile().delete());
            }
        }
        if (board == null) {
            collectBeforeRun();
            return;
        }
        TurbinePlant plant = new TurbinePlant(s.turbine, s.stepPeriodNs);
        plant.initialise(s.op);
        LoopConfig cfg = LoopConfig.builder().stepPeriodNs(s.stepPeriodNs).exchangeEverySteps(s.exchangeEvery)
                .durationSteps(Math.max(1, Math.round(o.warmupS * 1e9 / s.stepPeriodNs))).realTime(true)
                .watchdogNs(1_000_000_000L)
                .pitchRefLimitsRad(s.turbine.pitchMinRad - Math.toRadians(1), s.turbine.pitchMaxRad + Math.toRadians(1))
                .replyWaitNs(Math.round(o.replyWaitUs * 1000.0))
                .pinCpu(o.pinCpu)
                .build();
        LoopResult w = new RealTimeLoop(cfg, plant, board, null, List.of(), SampleLayout.of(plant)).run();
        if (o.progress) {
            Percentiles rtt = Percentiles.of(w.roundTripNs), late = Percentiles.of(w.latenessNs);
            o.err.printf(java.util.Locale.ROOT, "warm-up against the board: %d exchanges, round trip p50 %.1f us, "
                    + "p99 %.1f us; lateness p99 %.1f us; %d late and %d missing replies, %d overruns%n", w.exchanges,
                    rtt.p50() / 1e3, rtt.p99() / 1e3, late.p99() / 1e3, w.linkCounters.lateReplies,
                    w.linkCounters.missingReplies, w.overruns);
        }
        if (w.overruns > w.exchanges / 100 || w.linkCounters.missingReplies > w.exchanges / 100) {
            o.err.printf(java.util.Locale.ROOT, "galebench: warning: during the warm-up %.1f %% of the exchanges overran "
                    + "and %.1f %% of the replies were missing: this machine or the board cannot keep the %s us "
                    + "schedule now (other load? see galebench preflight); the run's verdicts will say so%n",
                    100.0 * w.overruns / Math.max(1, w.exchanges),
                    100.0 * w.linkCounters.missingReplies / Math.max(1, w.exchanges),
                    Double.toString(s.stepPeriodNs * s.exchangeEvery / 1000.0));
        }
        dev.galebench.plant.BoardCommand sink = new dev.galebench.plant.BoardCommand();
        long quietSince = System.nanoTime();
        while (System.nanoTime() - quietSince < 50_000_000L) {
            if (board.poll(sink) != BoardLink.POLL_EMPTY) {
                quietSince = System.nanoTime();
            } else {
                Thread.sleep(1);
            }
        }
        board.counters().reset();
        collectBeforeRun();
    }

    /** Empties the heap once before the clock starts, so the warm-up's garbage is not collected during the run. */
    private static void collectBeforeRun() {
        System.gc();
    }

    private static final dev.galebench.sequence.LinkFaultControl NO_FAULTS = new dev.galebench.sequence.LinkFaultControl() {
        @Override
        public void begin(dev.galebench.sequence.LinkFaultKind kind, double rate, int delayExchanges) {
            // a replay answers with the recorded replies, which already carry the faults
        }

        @Override
        public void end() {
        }
    };

    static RunFacts facts(LoopResult r, String abort) {
        RunFacts f = new RunFacts();
        f.realTime = r.config.realTime;
        f.aborted = abort != null;
        f.abortReason = abort;
        f.exchanges = r.exchanges;
        f.overruns = r.overruns;
        if (r.latenessNs.getTotalCount() > 0) {
            double[] us = Percentiles.of(r.latenessNs).micros();
            f.latenessP50Us = us[0];
            f.latenessP99Us = us[1];
            f.latenessP999Us = us[2];
            f.latenessMaxUs = us[4];
        }
        if (r.roundTripNs.getTotalCount() > 0) {
            double[] us = Percentiles.of(r.roundTripNs).micros();
            f.roundTripP50Us = us[0];
            f.roundTripP99Us = us[1];
            f.roundTripP999Us = us[2];
            f.roundTripMaxUs = us[4];
        }
        f.link.copyFrom(r.linkCounters);
        return f;
    }

    private static Map<String, String> environment(Setup s, Options o) {
        Map<String, String> env = new LinkedHashMap<>(RunEnvironment.capture());
        env.put("board", o.replayReplies != null ? "replay of " + o.replayReplies : o.board);
        env.put("mode", o.offline || o.replayReplies != null ? "offline" : "real time");
        env.put("turbine", s.turbineSource);
        env.put("controller", s.controllerSource);
        return env;
    }

    /** Writes sequence.yaml, run.json and schedule.txt: what replay needs to rebuild the run. */
    private static void writeRunDescription(Path dir, Sequence seq, Setup s, Options o, Schedule schedule)
            throws IOException {
        Files.writeString(dir.resolve("sequence.yaml"), sourceText(seq), StandardCharsets.UTF_8);
        Map<String, Object> run = new LinkedHashMap<>();
        run.put("sequence", seq.name());
        run.put("sequence_source", seq.source());
        run.put("base_dir", seq.baseDir() == null ? null : seq.baseDir().toString());
        run.put("turbine", s.turbineSource);
        run.put("controller", s.controllerSource);
        run.put("board", o.replayReplies != null ? "replay" : o.board);
        run.put("offline", o.offline);
        run.put("step_ns", s.stepPeriodNs);
        run.put("exchange_every", s.exchangeEvery);
        Files.writeString(dir.resolve("run.json"),
                new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT).writeValueAsString(run), StandardCharsets.UTF_8);
        Files.writeString(dir.resolve("schedule.txt"), "# plant time of each change, as applied\n"
                + String.join("\n", schedule.log()) + "\n", StandardCharsets.UTF_8);
    }

    private static String sourceText(Sequence seq) throws IOException {
        if (seq.source().startsWith("library/")) {
            String name = seq.source().substring("library/".length(), seq.source().length() - ".yaml".length());
            return dev.galebench.sequence.SequenceLibrary.text(name);
        }
        return Files.readString(Path.of(seq.source()), StandardCharsets.UTF_8);
    }
}
