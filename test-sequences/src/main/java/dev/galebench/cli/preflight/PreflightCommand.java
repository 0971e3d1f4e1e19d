package dev.galebench.cli.preflight;

import dev.galebench.board.BoardController;
import dev.galebench.board.BoardControllers;
import dev.galebench.board.VirtualBoard;
import dev.galebench.link.BoardLinks;
import dev.galebench.link.LinkOptions;
import dev.galebench.link.UdpEchoFloor;
import dev.galebench.plant.SteadyState;
import dev.galebench.plant.TurbineFile;
import dev.galebench.plant.TurbineParameters;
import dev.galebench.plant.TurbinePlant;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LoopConfig;
import dev.galebench.rt.LoopResult;
import dev.galebench.rt.RealTimeLoop;
import dev.galebench.rt.Sample;
import dev.galebench.rt.SampleConsumer;
import dev.galebench.rt.SampleLayout;
import dev.galebench.rt.SpinFloor;
import dev.galebench.wire.WireProfile;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Spec;
import picocli.CommandLine.Model.CommandSpec;

import java.io.PrintWriter;
import java.net.InetAddress;
import java.net.InetSocketAddress;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.concurrent.Callable;

/**
 * {@code galebench preflight}: is this machine punctual enough for a step of N us? Measures the
 * busy-spin floor (a thread spinning to t0 + k h with nothing else to do), then runs the real
 * loop for the same time with the default turbine and a board, and prints both side by side
 * with a verdict judged as ratios to the floor ({@link PreflightVerdict}). Floor and loop
 * alternate in rounds (default one round per 5 s of each), so both see the same moods of a
 * machine whose speed changes by the minute; the results of the rounds are merged. Each round
 * also measures the I/O floor between them ({@code --no-io-floor} skips it): see
 * {@link PreflightVerdict}.
 *
 * <p>Default board: the virtual board started inside this JVM on its own thread, answering over
 * a real UDP socket pair on loopback (127.0.0.1). That exercises the same link code, socket
 * path and kernel round trip as a board on the bench, while needing nothing else running; an
 * in-process link would hide the link cost, a separate process would need a launcher. The board
 * thread blocks in receive and never spins, so on a two-core machine it leaves the other core
 * to the loop. {@code --board URI} measures against a real board instead.
 *
 * <p>Exit codes: 0 sustainable, 1 not sustainable, 2 bad input.
 */
@Command(name = "preflight", mixinStandardHelpOptions = true,
        description = {"Measure this machine's busy-spin timing floor, then the real-time loop with a board,",
                "and judge whether the step is sustainable (ratios to the floor measured in the same run)."})
public final class PreflightCommand implements Callable<Integer> {
    @Spec
    CommandSpec spec;

    @Option(names = "--seconds", paramLabel = "S", defaultValue = "10",
            description = "Seconds of floor measurement and again of loop run (default: ${DEFAULT-VALUE}).")
    double seconds;

    @Option(names = "--step-us", paramLabel = "N", defaultValue = "50",
            description = "Plant step and exchange period in microseconds (default: ${DEFAULT-VALUE}).")
    long stepUs;

    @Option(names = "--exchange-every", paramLabel = "M", defaultValue = "1",
            description = {"Exchange with the board every M plant steps (default: ${DEFAULT-VALUE}); the floors then tick at the exchange period,",
                    "and overruns and stalls count lateness beyond one exchange period. Serial lines need M*N above the frame time."})
    int exchangeEvery;

    @Option(names = "--board", paramLabel = "URI",
            description = "Board link URI (udp://HOST:PORT or serial:DEVICE[@BAUD]); default: the virtual board in this JVM over UDP loopback.")
    String boardUri;

    @Option(names = "--controller", paramLabel = "NAME",
            description = "Controller of the built-in virtual board (default: the reference controller if available).")
    String controllerName;

    @Option(names = "--pin-cpu", paramLabel = "CPU", defaultValue = "-1",
            description = "Pin the spinning threads to this CPU (Linux, taskset); -1 = no pinning (default).")
    int pinCpu;

    @Option(names = "--rounds", paramLabel = "N", defaultValue = "0",
            description = "Alternate floor and loop in N rounds of S/N seconds each, so both see the machine's same moods (default 0: one round per 5 s).")
    int rounds;

    @Option(names = "--warmup", paramLabel = "S", defaultValue = "2",
            description = {"Seconds of real-time warm-up against the board before the measurement, not counted (default: ${DEFAULT-VALUE}; 0 = none).",
                    "An offline burst of " + WARMUP_OFFLINE_EXCHANGES + " exchanges compiles plant, loop and codec first."})
    double warmupS;

    @Option(names = "--io-floor", negatable = true, defaultValue = "true", fallbackValue = "true",
            description = {"Also measure the I/O floor each round: the spinning thread sends a frame-sized datagram per tick to a bare",
                    "echo thread on loopback and polls for it, with no plant or controller (default: on; not for serial boards)."})
    boolean ioFloor;

    @Option(names = "--sweep", split = ",", paramLabel = "US",
            description = {"Measure each of these steps in turn, e.g. 20,30,50,100 (--seconds each), and name the smallest that holds.",
                    "Instead of --step-us; exit 0 if at least one step holds."})
    long[] sweep;

    @Option(names = "--hlog", paramLabel = "FILE", description = "Also write the loop's timing interval log here.")
    Path hlog;

    @Option(names = "--json", description = "Print JSON instead of the table.")
    boolean json;

    @Override
    public Integer call() throws Exception {
        final PrintWriter err = spec.commandLine().getErr();
        final PrintWriter out = spec.commandLine().getOut();
        if (exchangeEvery < 1 || exchangeEvery > 10_000) {
            err.println("galebench preflight: --exchange-every " + exchangeEvery + " is out of range [1, 10000]");
            return 2;
        }
        if (!(seconds > 0.0 && seconds <= 3600.0)) {
            err.println("galebench preflight: --seconds " + seconds + " is out of range (0, 3600]");
            return 2;
        }
        if (rounds < 0 || rounds > 10_000) {
            err.println("galebench preflight: --rounds " + rounds + " is out of range [0, 10000]");
            return 2;
        }
        final long[] steps;
        if (sweep != null) {
            if (spec.commandLine().getParseResult().hasMatchedOption("--step-us")) {
                err.println("galebench preflight: give --step-us or --sweep, not both");
                return 2;
            }
            if (hlog != null) {
                err.println("galebench preflight: --hlog writes one run's log; it does not go with --sweep");
                return 2;
            }
            if (sweep.length == 0 || sweep.length > 50) {
                err.println("galebench preflight: --sweep needs 1 to 50 steps, got " + sweep.length);
                return 2;
            }
            steps = sweep.clone();
        } else {
            steps = new long[] {stepUs};
        }
        for (long st : steps) {
            if (st < 1 || st > 1_000_000) {
                err.println("galebench preflight: " + (sweep != null ? "--sweep step " : "--step-us ") + st + " is out of range [1, 1000000]");
                return 2;
            }
            if ((long) (seconds * 1e9) < st * 1_000 * exchangeEvery) {
                err.println("galebench preflight: --seconds " + seconds + " is shorter than one exchange at " + st + " us");
                return 2;
            }
            if ((long) (seconds * 1e9) / (st * 1_000 * exchangeEvery) / roundsFor(seconds, rounds) < 1) {
                err.println("galebench preflight: --rounds " + rounds + " leaves less than one exchange per round at " + st + " us");
                return 2;
            }
        }
        if (pinCpu < -1) {
            err.println("galebench preflight: --pin-cpu " + pinCpu + " must be >= -1");
            return 2;
        }
        if (!(warmupS >= 0.0 && warmupS <= 600.0)) {
            err.println("galebench preflight: --warmup " + warmupS + " is out of range [0, 600]");
            return 2;
        }
        if (sweep == null) {
            final PreflightReport r = measure(steps[0], err);
            if (r == null) {
                return 2;
            }
            out.print(json ? r.json() + System.lineSeparator() : r.text());
            out.flush();
            return r.sustainable() ? 0 : 1;
        }
        final List<PreflightReport> reports = new ArrayList<>();
        for (long st : steps) {
            final PreflightReport r = measure(st, err);
            if (r == null) {
                return 2;
            }
            reports.add(r);
            if (!json) {
                out.print(r.text());
                out.println();
                out.flush();
            }
        }
        out.print(json ? PreflightReport.sweepJson(reports) + System.lineSeparator() : PreflightReport.sweepText(reports));
        out.flush();
        return PreflightReport.smallestSustainableStepUs(reports) > 0 ? 0 : 1;
    }

    /** One preflight at {@code stepUs}: warm-up, then floor, I/O floor and loop in rounds. Null (after saying why on err) for bad input. */
    private PreflightReport measure(long stepUs, PrintWriter err) throws Exception {
        final long stepNs = stepUs * 1_000;
        final long exchangeNs = stepNs * exchangeEvery;
        final long durationNs = (long) (seconds * 1e9);
        final int n = roundsFor(seconds, rounds);
        final long roundExchanges = durationNs / exchangeNs / n;
        final TurbineParameters params = TurbineFile.defaults();
        BoardLink link;
        VirtualBoard board = null;
        Thread boardThread = null;
        String boardText;
        try {
            if (boardUri != null) {
                link = BoardLinks.open(boardUri, LinkOptions.defaults());
                boardText = boardUri;
            } else {
                final String name = controllerName != null ? controllerName : defaultController();
                final BoardController controller = BoardControllers.create(name);
                board = VirtualBoard.udp(new InetSocketAddress(InetAddress.getLoopbackAddress(), 0),
                        WireProfile.FULL, controller, exchangeNs * 1e-9);
                final VirtualBoard b = board;
                boardThread = new Thread(b::run, "galebench-board");
                boardThread.setDaemon(true);
                boardThread.start();
                link = BoardLinks.open("udp://127.0.0.1:" + board.udpPort(), LinkOptions.defaults());
                boardText = "virtual board in this JVM, " + board.describe() + ", controller " + name;
            }
        } catch (IllegalArgumentException e) {
            if (board != null) {
                board.close();
            }
            err.println("galebench preflight: " + e.getMessage());
            return null;
        }
        try {
            final TurbinePlant plant = new TurbinePlant(params, stepNs);
            plant.initialise(SteadyState.solve(params, 0.8 * params.ratedWindMPerS, 1.0, 0.0));
            final LoopConfig cfg = LoopConfig.builder().stepPeriodNs(stepNs).exchangeEverySteps(exchangeEvery)
                    .durationSteps(roundExchanges * exchangeEvery).realTime(true).pinCpu(pinCpu)
                    .pitchRefLimitsRad(params.pitchMinRad, params.pitchMaxRad).build();
            final boolean measureIo = ioFloor && (boardUri == null || boardUri.startsWith("udp://"));
            final String warmup = warmUp(params, stepNs, exchangeEvery, link, pinCpu, measureIo);
            final long baseMs = System.currentTimeMillis();
            final List<SpinFloor.Result> floors = new ArrayList<>();
            final List<LoopResult> loops = new ArrayList<>();
            final List<SpinFloor.Result> ioFloors = new ArrayList<>();
            long echoes = 0;
            for (int round = 0; round < n; round++) {
                floors.add(SpinFloor.measure(exchangeNs, roundExchanges * exchangeNs, pinCpu));
                if (measureIo) {
                    try (UdpEchoFloor echo = new UdpEchoFloor(WireProfile.FULL.measurementLength)) {
                        ioFloors.add(SpinFloor.measure(exchangeNs, roundExchanges * exchangeNs, pinCpu, echo));
                        echoes += echo.echoed();
                    }
                }
                drain(link);
                link.counters().reset();
                loops.add(new RealTimeLoop(cfg, plant, link, null, List.of(new Discard()), SampleLayout.of(plant))
                        .timingLogBaseTimeMs(baseMs).run());
            }
            final SpinFloor.Result floor = mergeFloors(floors);
            final SpinFloor.Result io = measureIo ? mergeFloors(ioFloors) : null;
            final LoopResult result = LoopResult.merge(loops);
            if (hlog != null) {
                result.writeTimingLog(hlog);
            }
            final PreflightVerdict verdict = PreflightVerdict.judge(floor, result, io);
            final PreflightReport report = new PreflightReport(stepUs, seconds, n, boardText, floor, result, verdict)
                    .exchangeEvery(exchangeEvery)
                    .warmup(warmupS, warmup).perRound(floors, loops).ioFloor(io, echoes, ioFloors);
            return report;
        } finally {
            link.close();
            if (board != null) {
                board.close();
                boardThread.join(2000);
            }
        }
    }

    /** Rounds of a run of {@code seconds}: as given, or one per {@value #SECONDS_PER_ROUND} s. */
    static int roundsFor(double seconds, int rounds) {
        return rounds > 0 ? rounds : (int) Math.max(1, Math.ceil(seconds / SECONDS_PER_ROUND));
    }

    /** Seconds of floor (and of I/O floor) in the warm-up round. */
    static final double WARMUP_FLOOR_S = 0.5;

    /** Exchanges of the offline part of the warm-up (about a second on a slow machine). */
    static final long WARMUP_OFFLINE_EXCHANGES = 100_000;

    /**
     * JIT warm-up, not counted: a cold JVM runs the loop interpreted for its first second and
     * is milliseconds late, which a preflight would otherwise blame on the machine (measured on
     * a 2-core VM: a cold 10 s loop had 2 114 overruns and a 9 ms worst lateness, nearly all in
     * its first second; after a 2 s warm-up 501, against 269 floor stalls). First an offline
     * burst with the in-process reference (or hold) controller on a scratch plant compiles the
     * plant, loop, codec and controller; then one uncounted round: the floor and the I/O floor
     * for {@value #WARMUP_FLOOR_S} s each and the loop for {@code warmupS} seconds in real time
     * against the board itself, which compiles the link and the board's side. The uncounted round
     * matters: the I/O floor and the loop share the JDK's socket code, and C2 compiles it for
     * the pattern it has seen; the first switch from one to the other took branches never taken
     * before, the JIT threw its code away and the first counted round ran partly interpreted
     * (measured: a first round with 4 789 overruns, the eleven after it 200-1 500 each).
     * Finally the link is drained and its counters reset.
     *
     * @return a one-line description for the report
     */
    private String warmUp(TurbineParameters params, long stepNs, int m, BoardLink link, int pin, boolean withIo) throws InterruptedException {
        final long exchangeNs = stepNs * m;
        if (warmupS <= 0.0) {
            return "none";
        }
        final BoardController c = BoardControllers.create(controllerName != null && boardUri == null ? controllerName : defaultController());
        c.setSamplePeriod(exchangeNs * 1e-9);
        final TurbinePlant scratch = new TurbinePlant(params, stepNs);
        scratch.initialise(SteadyState.solve(params, 0.8 * params.ratedWindMPerS, 1.0, 0.0));
        final BoardLink offline = BoardLinks.inProcess(c);
        try {
            final LoopConfig oc = LoopConfig.builder().stepPeriodNs(stepNs).exchangeEverySteps(m)
                    .durationSteps(WARMUP_OFFLINE_EXCHANGES * m).realTime(false)
                    .pitchRefLimitsRad(params.pitchMinRad, params.pitchMaxRad).build();
            new RealTimeLoop(oc, scratch, offline, null, List.of(new Discard()), SampleLayout.of(scratch)).run();
        } finally {
            offline.close();
        }
        final long floorNs = Math.max(exchangeNs, Math.round(WARMUP_FLOOR_S * 1e9));
        SpinFloor.measure(exchangeNs, floorNs, pin);
        if (withIo) {
            try (UdpEchoFloor echo = new UdpEchoFloor(WireProfile.FULL.measurementLength)) {
                SpinFloor.measure(exchangeNs, floorNs, pin, echo);
            }
        }
        final TurbinePlant plant = new TurbinePlant(params, stepNs);
        plant.initialise(SteadyState.solve(params, 0.8 * params.ratedWindMPerS, 1.0, 0.0));
        final LoopConfig rc = LoopConfig.builder().stepPeriodNs(stepNs).exchangeEverySteps(m)
                .durationSteps(Math.max(1, Math.round(warmupS * 1e9 / exchangeNs)) * m).realTime(true).pinCpu(pin)
                .pitchRefLimitsRad(params.pitchMinRad, params.pitchMaxRad).build();
        final LoopResult w = new RealTimeLoop(rc, plant, link, null, List.of(new Discard()), SampleLayout.of(plant)).run();
        drain(link);
        link.counters().reset();
        System.gc();
        return String.format(java.util.Locale.ROOT, "%d exchanges offline, then one round not counted: floor%s %.1f s, "
                + "loop %.1f s in real time against the board (%d overruns)", WARMUP_OFFLINE_EXCHANGES,
                withIo ? " and I/O floor" : "", WARMUP_FLOOR_S, warmupS, w.overruns);
    }

    /** Seconds of floor plus seconds of loop per round when --rounds is not given. */
    static final double SECONDS_PER_ROUND = 5.0;

    /** Reads and drops whatever the link still holds (a reply in flight from the previous round). */
    private static void drain(BoardLink link) throws InterruptedException {
        Thread.sleep(2);
        final dev.galebench.plant.BoardCommand scratch = new dev.galebench.plant.BoardCommand();
        for (int i = 0; i < 1000 && link.poll(scratch) != BoardLink.POLL_EMPTY; i++) {
            Thread.onSpinWait();
        }
    }

    private static SpinFloor.Result mergeFloors(List<SpinFloor.Result> floors) {
        final SpinFloor.Result first = floors.get(0);
        final org.HdrHistogram.Histogram h = first.latenessNs().copy();
        long ticks = 0, stalls = 0, gaps = 0, maxGap = 0;
        for (int i = 0; i < floors.size(); i++) {
            final SpinFloor.Result f = floors.get(i);
            if (i > 0) {
                h.add(f.latenessNs());
            }
            ticks += f.ticks();
            stalls += f.stalls();
            gaps += f.clockGaps();
            maxGap = Math.max(maxGap, f.maxClockGapNs());
        }
        return new SpinFloor.Result(first.stepPeriodNs(), ticks, stalls, gaps, maxGap, h, first.pinning());
    }

    private static String defaultController() {
        for (String n : BoardControllers.names().split("[,\\s]+")) {
            if (n.equals("reference")) {
                return n;
            }
        }
        return "hold";
    }

    /** A consumer that only receives, so the run pays the ring cost a real run pays. */
    static final class Discard implements SampleConsumer {
        long received;

        @Override
        public void onStart(String[] signalNames, String[] signalUnits, long stepPeriodNs, int exchangeEverySteps) {
        }

        @Override
        public void onSample(Sample sample) {
            received++;
        }

        @Override
        public void onEnd(long samplesMissed) {
        }
    }
}
