/**
 * Simulation studies of estimator performance: a {@link org.incipit.core.study.Scenario} (true
 * values and settings), a {@link org.incipit.core.study.DataGenerator}, named
 * {@link org.incipit.core.study.StudyEstimator}s, sample sizes, replicates, a master seed and a
 * level make a {@link org.incipit.core.study.Study}; each replicate is a pure
 * {@link org.incipit.core.study.ReplicateTask} with its own random stream, so results are
 * identical on any number of threads. {@link org.incipit.core.study.StudyResult#summaries()}
 * gives bias, RMSE, empirical SD and coverage with Monte Carlo errors
 * ({@link org.incipit.core.study.StudySummary}), {@link org.incipit.core.study.StudyTables}
 * writes them as CSV or Markdown, and {@link org.incipit.core.study.SampleSizePlanner} searches
 * for the sample size giving a target interval width. Scenario files
 * ({@link org.incipit.core.study.ScenarioSpec}) name generators and estimators of a
 * {@link org.incipit.core.study.StudyRegistry}.
 */
package org.incipit.core.study;
