/**
 * File input and output with no half-written results: streaming WAV reading and writing in all
 * common encodings, CSV tables, and atomic replacement of any output file.
 *
 * <p>Sample convention: samples are doubles at full scale 1.0, interleaved by frame (channel 0 of
 * frame 0, channel 1 of frame 0, ...). An n-bit PCM code c maps to c / 2<sup>n−1</sup>, so
 * decoded PCM lies in [−1, 1); float files carry their values unchanged.
 *
 * <p>Depends on nothing else in Roseate and on no audio library.
 */
package org.roseate.io;
