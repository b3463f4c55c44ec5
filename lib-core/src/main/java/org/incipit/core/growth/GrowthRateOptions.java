package org.incipit.core.growth;

/**
 * Options for {@link GrowthRateEstimator}.
 *
 * @param model     count distribution, not null
 * @param dayOfWeek if true, add a day-of-week factor (residue of the day number modulo 7,
 *                  treatment contrasts with the smallest residue present as reference)
 * @param level     interval coverage in (0, 1)
 */
public record GrowthRateOptions(CountModel model, boolean dayOfWeek, double level) {

    public GrowthRateOptions {
        if (model == null) {
            throw new IllegalArgumentException("model must not be null");
        }
        if (!(level > 0 && level < 1)) {
            throw new IllegalArgumentException("level must be in (0, 1), was " + level);
        }
    }

    /** @return Poisson, no day-of-week effect, 95% intervals. */
    public static GrowthRateOptions defaults() {
        return new GrowthRateOptions(CountModel.POISSON, false, 0.95);
    }

    /** @return a copy with another model. */
    public GrowthRateOptions withModel(CountModel m) {
        return new GrowthRateOptions(m, dayOfWeek, level);
    }

    /** @return a copy with the day-of-week factor switched on or off. */
    public GrowthRateOptions withDayOfWeek(boolean on) {
        return new GrowthRateOptions(model, on, level);
    }

    /** @return a copy with another level. */
    public GrowthRateOptions withLevel(double l) {
        return new GrowthRateOptions(model, dayOfWeek, l);
    }
}
