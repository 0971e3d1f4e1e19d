package dev.galebench.board;

import com.fazecast.jSerialComm.SerialPort;
import dev.galebench.link.SerialPorts;
import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.wire.Cobs;
import dev.galebench.wire.CobsFramer;
import dev.galebench.wire.CommandFrame;
import dev.galebench.wire.FrameLayout;
import dev.galebench.wire.FrameStatus;
import dev.galebench.wire.MeasurementFrame;
import dev.galebench.wire.WireProfile;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetSocketAddress;
import java.net.SocketAddress;
import java.net.StandardProtocolFamily;
import java.nio.ByteBuffer;
import java.nio.channels.ClosedChannelException;
import java.nio.channels.DatagramChannel;

/**
 * A board in software: receives measurement frames, runs a {@link BoardController}, answers
 * with a command frame that echoes the measurement's sequence. Runs in its own process
 * ({@code galebench board}) or on a thread of a test.
 *
 * <p>It waits in a blocking receive and never spins: on a two-core machine a spinning peer
 * takes the core the plant's real-time thread needs and multiplies its tail latency (see
 * io-bridge/README.md). The controller is started with the first valid frame and started
 * again whenever the plant's sequence goes backwards (a new run). Frames with a bad CRC,
 * a bad layout or the other profile are counted in {@link #counters()} and not answered, as
 * a real board would do.
 */
public final class VirtualBoard implements AutoCloseable {
    private final BoardController controller;
    private final WireProfile profile;
    private final BoardCounters counters = new BoardCounters();
    private final SensorView view = new SensorView();
    private final BoardCommand command = new BoardCommand();
    private final MeasurementFrame measurement = new MeasurementFrame();
    private final CommandFrame reply = new CommandFrame();
    private final DatagramChannel channel;
    private final SerialPort port;
    private final String description;
    private volatile boolean closed;
    private boolean started;
    private long lastSequence;
    private long replySequence;

    private VirtualBoard(BoardController controller, WireProfile profile, double samplePeriodS,
                         DatagramChannel channel, SerialPort port, String description) {
        this.controller = controller;
        this.profile = profile;
        this.channel = channel;
        this.port = port;
        this.description = description;
        controller.setSamplePeriod(samplePeriodS);
    }

    /** A board answering UDP datagrams on {@code bind} (port 0 picks a free port; see {@link #describe()}). */
    public static VirtualBoard udp(InetSocketAddress bind, WireProfile profile, BoardController controller, double samplePeriodS) {
        DatagramChannel ch = null;
        try {
            ch = DatagramChannel.open(StandardProtocolFamily.INET);
            // room for a burst of frames while this process is descheduled (the kernel caps it at net.core.rmem_max)
            ch.setOption(java.net.StandardSocketOptions.SO_RCVBUF, 1 << 20);
            ch.bind(bind);
            ch.configureBlocking(true);
            final InetSocketAddress local = (InetSocketAddress) ch.getLocalAddress();
            return new VirtualBoard(controller, profile, samplePeriodS, ch, null,
                    "udp " + local.getAddress().getHostAddress() + ":" + local.getPort());
        } catch (IOException e) {
            if (ch != null) {
                try {
                    ch.close();
                } catch (IOException ignored) {
                    // already failing
                }
            }
            throw new UncheckedIOException("cannot bind UDP board to " + bind + ": " + e.getMessage(), e);
        }
    }

    /** A board on serial port {@code device} (COBS framing, blocking reads with a 100 ms timeout). */
    public static VirtualBoard serial(String device, int baud, WireProfile profile, BoardController controller, double samplePeriodS) {
        final SerialPort p = SerialPorts.open(device, baud,
                SerialPort.TIMEOUT_READ_SEMI_BLOCKING | SerialPort.TIMEOUT_WRITE_BLOCKING, 100);
        return new VirtualBoard(controller, profile, samplePeriodS, null, p, "serial " + device + " @" + baud);
    }

    /** Where the board listens, e.g. {@code udp 127.0.0.1:40123} or {@code serial /dev/pts/3 @921600}. */
    public String describe() {
        return description;
    }

    /** UDP port the board is bound to, or -1 for a serial board. */
    public int udpPort() {
        if (channel == null) {
            return -1;
        }
        try {
            return ((InetSocketAddress) channel.getLocalAddress()).getPort();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    public BoardCounters counters() {
        return counters;
    }

    /** Serves frames until {@link #close()} is called from another thread. */
    public void run() {
        if (channel != null) {
            runUdp();
        } else {
            runSerial();
        }
    }

    private void runUdp() {
        final ByteBuffer rx = ByteBuffer.allocateDirect(2048);
        final ByteBuffer tx = ByteBuffer.allocateDirect(FrameLayout.MAX_FRAME_LENGTH);
        while (!closed) {
            rx.clear();
            final SocketAddress from;
            try {
                from = channel.receive(rx);
            } catch (ClosedChannelException e) {
                return;
            } catch (IOException e) {
                if (closed) {
                    return;
                }
                counters.sendFailures++;
                continue;
            }
            final int n = handle(rx, rx.position(), tx);
            if (n > 0) {
                tx.limit(n).position(0);
                try {
                    channel.send(tx, from);
                } catch (IOException e) {
                    if (closed) {
                        return;
                    }
                    counters.sendFailures++;
                }
            }
        }
    }

    private void runSerial() {
        final CobsFramer framer = new CobsFramer(FrameLayout.MAX_FRAME_LENGTH, 8192);
        final byte[] frame = new byte[FrameLayout.MAX_FRAME_LENGTH + 1];
        final ByteBuffer rx = ByteBuffer.wrap(frame);
        final byte[] txBytes = new byte[FrameLayout.MAX_FRAME_LENGTH];
        final ByteBuffer tx = ByteBuffer.wrap(txBytes);
        final byte[] encoded = new byte[Cobs.maxEncodedLength(FrameLayout.MAX_FRAME_LENGTH) + 1];
        while (!closed) {
            final int at = framer.writeOffset();
            final int got = port.readBytes(framer.buffer(), framer.writableBytes(), at);
            if (got < 0) {
                if (closed) {
                    return;
                }
                sleepQuietly();
                continue;
            }
            framer.advance(got);
            while (true) {
                final int length = framer.nextFrame(frame);
                if (length == CobsFramer.NONE) {
                    break;
                }
                if (length < 0) {
                    counters.malformedFrames++;
                    continue;
                }
                final int n = handle(rx, length, tx);
                if (n > 0) {
                    final int e = Cobs.encode(txBytes, 0, n, encoded, 0);
                    encoded[e] = 0;
                    if (port.writeBytes(encoded, e + 1) != e + 1) {
                        counters.sendFailures++;
                    }
                }
            }
        }
    }

    /**
     * Handles one received frame of {@code length} bytes at index 0 of {@code rx}: returns the
     * length of the reply written at index 0 of {@code tx}, or 0 if the frame is not answered.
     */
    int handle(ByteBuffer rx, int length, ByteBuffer tx) {
        measurement.wrap(rx, 0);
        final int status = measurement.decode(length, view);
        if (status == FrameStatus.CRC_ERROR) {
            counters.crcErrors++;
            return 0;
        }
        if (status != FrameStatus.OK) {
            counters.malformedFrames++;
            return 0;
        }
        if (measurement.profile() != profile) {
            counters.wrongProfile++;
            return 0;
        }
        final long sequence = measurement.sequence();
        if (!started || ((sequence - lastSequence) & 0xFFFFFFFFL) >= 0x80000000L) {
            controller.start(view);
            started = true;
            counters.starts++;
        }
        lastSequence = sequence;
        controller.update(view, command);
        reply.wrap(tx, 0);
        final int n = reply.encode(profile, replySequence++, sequence, command);
        counters.framesAnswered++;
        return n;
    }

    private static void sleepQuietly() {
        try {
            Thread.sleep(10);
        } catch (InterruptedException e) {
            Thread.currentThread().interrupt();
        }
    }

    /** Stops {@link #run()} and releases the socket or port. */
    @Override
    public void close() {
        closed = true;
        if (channel != null) {
            try {
                channel.close();
            } catch (IOException ignored) {
                // closing anyway
            }
        }
        if (port != null) {
            port.closePort();
        }
    }
}
