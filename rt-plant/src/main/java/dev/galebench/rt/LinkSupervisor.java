package dev.galebench.rt;

import dev.galebench.plant.BoardCommand;
import dev.galebench.plant.PlantModel;
import dev.galebench.plant.SensorView;

/**
 * Link-agnostic supervision of the board's replies, run on the real-time thread. It decides
 * which reply becomes the command in force and counts every fault in the link's
 * {@link LinkCounters}. The rules, in the order they are applied to each reply:
 *
 * <ol>
 *   <li>answers a sequence never sent ({@code < 0} or {@code > lastSent}): rejected, counted as
 *       an invalid reference (the board cannot answer the future);</li>
 *   <li>answers the sequence already accepted: duplicate, dropped;</li>
 *   <li>answers an older sequence than the one accepted: stale, dropped;</li>
 *   <li>a duty outside [0, 1], a pitch reference outside the configured limits, or any of them
 *       NaN or infinite: invalid reference, dropped, last good command held;</li>
 *   <li>otherwise applied (the link already counted it in {@code repliesAccepted} when it passed
 *       the wire checks; the loop counts it in {@link #repliesApplied()}). If it answers an older frame than the last one sent (reply age
 *       &gt; 0) it is applied and counted late; its round trip is recorded either way.</li>
 * </ol>
 *
 * At each exchange ({@link #applyAtExchange}): if the last frame sent got no accepted reply, a
 * missing reply is counted; the newest accepted reply becomes the command in force; if no reply
 * was accepted for the watchdog time (counted in exchanges on the schedule, so offline runs
 * behave the same), the plant is tripped once with {@code TRIP_LINK_WATCHDOG}, the watchdog
 * firing is counted, and the converters stay blocked (breaker as last commanded) until valid
 * replies return. The plant's latched trip stays until the board resets it.
 *
 * <p>Allocation-free after construction; single-threaded (the real-time thread).
 */
final class LinkSupervisor {
    private static final int SEND_TIME_SLOTS = 1024;
    private static final int SEND_TIME_MASK = SEND_TIME_SLOTS - 1;

    private final LinkCounters counters;
    private final TimingChannel rtt;
    private final double pitchMinRad;
    private final double pitchMaxRad;
    private final long watchdogExchanges;

    private final BoardCommand pending = new BoardCommand();
    private final BoardCommand inForce = new BoardCommand();
    private final long[] sendTimeNs = new long[SEND_TIME_SLOTS];
    private boolean pendingValid;
    private long lastSentSeq = -1;
    private long lastAcceptedSeq = -1;
    private boolean lastSentAnswered;
    private long lastValidExchange;
    private long currentExchange;
    private boolean watchdogActive;
    private long rttSinceLastExchangeNs = -1;
    private long replyAge;
    private long applied;

    LinkSupervisor(LinkCounters counters, TimingChannel rtt, double pitchMinRad, double pitchMaxRad, long watchdogExchanges) {
        this.counters = counters;
        this.rtt = rtt;
        this.pitchMinRad = pitchMinRad;
        this.pitchMaxRad = pitchMaxRad;
        this.watchdogExchanges = watchdogExchanges;
    }

    /** Before the first frame: converters blocked, breaker and pitch as the plant has them now. */
    void init(SensorView first) {
        inForce.block((first.statusFlags & SensorView.STATUS_BREAKER_CLOSED) != 0);
        inForce.pitchRefRad = first.pitchAngleRad;
        inForce.boardStatus = 0;
        inForce.answeredSequence = -1;
    }

    /** The command the plant steps with (owned here; read, never write). */
    BoardCommand command() {
        return inForce;
    }

    /** Records that frame {@code sequence} is about to be sent at {@code nowNs} (round trips count from here). */
    void onSent(long sequence, long nowNs) {
        lastSentSeq = sequence;
        sendTimeNs[(int) (sequence & SEND_TIME_MASK)] = nowNs;
        lastSentAnswered = false;
    }

    /** Classifies one decoded reply received at {@code nowNs}; see the class rules. */
    void onReply(BoardCommand reply, long nowNs) {
        final long answered = reply.answeredSequence;
        final LinkCounters c = counters;
        if (answered < 0 || answered > lastSentSeq) {
            c.invalidReferences++;
            return;
        }
        if (answered == lastAcceptedSeq) {
            c.duplicateReplies++;
            return;
        }
        if (answered < lastAcceptedSeq) {
            c.staleReplies++;
            return;
        }
        if (!referencesValid(reply)) {
            c.invalidReferences++;
            return;
        }
        pending.copyFrom(reply);
        pendingValid = true;
        lastAcceptedSeq = answered;
        lastValidExchange = currentExchange;
        applied++;
        if (answered == lastSentSeq) {
            lastSentAnswered = true;
        } else {
            c.lateReplies++;
        }
        if (lastSentSeq - answered < SEND_TIME_SLOTS) {
            final long roundTripNs = nowNs - sendTimeNs[(int) (answered & SEND_TIME_MASK)];
            rtt.record(roundTripNs);
            rttSinceLastExchangeNs = roundTripNs;
        }
    }

    private boolean referencesValid(BoardCommand r) {
        // written so that NaN fails every comparison and is rejected
        return unit(r.mscDutyA) && unit(r.mscDutyB) && unit(r.mscDutyC)
                && unit(r.gscDutyA) && unit(r.gscDutyB) && unit(r.gscDutyC)
                && unit(r.chopperDuty)
                && r.pitchRefRad >= pitchMinRad && r.pitchRefRad <= pitchMaxRad;
    }

    private static boolean unit(double d) {
        return d >= 0.0 && d <= 1.0;
    }

    /** Marks the start of exchange {@code exchange} (replies polled from now on belong to it). */
    void beginExchange(long exchange) {
        currentExchange = exchange;
    }

    /** Applies the rules due at the exchange's deadline (after its replies were drained). */
    void applyAtExchange(PlantModel plant) {
        if (lastSentSeq >= 0 && !lastSentAnswered) {
            counters.missingReplies++;
        }
        if (pendingValid) {
            inForce.copyFrom(pending);
            pendingValid = false;
        }
        if (currentExchange - lastValidExchange >= watchdogExchanges) {
            if (!watchdogActive) {
                watchdogActive = true;
                counters.watchdogTrips++;
                plant.forceTrip(SensorView.TRIP_LINK_WATCHDOG);
            }
            inForce.block((inForce.commandFlags & BoardCommand.CMD_BREAKER_CLOSE) != 0);
        } else {
            watchdogActive = false;
        }
        replyAge = lastSentSeq < 0 ? 0 : lastSentSeq - inForce.answeredSequence;
    }

    /** Round trip of the newest reply accepted since the previous call, ns, or -1; resets it. */
    long takeRoundTripNs() {
        final long r = rttSinceLastExchangeNs;
        rttSinceLastExchangeNs = -1;
        return r;
    }

    /** Age of the command in force at the last {@link #applyAtExchange}, in exchanges. */
    long replyAge() {
        return replyAge;
    }

    /** Replies that passed supervision and became (or will become) the command in force. */
    long repliesApplied() {
        return applied;
    }

    /** True while the watchdog holds the converters blocked. */
    boolean watchdogActive() {
        return watchdogActive;
    }

    /** True while we wait for the reply to the last frame sent (worth polling during the spin). */
    boolean awaitingReply() {
        return lastSentSeq >= 0 && !lastSentAnswered;
    }
}
