package dev.galebench.board;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;

import java.util.Objects;

/**
 * A controller that hands every call to another one: the base of wrappers that watch, delay or
 * alter what a controller does (a board that misses deadlines, a recorder of its status words).
 * Subclasses override what they change and call {@code super} for the rest.
 */
public abstract class ForwardingBoardController implements BoardController {
    /** The controller every call is handed to. */
    protected final BoardController inner;

    protected ForwardingBoardController(BoardController inner) {
        this.inner = Objects.requireNonNull(inner, "inner");
    }

    @Override
    public void setSamplePeriod(double samplePeriodS) {
        inner.setSamplePeriod(samplePeriodS);
    }

    @Override
    public void start(SensorView first) {
        inner.start(first);
    }

    @Override
    public void update(SensorView in, BoardCommand out) {
        inner.update(in, out);
    }
}
