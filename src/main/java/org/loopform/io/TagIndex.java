package org.loopform.io;

/**
 * The tags seen so far in a loop list and the line of each, for finding repeated tags in a list of
 * millions of rows without keeping the tags themselves: an open-addressing table of 64-bit string
 * hashes (FNV-1a, then the MurmurHash3 finaliser) and lines, 12 bytes a slot at a load of at most
 * 3/4. Two different tags share a 64-bit hash with odds of about n^2 / 2^65 (under 1e-5 for ten
 * million tags); were it to happen, the later row would be reported as a repeated tag, a visible
 * bad row, never a loop checked with another's values.
 */
final class TagIndex {

    private static final long EMPTY = 0L;

    private long[] hashes = new long[1 << 10];
    private int[] lines = new int[1 << 10];
    private int size;

    /** Records {@code tag} at {@code line}; returns the line it was first seen at, or -1 when it is new. */
    int putIfAbsent(String tag, int line) {
        long h = hash(tag);
        int mask = hashes.length - 1;
        for (int k = (int) h & mask; ; k = (k + 1) & mask) {
            if (hashes[k] == EMPTY) {
                hashes[k] = h;
                lines[k] = line;
                if (++size * 4L > hashes.length * 3L) {
                    grow();
                }
                return -1;
            }
            if (hashes[k] == h) {
                return lines[k];
            }
        }
    }

    private void grow() {
        long[] oldHashes = hashes;
        int[] oldLines = lines;
        hashes = new long[oldHashes.length * 2];
        lines = new int[oldHashes.length * 2];
        int mask = hashes.length - 1;
        for (int j = 0; j < oldHashes.length; j++) {
            long h = oldHashes[j];
            if (h != EMPTY) {
                int k = (int) h & mask;
                while (hashes[k] != EMPTY) {
                    k = (k + 1) & mask;
                }
                hashes[k] = h;
                lines[k] = oldLines[j];
            }
        }
    }

    /** FNV-1a over the tag's UTF-16 units, finished with MurmurHash3's fmix64; never 0 (0 marks an empty slot). */
    static long hash(String tag) {
        long h = 0xcbf29ce484222325L;
        for (int k = 0; k < tag.length(); k++) {
            h ^= tag.charAt(k);
            h *= 0x100000001b3L;
        }
        h ^= h >>> 33;
        h *= 0xff51afd7ed558ccdL;
        h ^= h >>> 33;
        h *= 0xc4ceb9fe1a85ec53L;
        h ^= h >>> 33;
        return h == EMPTY ? 1 : h;
    }
}
