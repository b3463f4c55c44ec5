package org.incipit.distributions;

import java.util.Arrays;

/**
 * Daily probability masses P(D = d), d = 0 .. n &minus; 1, and the mass beyond the last day.
 *
 * @param masses masses for days 0 .. n &minus; 1 (copied in, copied out)
 * @param tail   P(D &ge; n)
 */
public record DailyMasses(double[] masses, double tail) {

    public DailyMasses {
        if (masses == null || masses.length == 0) {
            throw new IllegalArgumentException("masses must have at least one day");
        }
        masses = masses.clone();
        for (int d = 0; d < masses.length; d++) {
            if (!(masses[d] >= 0 && masses[d] <= 1)) {
                throw new IllegalArgumentException("masses[" + d + "] must be in [0, 1], was " + masses[d]);
            }
        }
        if (!(tail >= 0 && tail <= 1)) {
            throw new IllegalArgumentException("tail must be in [0, 1], was " + tail);
        }
    }

    /** @return a copy of the masses. */
    @Override
    public double[] masses() {
        return masses.clone();
    }

    /** @return mass of day d, 0 beyond the last day kept. */
    public double mass(int d) {
        return d >= 0 && d < masses.length ? masses[d] : 0.0;
    }

    /** @return number of days kept. */
    public int days() {
        return masses.length;
    }

    @Override
    public boolean equals(Object o) {
        return o instanceof DailyMasses other && Arrays.equals(masses, other.masses)
                && Double.compare(tail, other.tail) == 0;
    }

    @Override
    public int hashCode() {
        return 31 * Arrays.hashCode(masses) + Double.hashCode(tail);
    }

    @Override
    public String toString() {
        return "DailyMasses" + Arrays.toString(masses) + " tail=" + tail;
    }
}
