package org.roseate.io;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;

import java.io.IOException;
import java.io.InputStream;
import java.net.URISyntaxException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.List;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.ValueSource;

/**
 * Committed reference files made by src/test/python/gen_wav_reference.py (Python 3.11 wave
 * module, scipy.io.wavfile 1.17.1, and hand-built WAVEFORMATEXTENSIBLE / LIST layouts); expected
 * samples are scipy.io.wavfile.read's decoding of each file, normalised as the script's docstring
 * says. Exact equality: both sides divide an integer code by a power of two.
 */
class WavReaderReferenceTest {
    @ParameterizedTest
    @ValueSource(strings = {
        "wave_pcm8_mono",        // 8-bit unsigned, odd data size, no pad byte (wave module)
        "wave_pcm24_stereo",     // 24-bit plain PCM (wave module)
        "scipy_float64_mono",    // tag 3, cbSize, fact chunk (scipy)
        "scipy_float32_stereo",  // tag 3 float 32 (scipy)
        "ext_pcm24_6ch",         // WAVE_FORMAT_EXTENSIBLE, PCM sub-format, mask 0x3F
        "ext_float32_3ch",       // WAVE_FORMAT_EXTENSIBLE, IEEE float sub-format, 192 kHz
        "scipy_pcm16_odd_list"   // odd-sized LIST chunk + pad before data, unknown chunk after
    })
    void readsReferenceFilesExactly(String name) throws IOException, URISyntaxException {
        Path wav = Path.of(WavReaderReferenceTest.class.getResource("/io/" + name + ".wav").toURI());
        List<String> lines;
        try (InputStream in = WavReaderReferenceTest.class.getResourceAsStream(
                "/io/" + name + ".expected.txt")) {
            assertNotNull(in, name);
            lines = new String(in.readAllBytes(), StandardCharsets.UTF_8).lines().toList();
        }
        String[] head = lines.get(0).split(" ");
        int channels = Integer.parseInt(head[1]);
        int frames = Integer.parseInt(head[3]);
        try (WavReader r = WavReader.open(wav)) {
            assertEquals(new WavFormat(Integer.parseInt(head[0]), channels,
                    SampleEncoding.parse(head[2])), r.format());
            assertEquals(frames, r.frames());
            double[] got = new double[frames * channels];
            assertEquals(frames, r.readFrames(got, frames));
            for (int i = 0; i < frames; i++) {
                String[] row = lines.get(1 + i).split(" ");
                for (int c = 0; c < channels; c++) {
                    assertEquals(Double.parseDouble(row[c]), got[i * channels + c], 0.0,
                            name + " frame " + i + " channel " + c);
                }
            }
        }
    }
}
