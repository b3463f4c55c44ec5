/** Intervals, bootstrap, information criteria; results as records. */
package org.incipit.core.inference;
