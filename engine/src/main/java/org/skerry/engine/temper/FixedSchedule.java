package org.skerry.engine.temper;

import java.util.Arrays;
import org.skerry.engine.population.TemperingInputs;

/**
 * A temperature schedule fixed in advance: strictly increasing values in (0, 1], ending at 1.
 * With a fixed schedule the evidence estimate is exactly unbiased (Del Moral, Doucet &amp; Jasra
 * 2006); with an adaptive one only asymptotically.
 */
public final class FixedSchedule implements TemperatureRule {

    private final double[] temperatures;

    /**
     * @throws IllegalArgumentException naming the offending position if the schedule is empty, not
     *     strictly increasing, leaves (0, 1] or does not end at 1
     */
    public FixedSchedule(double... temperatures) {
        if (temperatures.length == 0) {
            throw new IllegalArgumentException("temperature schedule must not be empty");
        }
        for (int i = 0; i < temperatures.length; i++) {
            double t = temperatures[i];
            if (!(t > 0 && t <= 1)) {
                throw new IllegalArgumentException("temperature schedule entry " + i + " must be in (0, 1], was " + t);
            }
            if (i > 0 && !(t > temperatures[i - 1])) {
                throw new IllegalArgumentException("temperature schedule must be strictly increasing: entry " + i
                        + " (" + t + ") follows " + temperatures[i - 1]);
            }
        }
        if (temperatures[temperatures.length - 1] != 1.0) {
            throw new IllegalArgumentException("temperature schedule must end at 1, ended at "
                    + temperatures[temperatures.length - 1]);
        }
        this.temperatures = temperatures.clone();
    }

    /** {@code count} temperatures {@code (k/count)^power}, k = 1..count: a common geometric-like ramp. */
    public static FixedSchedule power(int count, double power) {
        if (count < 1) {
            throw new IllegalArgumentException("count must be >= 1, was " + count);
        }
        if (!(power > 0)) {
            throw new IllegalArgumentException("power must be > 0, was " + power);
        }
        double[] values = new double[count];
        for (int k = 1; k <= count; k++) {
            values[k - 1] = k == count ? 1.0 : StrictMath.pow((double) k / count, power);
        }
        return new FixedSchedule(values);
    }

    public double[] temperatures() {
        return temperatures.clone();
    }

    @Override
    public double next(double current, TemperingInputs inputs, double logTotal) {
        for (double t : temperatures) {
            if (t > current) {
                return t;
            }
        }
        return 1.0;
    }

    @Override
    public String toString() {
        return "fixed" + Arrays.toString(temperatures);
    }
}
