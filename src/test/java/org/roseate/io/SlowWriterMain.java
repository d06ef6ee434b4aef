package org.roseate.io;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.file.Path;

/**
 * Child process for {@link AtomicOutputTest}: starts an {@link AtomicOutput} on args[0], writes
 * and flushes 64 KiB, prints "WRITING &lt;temp file&gt;" and then keeps writing slowly for about a
 * minute before committing, so the parent can kill it in the middle.
 */
public final class SlowWriterMain {
    private SlowWriterMain() {
    }

    public static void main(String[] args) throws IOException, InterruptedException {
        byte[] block = new byte[1 << 16];
        java.util.Arrays.fill(block, (byte) 'n');
        try (AtomicOutput o = AtomicOutput.open(Path.of(args[0]), true)) {
            OutputStream s = o.stream();
            s.write(block);
            s.flush();
            System.out.println("WRITING " + o.tempFile());
            System.out.flush();
            for (int i = 0; i < 600; i++) {
                Thread.sleep(100);
                s.write(block, 0, 1024);
                s.flush();
            }
            o.commit();
        }
    }
}
