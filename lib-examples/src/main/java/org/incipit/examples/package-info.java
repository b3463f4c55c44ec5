/**
 * Short programs that show how to embed the Incipit library; the tests compile and run them.
 * {@link org.incipit.examples.EmbeddingExample} is the tour: simulate, observe, estimate, print.
 */
package org.incipit.examples;
