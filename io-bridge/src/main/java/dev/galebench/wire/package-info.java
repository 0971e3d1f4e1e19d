/**
 * The galebench wire format, version 1: byte layout ({@link dev.galebench.wire.FrameLayout}),
 * flyweight codecs over caller-owned buffers ({@link dev.galebench.wire.MeasurementFrame},
 * {@link dev.galebench.wire.CommandFrame}), CRC-32C and COBS framing.
 *
 * <p>Everything here that runs per exchange is allocation-free, lock-free and returns status
 * codes instead of throwing, because it runs on the real-time thread; the cost is a frame
 * encode plus decode of roughly 0.1-0.2 us. The protocol is specified for board authors in
 * {@code io-bridge/PROTOCOL.md}; the C kit in {@code io-bridge/board-kit} is tested against
 * this package byte for byte.
 */
package dev.galebench.wire;
