/**
 * The board side: the {@link dev.galebench.board.BoardController} contract every control law
 * implements, and {@link dev.galebench.board.VirtualBoard}, a board in software that answers
 * the plant's frames over UDP or serial from its own process ({@code galebench board}). The
 * virtual board blocks in its receive instead of spinning, leaving the second core of a small
 * machine to the plant's real-time thread.
 */
package dev.galebench.board;
