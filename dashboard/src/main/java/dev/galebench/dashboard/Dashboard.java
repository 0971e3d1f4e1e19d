package dev.galebench.dashboard;

import dev.galebench.rt.SampleConsumer;
import io.netty.bootstrap.ServerBootstrap;
import io.netty.channel.Channel;
import io.netty.channel.ChannelOption;
import io.netty.channel.EventLoopGroup;
import io.netty.channel.MultiThreadIoEventLoopGroup;
import io.netty.channel.WriteBufferWaterMark;
import io.netty.channel.nio.NioIoHandler;
import io.netty.channel.socket.nio.NioServerSocketChannel;
import io.netty.util.concurrent.DefaultThreadFactory;

import java.net.InetSocketAddress;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.TimeUnit;

/**
 * The live console: one Netty server (HTTP pages, {@code /ws} live data, {@code /runs/} report
 * folders), one ring consumer that decimates the sample stream, and the hooks a bench calls
 * as a sequence runs. This is the module's entry point; {@code galebench serve} and the
 * {@code --dashboard[=PORT]} option of {@code run} and {@code demo} both go through it.
 *
 * <p>How a command wires it (see {@code dashboard/README.md}):
 * <pre>{@code
 * try (Dashboard d = Dashboard.start(options, benchControl, timingSource)) {
 *     ring.addConsumer(d.feed());               // before the loop starts
 *     d.sequenceStarted(name, runId);
 *     ... d.verdict(v, tS) as checks fall ...
 *     d.sequenceFinished(name, runId, "passed", runDir, "report.html");
 * }
 * }</pre>
 * For {@code run}/{@code demo --dashboard[=PORT]} use {@link #startForRun(int, BenchControl, TimingSource)}.
 *
 * <p>Cost: one Netty event-loop thread (daemon) shared by every connection, plus the feed's
 * work on the ring's consumer thread. Nothing here ever runs on the real-time thread; on a
 * two-core machine the event-loop thread shares the second core with the other consumers.
 */
public final class Dashboard implements AutoCloseable {
    private final DashboardOptions options;
    private final TelemetryHub hub;
    private final ControlDispatcher dispatcher;
    private final DecimatingFeed feed;
    private final EventLoopGroup group;
    private final Channel serverChannel;
    private final int port;

    private Dashboard(DashboardOptions options, BenchControl bench, TimingSource timing) {
        this.options = options.validated();
        StaticResources resources = new StaticResources();
        Access access = new Access(options.token(), options.allowViewers());
        this.hub = new TelemetryHub();
        this.dispatcher = new ControlDispatcher(hub, access, bench);
        this.feed = new DecimatingFeed(hub, options.plotSignals(), options.bucketNs(), timing);
        if (bench != null) {
            hub.setSequences(bench.sequences());
            hub.setControls(bench.interactive(), bench.linkFaults());
        }
        this.group = new MultiThreadIoEventLoopGroup(1, new DefaultThreadFactory("galebench-dashboard", true),
                NioIoHandler.newFactory());
        try {
            ServerBootstrap b = new ServerBootstrap()
                    .group(group)
                    .channel(NioServerSocketChannel.class)
                    .childOption(ChannelOption.TCP_NODELAY, true)
                    .childOption(ChannelOption.WRITE_BUFFER_WATER_MARK, new WriteBufferWaterMark(256 * 1024, 1024 * 1024))
                    .childHandler(new DashboardInitializer(resources, access, hub, dispatcher));
            this.serverChannel = b.bind(new InetSocketAddress(options.bindAddress(), options.port()))
                    .syncUninterruptibly().channel();
        } catch (Exception e) { // bind failures arrive as checked exceptions rethrown unchecked
            group.shutdownGracefully(0, 1, TimeUnit.SECONDS);
            dispatcher.close();
            throw new IllegalArgumentException("cannot listen on " + options.bindAddress() + ":" + options.port()
                    + ": " + e.getMessage(), e);
        }
        this.port = ((InetSocketAddress) serverChannel.localAddress()).getPort();
    }

    /**
     * Starts a console with the given options.
     *
     * @param bench  the bench it controls, or null for watch-only
     * @param timing overrun and link counters, or null
     * @throws IllegalArgumentException if the options break a rule or the port is taken
     */
    public static Dashboard start(DashboardOptions options, BenchControl bench, TimingSource timing) {
        return new Dashboard(options, bench, timing);
    }

    /**
     * Entry point for {@code run --dashboard[=PORT]} and {@code demo --dashboard[=PORT]}: loopback,
     * no token, default plots. {@code port} 0 picks a free port (see {@link #url()}).
     */
    public static Dashboard startForRun(int port, BenchControl bench, TimingSource timing) {
        return new Dashboard(DashboardOptions.loopback(port), bench, timing);
    }

    /** The ring consumer to add before the loop starts; one per console. */
    public SampleConsumer feed() {
        return feed;
    }

    /** Replaces the counter source (a new run's loop and link). */
    public void timingSource(TimingSource source) {
        feed.timingSource(source);
    }

    /** Attaches another bench (or null), and refreshes the sequence list and controls. */
    public void bench(BenchControl bench) {
        dispatcher.bench(bench);
        refreshBench(bench);
    }

    /** The bench the console's controls go to now (null: none). */
    public BenchControl currentBench() {
        return dispatcher.bench();
    }

    /** Re-reads the sequence list and control capabilities from {@code bench}. */
    public void refreshBench(BenchControl bench) {
        if (bench != null) {
            hub.setSequences(bench.sequences());
            hub.setControls(bench.interactive(), bench.linkFaults());
        } else {
            hub.setSequences(List.of());
            hub.setControls(false, List.of());
        }
    }

    /** A sequence began; clears the verdict list of every console. */
    public void sequenceStarted(String sequence, String runId) {
        hub.sequenceStarted(sequence, runId, List.of());
    }

    /**
     * A sequence began whose checks are {@code checkNames}: consoles list them as pending until
     * their verdicts arrive (checks that judge the whole run decide when it ends).
     */
    public void sequenceStarted(String sequence, String runId, List<String> checkNames) {
        hub.sequenceStarted(sequence, runId, checkNames);
    }

    /** A check's verdict fell at plant time {@code plantTimeS} (NaN if not known). */
    public void verdict(Verdict verdict, double plantTimeS) {
        hub.verdict(verdict, plantTimeS);
    }

    /**
     * The sequence ended with {@code outcome} ({@code passed}, {@code failed} or {@code aborted}).
     * If {@code runDir} is not null its files are served under {@code /runs/<runId>/} and consoles
     * get a link to {@code reportFile} (default {@code report.html}) in it.
     */
    public void sequenceFinished(String sequence, String runId, String outcome, Path runDir, String reportFile) {
        hub.sequenceFinished(sequence, runId, outcome, runDir, reportFile);
    }

    /** Adds a line to the control log every console shows (e.g. a control taken on the command line). */
    public void log(String text) {
        hub.log("bench", text, true);
    }

    /** TCP port actually bound. */
    public int port() {
        return port;
    }

    /** Address to open in a browser (with the token, if one is set). */
    public String url() {
        String host = options.bindAddress().contains(":") ? "[" + options.bindAddress() + "]" : options.bindAddress();
        if ("0.0.0.0".equals(host) || "[::]".equals(host)) {
            host = "localhost";
        }
        return "http://" + host + ":" + port + "/" + (options.token() == null ? "" : "?token=" + options.token());
    }

    /** Open console sockets right now. */
    public int viewerCount() {
        return hub.viewerCount();
    }

    /** Data batches not sent to a slow viewer (its socket buffer was full). */
    public long slowViewerSkips() {
        return hub.slowViewerSkips();
    }

    /** CPU time of the feed during the last complete stream, ns (-1 before one ended). */
    public long feedCpuNs() {
        return feed.lastStreamCpuNs();
    }

    /** Number of the newest data batch published (0 before the first). */
    public long lastBatch() {
        return hub.lastSeq();
    }

    /** Closes every socket and stops the server; waits up to 2 s. */
    @Override
    public void close() {
        hub.closeAll();
        serverChannel.close().awaitUninterruptibly(2, TimeUnit.SECONDS);
        dispatcher.close();
        group.shutdownGracefully(0, 2, TimeUnit.SECONDS).awaitUninterruptibly(3, TimeUnit.SECONDS);
    }
}
