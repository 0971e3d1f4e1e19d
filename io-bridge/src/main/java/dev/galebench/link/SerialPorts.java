package dev.galebench.link;

import com.fazecast.jSerialComm.SerialPort;
import java.io.IOException;
import java.io.UncheckedIOException;

/** Opens serial ports the same way for the plant-side link and the virtual board. */
public final class SerialPorts {
    private SerialPorts() {
    }

    /**
     * Opens {@code device} by path at {@code baud}, 8N1, no flow control, with the given
     * jSerialComm timeout mode and read timeout (ms), and flushes stale input. A pty accepts
     * and ignores the baud rate; jSerialComm logs a harmless ENOTTY for modem ioctls a pty
     * lacks. Throws {@link UncheckedIOException} naming the device if it cannot be opened.
     */
    public static SerialPort open(String device, int baud, int timeoutMode, int readTimeoutMs) {
        final SerialPort p;
        try {
            p = SerialPort.getCommPort(device);
        } catch (RuntimeException e) { // jSerialComm's SerialPortInvalidPortException: no such device
            final String message = "cannot open serial port " + device + ": " + e.getMessage();
            throw new UncheckedIOException(message, new IOException(message, e));
        }
        p.setComPortParameters(baud, 8, SerialPort.ONE_STOP_BIT, SerialPort.NO_PARITY);
        p.setFlowControl(SerialPort.FLOW_CONTROL_DISABLED);
        p.setComPortTimeouts(timeoutMode, readTimeoutMs, 0);
        if (!p.openPort()) {
            final String message = "cannot open serial port " + device
                    + " (error " + p.getLastErrorCode() + " at location " + p.getLastErrorLocation() + ")";
            throw new UncheckedIOException(message, new IOException(message));
        }
        p.flushIOBuffers();
        return p;
    }
}
