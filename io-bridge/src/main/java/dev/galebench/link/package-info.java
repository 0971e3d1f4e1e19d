/**
 * Board links: how the real-time loop reaches a board. {@link dev.galebench.link.BoardLinks}
 * opens UDP ({@code udp://HOST:PORT}), serial ({@code serial:DEVICE[@BAUD]}) and in-process
 * links; all implement {@link dev.galebench.rt.BoardLink}, are owned by the real-time thread,
 * never block, never allocate after opening, and count every wire fault.
 *
 * <p>{@link dev.galebench.link.LinkFaults} injects deterministic faults (drop, delay,
 * duplicate, corrupt, truncate, silence) on the reply path of any link, switchable from the
 * real-time thread between exchanges.
 */
package dev.galebench.link;
