package dev.galebench.rt.support;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.SensorView;
import dev.galebench.rt.BoardLink;
import dev.galebench.rt.LinkCounters;

/**
 * An in-test board on the loop's own thread: every {@link #send} runs a proportional voltage
 * controller on the measurement (duty = 0.5 + 0.0005 (500 V - x), clamped) and queues the
 * reply; {@link #poll} hands queued replies out in order. A {@link ReplyScript} can drop,
 * duplicate, delay or corrupt the reply to chosen sequences, so supervision is tested on the
 * same path as a real link. Allocation-free after construction; counts framesSent and
 * repliesAccepted (every reply handed out) like a transport does.
 */
public final class EchoBoardLink implements BoardLink {
    /** Script actions. */
    public static final int NORMAL = 0;
    public static final int DROP = 1;
    public static final int DUPLICATE = 2;
    public static final int NAN_DUTY = 3;
    public static final int DUTY_OUT_OF_RANGE = 4;
    public static final int PITCH_OUT_OF_RANGE = 5;
    public static final int FUTURE_SEQUENCE = 6;
    /** DELAY + n: hold the reply until n more frames were sent. */
    public static final int DELAY = 100;

    public static final double TARGET_V = 500.0;
    public static final double GAIN_PER_V = 0.0005;
    public static final double PITCH_REF_RAD = 0.05;

    /** What to do with the reply to a sequence. */
    @FunctionalInterface
    public interface ReplyScript {
        int action(long sequence);
    }

    private static final int QUEUE = 64;
    private final BoardCommand[] queue = new BoardCommand[QUEUE];
    private final long[] releaseAfter = new long[QUEUE];
    private int queued;
    private final LinkCounters counters = new LinkCounters();
    private final ReplyScript script;
    private long lastSent = -1;
    public boolean closed;

    public EchoBoardLink(ReplyScript script) {
        this.script = script;
        for (int i = 0; i < QUEUE; i++) {
            queue[i] = new BoardCommand();
        }
    }

    public EchoBoardLink() {
        this(null);
    }

    @Override
    public boolean send(long sequence, SensorView view) {
        counters.framesSent++;
        lastSent = sequence;
        final int action = script == null ? NORMAL : script.action(sequence);
        if (action == DROP) {
            return true;
        }
        final int copies = action == DUPLICATE ? 2 : 1;
        for (int c = 0; c < copies && queued < QUEUE; c++) {
            final BoardCommand r = queue[queued];
            control(view, r);
            r.answeredSequence = sequence;
            switch (action) {
                case NAN_DUTY -> r.gscDutyA = Double.NaN;
                case DUTY_OUT_OF_RANGE -> r.mscDutyB = 1.5;
                case PITCH_OUT_OF_RANGE -> r.pitchRefRad = 3.0;
                case FUTURE_SEQUENCE -> r.answeredSequence = sequence + 5;
                default -> { }
            }
            releaseAfter[queued] = action >= DELAY ? sequence + (action - DELAY) : sequence;
            queued++;
        }
        return true;
    }

    private static void control(SensorView v, BoardCommand out) {
        double d = 0.5 + GAIN_PER_V * (TARGET_V - v.dcLinkVoltageV);
        d = d < 0.0 ? 0.0 : (d > 1.0 ? 1.0 : d);
        out.gscDutyA = d;
        out.gscDutyB = 1.0 - d;
        out.gscDutyC = 0.5;
        out.mscDutyA = 0.5;
        out.mscDutyB = 0.5;
        out.mscDutyC = 0.5;
        out.chopperDuty = 0.0;
        out.pitchRefRad = PITCH_REF_RAD;
        out.commandFlags = BoardCommand.CMD_GSC_ENABLE | BoardCommand.CMD_MSC_ENABLE | BoardCommand.CMD_BREAKER_CLOSE;
        out.boardStatus = BoardCommand.BOARD_RUNNING | (v.dcLinkVoltageV < 250.0 ? BoardCommand.BOARD_FRT_ACTIVE : 0);
    }

    @Override
    public int poll(BoardCommand out) {
        for (int i = 0; i < queued; i++) {
            if (releaseAfter[i] <= lastSent) {
                final BoardCommand r = queue[i];
                out.copyFrom(r);
                final long rel = releaseAfter[i];
                // close the gap, keep the slot object for reuse at the end
                for (int j = i; j < queued - 1; j++) {
                    queue[j] = queue[j + 1];
                    releaseAfter[j] = releaseAfter[j + 1];
                }
                queued--;
                queue[queued] = r;
                releaseAfter[queued] = rel;
                counters.repliesAccepted++;
                return POLL_REPLY;
            }
        }
        return POLL_EMPTY;
    }

    @Override
    public LinkCounters counters() {
        return counters;
    }

    @Override
    public void close() {
        closed = true;
    }
}
