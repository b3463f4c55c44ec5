package org.incipit.core.simulate;

/** Why a simulated outbreak ended. */
public enum StopReason {
    /** The {@link OutbreakOptions#maxCases()}-th infection occurred. */
    CASE_LIMIT,
    /** The {@link OutbreakOptions#maxOnsets()}-th symptom onset occurred. */
    ONSET_LIMIT,
    /** The calendar day {@link OutbreakOptions#stopDay()} was reached with infections still pending. */
    DAY_LIMIT,
    /** No infections were pending: the outbreak died out before a stop rule was met. */
    EXTINCT
}
