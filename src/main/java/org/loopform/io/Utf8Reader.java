package org.loopform.io;

import java.io.IOException;
import java.io.InputStream;
import java.io.Reader;
import java.nio.ByteBuffer;
import java.nio.CharBuffer;
import java.nio.charset.CharsetDecoder;
import java.nio.charset.CoderResult;
import java.nio.charset.CodingErrorAction;
import java.nio.charset.StandardCharsets;

/**
 * Decodes a byte stream as strict UTF-8, reading it once, and knows where it is: the bytes read
 * so far (for progress on pipes, whose size is unknown) and the line of the first byte that is not
 * UTF-8, which it reports as a {@link NotUtf8Exception} instead of replacing or skipping it.
 * A line is counted at every {@code \n} byte, which never occurs inside a multi-byte sequence.
 */
final class Utf8Reader extends Reader {

    private static final int BUFFER_BYTES = 1 << 16;

    private final InputStream in;
    private final String shownName;
    private final CharsetDecoder decoder = StandardCharsets.UTF_8.newDecoder()
            .onMalformedInput(CodingErrorAction.REPORT).onUnmappableCharacter(CodingErrorAction.REPORT);
    /** Undecoded bytes, in read mode (position..limit). */
    private final ByteBuffer bytes = ByteBuffer.allocate(BUFFER_BYTES).flip();
    private long bytesRead;
    private long bytesDecoded;
    private int line = 1;
    private boolean endOfInput;
    private boolean flushed;

    Utf8Reader(InputStream in, String shownName) {
        this.in = in;
        this.shownName = shownName;
    }

    /** Bytes taken from the stream so far. */
    long bytesRead() {
        return bytesRead;
    }

    @Override
    public int read(char[] buffer, int offset, int length) throws IOException {
        if (length == 0) {
            return 0;
        }
        if (flushed) {
            return -1;
        }
        CharBuffer out = CharBuffer.wrap(buffer, offset, length);
        while (out.position() == offset) {
            int before = bytes.position();
            CoderResult result = decoder.decode(bytes, out, endOfInput);
            count(before, bytes.position());
            if (result.isError()) {
                throw new NotUtf8Exception(shownName, line, bytes.get(bytes.position()) & 0xff, bytesDecoded);
            }
            if (result.isOverflow()) {
                break;
            }
            if (endOfInput) {
                decoder.flush(out);
                flushed = true;
                break;
            }
            fill();
        }
        int n = out.position() - offset;
        return n == 0 && endOfInput ? -1 : n;
    }

    private void fill() throws IOException {
        bytes.compact();
        int n = in.read(bytes.array(), bytes.position(), bytes.remaining());
        if (n == -1) { // an InputStream gives -1 at the end, never another negative
            endOfInput = true;
        } else {
            bytes.position(bytes.position() + n);
            bytesRead += n;
        }
        bytes.flip();
    }

    private void count(int from, int to) {
        byte[] a = bytes.array();
        for (int k = from; k < to; k++) {
            if (a[k] == '\n') {
                line++;
            }
        }
        bytesDecoded += to - from;
    }

    @Override
    public void close() throws IOException {
        in.close();
    }
}
