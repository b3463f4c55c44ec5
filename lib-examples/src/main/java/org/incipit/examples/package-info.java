/**
 * Compiled extension examples (docs/extending.md): a delay family added from outside the
 * distribution module ({@link org.incipit.examples.LogLogisticDelay}) and a new observation
 * scheme with its own likelihood ({@link org.incipit.examples.CustomLikelihoodExample}). Their
 * tests fit both with the library's engine.
 */
package org.incipit.examples;
