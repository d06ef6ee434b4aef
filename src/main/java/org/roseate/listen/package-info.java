/**
 * Blind listening: the ABX test's plan, bookkeeping, statistics and log, in plain Java.
 *
 * <p>{@link org.roseate.listen.AbxSession} draws the hidden X of every trial from a seeded
 * generator, counts the listener's switches and records the answers; the number of trials is fixed
 * before the first and the session cannot end early with a result. {@link org.roseate.listen.Binomial}
 * gives the one-sided exact binomial p-value and the smallest significant count;
 * {@link org.roseate.listen.AbxLog} writes and reads the JSON trial log. The sound and the terminal
 * are adapters (cli.ListenTestCommand); nothing here imports audio, JavaFX or picocli.
 */
package org.roseate.listen;
