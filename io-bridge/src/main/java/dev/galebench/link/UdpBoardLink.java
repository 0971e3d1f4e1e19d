package dev.galebench.link;

import dev.galebench.wire.WireProfile;
import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetSocketAddress;
import java.net.StandardProtocolFamily;
import java.net.StandardSocketOptions;
import java.nio.ByteBuffer;
import java.nio.channels.DatagramChannel;

/**
 * UDP link: one connected, non-blocking JDK {@link DatagramChannel} with pre-allocated direct
 * buffers, used only by the real-time thread (no hand-off to another thread). Measured on
 * this machine class to match a C ping-pong that spins on a non-blocking {@code recv}
 * (see io-bridge/README.md); an event-loop library on the tick path did worse.
 *
 * <p>{@link #send} is one {@code write} system call; {@link #poll} one {@code read} (returns
 * at once when nothing is there). Connected, so datagrams from any other address are
 * discarded by the kernel. An ICMP "port unreachable" (board not running) surfaces as an
 * exception from the next read or write; it is counted as a send failure. Only that rare
 * path allocates (the JDK builds the exception).
 */
final class UdpBoardLink extends FrameLink {
    private static final int RX_CAPACITY = 2048;
    private final DatagramChannel channel;

    UdpBoardLink(InetSocketAddress board, LinkOptions options) {
        super(options.profile, options.faults, ByteBuffer.allocateDirect(RX_CAPACITY), ByteBuffer.allocateDirect(RX_CAPACITY));
        DatagramChannel ch = null;
        try {
            ch = DatagramChannel.open(StandardProtocolFamily.INET);
            ch.setOption(StandardSocketOptions.SO_RCVBUF, options.socketBufferBytes);
            ch.setOption(StandardSocketOptions.SO_SNDBUF, options.socketBufferBytes);
            final String host = options.localHost != null ? options.localHost
                    : board.getAddress().isLoopbackAddress() ? "127.0.0.1" : "0.0.0.0";
            ch.bind(new InetSocketAddress(host, options.localPort));
            ch.connect(board);
            ch.configureBlocking(false);
        } catch (IOException e) {
            closeQuietly(ch);
            throw new UncheckedIOException("cannot open UDP link to " + board + ": " + e.getMessage(), e);
        }
        channel = ch;
    }

    @Override
    boolean transmit(int length) {
        final ByteBuffer b = txFrame;
        b.limit(length).position(0);
        try {
            return channel.write(b) == length;
        } catch (IOException e) {
            return false;
        }
    }

    @Override
    int receive() {
        final ByteBuffer b = rxFrame;
        b.clear();
        try {
            return channel.read(b);
        } catch (IOException e) {
            counters.sendFailures++;
            return 0;
        }
    }

    /** Local address the link is bound to (for tests and logs). */
    InetSocketAddress localAddress() {
        try {
            return (InetSocketAddress) channel.getLocalAddress();
        } catch (IOException e) {
            throw new UncheckedIOException(e);
        }
    }

    @Override
    public void close() {
        closeQuietly(channel);
    }

    static void closeQuietly(DatagramChannel ch) {
        if (ch != null) {
            try {
                ch.close();
            } catch (IOException ignored) {
                // nothing useful to do when closing fails
            }
        }
    }
}
