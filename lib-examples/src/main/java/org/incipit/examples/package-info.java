/**
 * Short programs that show how to embed and extend the Incipit library; the tests compile and
 * run them. {@link org.incipit.examples.EmbeddingExample} is the tour: simulate, observe,
 * estimate, print. The extension examples (docs/extending.md) add a delay family from outside
 * the distribution module ({@link org.incipit.examples.LogLogisticDelay}) and a new observation
 * scheme with its own likelihood ({@link org.incipit.examples.CustomLikelihoodExample}); their
 * tests fit both with the library's engine.
 */
package org.incipit.examples;
