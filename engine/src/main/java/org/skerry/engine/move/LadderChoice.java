package org.skerry.engine.move;

/**
 * The random-walk scale a pilot step on a ladder of scales chose, and the acceptance rate expected
 * at it (the target when the ladder brackets it, else the nearest rung's rate), from which the
 * iteration's number of steps follows. See {@link MoveAdaptation#scaleFromLadder}.
 *
 * @param scale              the chosen scale λ
 * @param expectedAcceptance the acceptance rate expected at {@code scale}
 */
public record LadderChoice(double scale, double expectedAcceptance) {
}
