package dev.galebench.rt;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;

import java.util.ArrayList;
import java.util.List;
import java.util.Objects;
import java.util.concurrent.TimeUnit;

/**
 * The busy-spinning real-time loop: one thread ("galebench-rt") that steps the plant on the
 * absolute schedule t0 + k M h and exchanges one frame with the board per exchange. It spins
 * one core at 100 %: pin it to a core kept free of other work for the best tails (see
 * rt-plant/LOOP.md).
 *
 * <p>Per exchange k, in this order:
 * <ol>
 *   <li>wait for deadline k (real time: busy-spin, polling the link while the reply to the last
 *       frame is still due and the deadline is more than {@value #POLL_GUARD_NS} ns away, so the
 *       round trip is timed when the reply lands; offline: no wait);</li>
 *   <li>drain the link's replies and run supervision ({@link LinkSupervisor}): the newest valid
 *       reply becomes the command in force, faults are counted, the watchdog trips the plant;</li>
 *   <li>M times: {@link StepHook#beforeStep}, then {@link PlantModel#step} with the command;</li>
 *   <li>sense, sample and publish one {@link Sample} to every consumer's ring (never waits in
 *       real time; a full ring is a counted miss);</li>
 *   <li>send measurement frame k+1 (frame 0 is sent before the first deadline);</li>
 *   <li>record lateness, compute time, reply age (and the round trip when a reply landed).</li>
 * </ol>
 *
 * <p>An exchange that starts more than one exchange period after its deadline is an overrun;
 * what happens next is the configured {@link MissedTickPolicy}. Nothing on the loop allocates,
 * locks, logs or touches a file after the first deadline (proven by a test reading the thread's
 * allocated bytes over a million steps).
 *
 * <p>One instance runs once. {@link #run()} blocks the caller; {@link #abort()} and
 * {@link #timings()} may be called from any thread while it runs.
 */
public final class RealTimeLoop {
    /** Stop polling during the spin this close to the deadline, so a poll never makes a tick late. */
    static final long POLL_GUARD_NS = 3_000;
    /** At most this many replies are drained per exchange (a flooding board cannot stall the loop). */
    static final int MAX_POLLS_PER_EXCHANGE = 16;
    /** How long consumers get to drain their rings after the run. */
    static final long DRAIN_TIMEOUT_NS = TimeUnit.SECONDS.toNanos(10);

    private final LoopConfig config;
    private final PlantModel plant;
    private final BoardLink link;
    private final StepHook hook;
    private final List<SampleConsumer> consumers;
    private final SampleLayout layout;
    private final LoopTimings timings;
    private final LinkSupervisor supervisor;
    private final SensorView view = new SensorView();
    private final BoardCommand polled = new BoardCommand();
    private final double[] values;

    private volatile boolean abortRequested;
    private volatile String abortReason = "";
    private volatile boolean started;
    private volatile boolean readerStop;
    private long logBaseTimeMs = -1;

    // written by the loop thread, read by run() after join()
    private ConsumerRing[] rings;
    private LoopResult.StopReason stopReason = LoopResult.StopReason.COMPLETED;
    private String stopDetail = "";
    private long wallTimeNs;
    private String pinning = "not requested";

    /**
     * @param hook nullable: no per-step work
     * @param consumers may be empty; each gets its own ring of {@code config.ringSize} slots and a thread
     * @throws IllegalArgumentException if the plant's step differs from the config's or the layout does not match the plant
     */
    public RealTimeLoop(LoopConfig config, PlantModel plant, BoardLink link, StepHook hook,
                        List<SampleConsumer> consumers, SampleLayout layout) {
        this.config = Objects.requireNonNull(config, "config");
        this.plant = Objects.requireNonNull(plant, "plant");
        this.link = Objects.requireNonNull(link, "link");
        this.hook = hook;
        this.consumers = List.copyOf(consumers);
        this.layout = Objects.requireNonNull(layout, "layout");
        if (plant.stepPeriodNs() != config.stepPeriodNs) {
            throw new IllegalArgumentException("loop config: stepPeriodNs = " + config.stepPeriodNs
                    + " but the plant steps " + plant.stepPeriodNs() + " ns");
        }
        if (layout.plantSignalCount() != plant.signalCount()) {
            throw new IllegalArgumentException("sample layout has " + layout.plantSignalCount()
                    + " plant signals, the plant writes " + plant.signalCount());
        }
        this.values = new double[layout.signalCount()];
        this.timings = new LoopTimings(config.exchangePeriodNs());
        this.supervisor = new LinkSupervisor(link.counters(), timings.rtt, config.pitchRefMinRad,
                config.pitchRefMaxRad, config.watchdogExchanges());
    }

    /**
     * Sets the base time of this run's interval log (epoch ms; default: the start of the run).
     * Runs that share a base time can have their logs concatenated ({@link LoopResult#merge}).
     * Call before {@link #run()}.
     */
    public RealTimeLoop timingLogBaseTimeMs(long epochMs) {
        if (started) {
            throw new IllegalStateException("set the log base time before run()");
        }
        logBaseTimeMs = epochMs;
        return this;
    }

    /** Asks the loop to stop at its next exchange (any thread). */
    public void abort() {
        abort("aborted");
    }

    /** Same, with a reason reported in {@link LoopResult#stopDetail}. */
    public void abort(String reason) {
        abortReason = reason == null ? "aborted" : reason;
        abortRequested = true;
    }

    boolean abortRequested() {
        return abortRequested;
    }

    /** Live timing of this loop, readable from any thread while it runs and after. */
    public LoopTimings timings() {
        return timings;
    }

    /**
     * A copy of the link's counters now (any thread; the loop writes them without fences, so a
     * copy taken while it runs may be a few exchanges old and not all from the same instant).
     */
    public LinkCounters linkCountersSnapshot() {
        final LinkCounters c = new LinkCounters();
        c.copyFrom(link.counters());
        return c;
    }

    /** The sample layout this loop publishes. */
    public SampleLayout layout() {
        return layout;
    }

    /**
     * Runs the loop to its end: starts the consumer threads, runs the loop on a thread named
     * "galebench-rt", joins it, lets consumers drain, and returns the result. If the calling
     * thread is interrupted meanwhile, the loop is aborted ("caller interrupted"), the result is
     * still returned and the interrupt flag is set again.
     *
     * @throws IllegalStateException if called twice
     */
    public LoopResult run() throws InterruptedException {
        if (started) {
            throw new IllegalStateException("a RealTimeLoop runs once");
        }
        started = true;
        final CpuPinning.Isolation isolation = config.pinCpu >= 0 ? CpuPinning.isolate(config.pinCpu) : null;
        try {
            return runIsolated(isolation);
        } finally {
            if (isolation != null) {
                isolation.restore();
            }
        }
    }

    private LoopResult runIsolated(CpuPinning.Isolation isolation) throws InterruptedException {
        final String[] names = layout.names();
        final String[] units = layout.units();
        rings = new ConsumerRing[consumers.size()];
        final List<String> consumerNames = new ArrayList<>();
        for (int i = 0; i < rings.length; i++) {
            final SampleConsumer c = consumers.get(i);
            final String name = "galebench-consumer-" + i + "-" + c.getClass().getSimpleName();
            consumerNames.add(name);
            c.onStart(names, units, config.stepPeriodNs, config.exchangeEverySteps);
            rings[i] = new ConsumerRing(c, config.ringSize, layout.signalCount(), name);
        }
        for (ConsumerRing r : rings) {
            r.start();
        }
        timings.start(logBaseTimeMs >= 0 ? logBaseTimeMs : System.currentTimeMillis());
        final Thread reader = new Thread(this::readTimings, "galebench-rt-timing");
        reader.setDaemon(true);
        final Thread rt = new Thread(this::loopThread, "galebench-rt");
        rt.setPriority(Thread.MAX_PRIORITY);
        rt.start();
        reader.start();
        boolean interrupted = false;
        while (true) {
            try {
                rt.join();
                break;
            } catch (InterruptedException e) {
                // the caller is being stopped: stop the loop too, then report as usual
                abort("caller interrupted");
                interrupted = true;
            }
        }
        // a flag the reader checks at least every READER_CHECK_MS, not only the interrupt:
        // HdrHistogram's phase flip sleeps and swallows interrupts
        readerStop = true;
        reader.interrupt();
        reader.join();
        timings.takeInterval();
        final long[] missed = new long[rings.length];
        final long[] errors = new long[rings.length];
        for (int i = 0; i < rings.length; i++) {
            rings[i].finish(DRAIN_TIMEOUT_NS);
            missed[i] = rings[i].missed.get();
            errors[i] = rings[i].errors.get();
        }
        final LinkCounters countersCopy = new LinkCounters();
        countersCopy.copyFrom(link.counters());
        if (isolation != null) {
            pinning = pinning + "; " + isolation.outcome();
        }
        if (interrupted) {
            Thread.currentThread().interrupt();
        }
        return new LoopResult(config, timings.exchanges.get(), timings.steps.get(), timings.overruns.get(),
                timings.skippedExchanges.get(), timings.copyTotal(timings.lateness), timings.copyTotal(timings.compute),
                timings.copyTotal(timings.rtt), timings.copyTotal(timings.replyAge),
                timings.snapshot().clampedValues(), consumerNames, missed, errors, supervisor.repliesApplied(), countersCopy, plant.tripFlags(),
                stopReason, stopDetail, wallTimeNs, pinning, timings.intervalLogBody(), timings.baseTimeMs());
    }

    /** Longest sleep of the timing reader between checks of its stop flag, ms. */
    private static final long READER_CHECK_MS = 50;

    private void readTimings() {
        final long intervalMs = Math.max(1, config.timingIntervalNs / 1_000_000);
        final long startMs = System.currentTimeMillis();
        long nextLogMs = startMs + intervalMs;
        long nextFlipMs = startMs + LoopTimings.WARMUP_SWAP_MS;
        while (!readerStop) {
            final long nowMs = System.currentTimeMillis();
            final boolean warmup = nowMs - startMs < LoopTimings.WARMUP_MS;
            final long dueMs = warmup ? Math.min(nextFlipMs, nextLogMs) : nextLogMs;
            if (nowMs < dueMs) {
                try {
                    Thread.sleep(Math.min(READER_CHECK_MS, dueMs - nowMs));
                } catch (InterruptedException e) {
                    // run() sets readerStop first; the loop condition decides
                }
                continue;
            }
            final boolean log = nowMs >= nextLogMs;
            timings.takeInterval(log);
            nextFlipMs = nowMs + LoopTimings.WARMUP_SWAP_MS;
            if (log) {
                nextLogMs += intervalMs;
                if (nextLogMs <= nowMs) {
                    nextLogMs = nowMs + intervalMs;
                }
            }
        }
    }

    private void loopThread() {
        if (config.pinCpu >= 0) {
            pinning = CpuPinning.pinCurrentThread(config.pinCpu);
        }
        try {
            runSchedule();
        } catch (RuntimeException | Error e) {
            stopReason = LoopResult.StopReason.ERROR;
            stopDetail = e.toString();
        }
    }

    /** The real-time part. Everything it touches was allocated in the constructor or run(). */
    private void runSchedule() {
        final PlantModel p = plant;
        final BoardLink l = link;
        final StepHook h = hook;
        final LinkSupervisor sup = supervisor;
        final LoopTimings t = timings;
        final ConsumerRing[] rs = rings;
        final SensorView v = view;
        final BoardCommand rx = polled;
        final double[] vals = values;
        final int plantN = layout.plantSignalCount();
        final long period = config.exchangePeriodNs();
        final int m = config.exchangeEverySteps;
        final long planned = config.plannedExchanges();
        final boolean realTime = config.realTime;
        final long replyWaitNs = config.replyWaitNs;
        final boolean skip = config.missedTickPolicy == MissedTickPolicy.SKIP || replyWaitNs > 0;
        final boolean stopOnTrip = config.stopOnTrip;
        final boolean waitForConsumers = !realTime && config.offlineBackpressure;

        p.sense(v);
        sup.init(v);
        sup.beginExchange(0);
        final long t0 = System.nanoTime() + period;
        // round trips are timed from just before the send: on a busy machine the send system call
        // may wake the board and be preempted until its reply is already waiting
        sup.onSent(0, System.nanoTime());
        long receivedAtSend = l.framesReceived();
        l.send(0, v);

        long k = 0;
        long exchange = 0;
        long step = 0;
        long overruns = 0;
        long skipped = 0;
        long end = t0;
        while (true) {
            long deadline = t0 + k * period;
            long now = System.nanoTime();
            if (realTime) {
                while (now < deadline && !abortRequested) {
                    if (sup.awaitingReply() && deadline - now > POLL_GUARD_NS) {
                        if (l.poll(rx) == BoardLink.POLL_REPLY) {
                            sup.onReply(rx, System.nanoTime());
                        }
                    } else {
                        Thread.onSpinWait();
                    }
                    now = System.nanoTime();
                }
                if (replyWaitNs > 0) {
                    // paced exchange: a reply still due holds the plant up to replyWaitNs; the wait
                    // shows as lateness and an overrun, and the schedule is re-based below
                    // only while nothing at all arrived since the send: a reply that fault
                    // injection withholds on purpose is not waited for
                    final long giveUpNs = deadline + replyWaitNs;
                    while (sup.awaitingReply() && now < giveUpNs && !abortRequested
                            && (receivedAtSend < 0 || l.framesReceived() == receivedAtSend)) {
                        if (l.poll(rx) == BoardLink.POLL_REPLY) {
                            sup.onReply(rx, System.nanoTime());
                        }
                        now = System.nanoTime();
                    }
                }
            }
            if (abortRequested) {
                stopReason = LoopResult.StopReason.ABORTED;
                stopDetail = abortReason;
                break;
            }
            final long latenessNs = realTime ? now - deadline : 0;
            if (latenessNs > period) {
                overruns++;
                t.overruns.lazySet(overruns);
                if (skip) {
                    final long behind = (now - t0) / period - k;
                    k += behind;
                    skipped += behind;
                    t.skippedExchanges.lazySet(skipped);
                }
            }
            for (int i = 0; i < MAX_POLLS_PER_EXCHANGE; i++) {
                final int r = l.poll(rx);
                if (r == BoardLink.POLL_EMPTY) {
                    break;
                }
                if (r == BoardLink.POLL_REPLY) {
                    sup.onReply(rx, System.nanoTime());
                }
            }
            sup.applyAtExchange(p);
            final BoardCommand cmd = sup.command();

            final long c0 = System.nanoTime();
            for (int i = 0; i < m; i++) {
                if (h != null) {
                    h.beforeStep(step, p);
                }
                p.step(cmd);
                step++;
            }
            final long computeNs = System.nanoTime() - c0;

            p.sense(v);
            p.sample(vals);
            final long rttNs = sup.takeRoundTripNs();
            final long age = sup.replyAge();
            vals[plantN + SampleLayout.BOARD_STATUS] = cmd.boardStatus;
            vals[plantN + SampleLayout.FRT_ACTIVE] = (cmd.boardStatus & BoardCommand.BOARD_FRT_ACTIVE) != 0 ? 1.0 : 0.0;
            vals[plantN + SampleLayout.MSC_DUTY_A] = cmd.mscDutyA;
            vals[plantN + SampleLayout.MSC_DUTY_A + 1] = cmd.mscDutyB;
            vals[plantN + SampleLayout.MSC_DUTY_A + 2] = cmd.mscDutyC;
            vals[plantN + SampleLayout.GSC_DUTY_A] = cmd.gscDutyA;
            vals[plantN + SampleLayout.GSC_DUTY_A + 1] = cmd.gscDutyB;
            vals[plantN + SampleLayout.GSC_DUTY_A + 2] = cmd.gscDutyC;
            vals[plantN + SampleLayout.CHOPPER_DUTY] = cmd.chopperDuty;
            vals[plantN + SampleLayout.PITCH_REF_DEG] = Math.toDegrees(cmd.pitchRefRad);
            vals[plantN + SampleLayout.V_DEV_REF_PU] = v.voltageDeviationRefPu;
            vals[plantN + SampleLayout.LATENESS_US] = latenessNs * 1e-3;
            vals[plantN + SampleLayout.COMPUTE_US] = computeNs * 1e-3;
            vals[plantN + SampleLayout.RTT_US] = rttNs < 0 ? Double.NaN : rttNs * 1e-3;
            vals[plantN + SampleLayout.REPLY_AGE] = age;
            final long plantTimeNs = p.plantTimeNs();
            for (int i = 0; i < rs.length; i++) {
                rs[i].tryPublish(exchange, step, plantTimeNs, vals, waitForConsumers, this);
            }

            exchange++;
            sup.beginExchange(exchange);
            sup.onSent(exchange, System.nanoTime());
            receivedAtSend = l.framesReceived();
            l.send(exchange, v);
            end = System.nanoTime();

            if (realTime) {
                t.lateness.record(latenessNs);
            }
            t.compute.record(computeNs);
            t.replyAge.record(age);
            t.exchanges.lazySet(exchange);
            t.steps.lazySet(step);

            if (exchange >= planned) {
                break;
            }
            if (stopOnTrip && p.tripFlags() != 0) {
                stopReason = LoopResult.StopReason.PLANT_TRIP;
                stopDetail = "plant trip flags 0x" + Integer.toHexString(p.tripFlags());
                break;
            }
            k++;
        }
        wallTimeNs = end - t0;
    }
}
