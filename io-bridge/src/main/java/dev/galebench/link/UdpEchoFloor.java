package dev.galebench.link;

import dev.galebench.rt.SpinFloor;

import java.io.IOException;
import java.io.UncheckedIOException;
import java.net.InetSocketAddress;
import java.net.SocketAddress;
import java.net.StandardProtocolFamily;
import java.nio.ByteBuffer;
import java.nio.channels.ClosedChannelException;
import java.nio.channels.DatagramChannel;

/**
 * The bare input/output of a UDP exchange for {@link SpinFloor}'s I/O floor: the spinning
 * thread sends one datagram of a frame's size per tick on a connected, non-blocking channel
 * with direct buffers (the same calls {@link UdpBoardLink} makes) and polls for the echo; an
 * echo thread ("galebench-echo") waits in a blocking receive on loopback and sends each
 * datagram straight back, the way the virtual board waits, but with no codec or controller.
 *
 * <p>What the I/O floor measures is the machine's price of one loopback exchange per tick with a
 * peer that sleeps between frames: system calls, the kernel's loopback path, and waking the
 * peer's core. Nothing of galebench's plant, loop or wire format is in it.
 *
 * <p>Not thread-safe: {@link #onTick} and {@link #poll} belong to the spinning thread.
 */
public final class UdpEchoFloor implements SpinFloor.FloorIo, AutoCloseable {
    private final DatagramChannel echo;
    private final DatagramChannel client;
    private final Thread echoThread;
    private final ByteBuffer tx;
    private final ByteBuffer rx = ByteBuffer.allocateDirect(2048);
    private volatile boolean closed;
    private long sent;
    private long echoed;

    /**
     * Opens the echo on a free loopback port and starts its thread.
     *
     * @param frameBytes datagram size, e.g. the measurement frame length of the profile in use
     */
    public UdpEchoFloor(int frameBytes) {
        if (frameBytes < 8 || frameBytes > 1024) {
            throw new IllegalArgumentException("echo floor: frame of " + frameBytes + " bytes out of range [8, 1024]");
        }
        tx = ByteBuffer.allocateDirect(frameBytes);
        DatagramChannel e = null;
        DatagramChannel c = null;
        try {
            e = DatagramChannel.open(StandardProtocolFamily.INET);
            e.setOption(java.net.StandardSocketOptions.SO_RCVBUF, 1 << 20);
            e.bind(new InetSocketAddress("127.0.0.1", 0));
            c = DatagramChannel.open(StandardProtocolFamily.INET);
            c.setOption(java.net.StandardSocketOptions.SO_RCVBUF, 1 << 20);
            c.bind(new InetSocketAddress("127.0.0.1", 0));
            c.connect(e.getLocalAddress());
            c.configureBlocking(false);
        } catch (IOException ex) {
            UdpBoardLink.closeQuietly(e);
            UdpBoardLink.closeQuietly(c);
            throw new UncheckedIOException("cannot open the UDP echo on loopback: " + ex.getMessage(), ex);
        }
        echo = e;
        client = c;
        echoThread = new Thread(this::serve, "galebench-echo");
        echoThread.setDaemon(true);
        echoThread.start();
    }

    private void serve() {
        final ByteBuffer b = ByteBuffer.allocateDirect(2048);
        while (!closed) {
            b.clear();
            try {
                final SocketAddress from = echo.receive(b);
                b.flip();
                echo.send(b, from);
            } catch (ClosedChannelException ex) {
                return;
            } catch (IOException ex) {
                if (closed) {
                    return;
                }
            }
        }
    }

    @Override
    public void onTick(long k) {
        tx.clear();
        tx.putLong(0, k);
        try {
            if (client.write(tx) > 0) {
                sent++;
            }
        } catch (IOException ex) {
            // counted by its absence: sent() stays behind the tick count
        }
    }

    @Override
    public void poll() {
        rx.clear();
        try {
            if (client.read(rx) > 0) {
                echoed++;
            }
        } catch (IOException ex) {
            // nothing to read on a closed or refused socket; echoed() shows it
        }
    }

    /** Datagrams sent (spinning thread's count; read after the floor has finished). */
    public long sent() {
        return sent;
    }

    /** Echoes received (same). */
    public long echoed() {
        return echoed;
    }

    @Override
    public void close() {
        closed = true;
        UdpBoardLink.closeQuietly(client);
        UdpBoardLink.closeQuietly(echo);
        try {
            echoThread.join(2_000);
        } catch (InterruptedException ex) {
            Thread.currentThread().interrupt();
        }
    }
}
