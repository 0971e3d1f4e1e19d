package dev.galebench.link;

import com.fazecast.jSerialComm.SerialPort;
import dev.galebench.wire.Cobs;
import dev.galebench.wire.CobsFramer;
import dev.galebench.wire.FrameLayout;
import java.nio.ByteBuffer;

/**
 * Serial link over jSerialComm: frames are COBS-encoded and each is followed by one 0x00
 * delimiter. The port is opened by path (a {@code /dev/ttyUSB0}, {@code /dev/ttyACM0} or a
 * pseudo-terminal {@code /dev/pts/N}), 8N1, no flow control, in non-blocking mode: each
 * {@link #poll} does one non-blocking read of whatever bytes are there and returns at most
 * one frame; bytes of a partial frame wait for the next poll. A spinning non-blocking read
 * matched a C client on a pty on this machine class, while listener callbacks showed
 * millisecond tails (see io-bridge/README.md).
 *
 * <p>Resynchronisation ({@link CobsFramer}): the port's input buffer is flushed when it
 * opens; a block that does not decode, or a run of more than {@code maxEncodedLength} bytes
 * without a delimiter, is discarded and counted once as a malformed frame. An empty frame (two delimiters in a row) is ignored, so a board may send
 * an extra 0x00 before a frame to flush a receiver.
 */
final class SerialBoardLink extends FrameLink {
    private static final int STREAM_CAPACITY = 4096;
    private static final int MAX_ENCODED = Cobs.maxEncodedLength(FrameLayout.MAX_FRAME_LENGTH);

    private final SerialPort port;
    private final String device;
    private final byte[] tx;
    private final byte[] txEncoded = new byte[MAX_ENCODED + 1];
    private final byte[] rx;
    private final CobsFramer framer = new CobsFramer(FrameLayout.MAX_FRAME_LENGTH, STREAM_CAPACITY);

    SerialBoardLink(String device, int baud, LinkOptions options) {
        this(device, baud, options, new byte[FrameLayout.MAX_FRAME_LENGTH], new byte[FrameLayout.MAX_FRAME_LENGTH + 1]);
    }

    private SerialBoardLink(String device, int baud, LinkOptions options, byte[] tx, byte[] rx) {
        super(options.profile, options.faults, ByteBuffer.wrap(tx), ByteBuffer.wrap(rx));
        this.tx = tx;
        this.rx = rx;
        this.device = device;
        port = SerialPorts.open(device, baud, SerialPort.TIMEOUT_NONBLOCKING, 0);
    }

    @Override
    boolean transmit(int length) {
        final int n = Cobs.encode(tx, 0, length, txEncoded, 0);
        txEncoded[n] = 0;
        return port.writeBytes(txEncoded, n + 1) == n + 1;
    }

    @Override
    int receive() {
        final CobsFramer f = framer;
        int frame = f.nextFrame(rx);
        if (frame != CobsFramer.NONE) {
            return frame;
        }
        final int at = f.writeOffset();
        final int free = f.writableBytes();
        if (free == 0) {
            return 0;
        }
        final int n = port.readBytes(f.buffer(), free, at);
        if (n <= 0) {
            return 0;
        }
        f.advance(n);
        return f.nextFrame(rx);
    }

    @Override
    public void close() {
        port.closePort();
    }

    @Override
    public String toString() {
        return "serial:" + device;
    }
}
