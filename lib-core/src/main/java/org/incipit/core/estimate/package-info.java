/**
 * Estimators, one package or class per observation scheme; each takes observations, a family
 * and options and returns a result record with estimates and intervals.
 */
package org.incipit.core.estimate;
