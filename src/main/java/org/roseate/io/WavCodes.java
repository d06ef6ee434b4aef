package org.roseate.io;

/**
 * Format tags and the KSDATAFORMAT sub-format GUID of WAV headers.
 *
 * <p>Sources: Microsoft/IBM Multimedia Programming Interface and Data Specifications 1.0 (1991)
 * for tags 1 (PCM); the Microsoft mmreg.h registry of WAVE format tags for the others (values from
 * memory); Microsoft's WAVEFORMATEXTENSIBLE documentation for tag 0xFFFE and the sub-format GUID
 * {tag-0000-0010-8000-00AA00389B71}.
 */
final class WavCodes {
    static final int TAG_PCM = 0x0001;
    static final int TAG_IEEE_FLOAT = 0x0003;
    static final int TAG_EXTENSIBLE = 0xFFFE;

    /** Bytes 4..15 of every KSDATAFORMAT sub-format GUID, as stored in the file. */
    private static final byte[] GUID_TAIL = {
        0x00, 0x00, 0x10, 0x00, (byte) 0x80, 0x00, 0x00, (byte) 0xAA, 0x00, 0x38, (byte) 0x9B, 0x71
    };

    private WavCodes() {
    }

    /** Writes the 16-byte sub-format GUID for a format tag (Data1 little-endian, then the tail). */
    static int putSubFormatGuid(byte[] b, int p, int tag) {
        b[p] = (byte) tag;
        b[p + 1] = (byte) (tag >>> 8);
        b[p + 2] = 0;
        b[p + 3] = 0;
        System.arraycopy(GUID_TAIL, 0, b, p + 4, GUID_TAIL.length);
        return p + 16;
    }

    /**
     * The format tag a sub-format GUID stands for, or −1 if the GUID is not of the KSDATAFORMAT
     * family (its upper bytes of Data1 or its tail differ).
     */
    static int subFormatTag(byte[] b, int p) {
        if (b[p + 2] != 0 || b[p + 3] != 0) {
            return -1;
        }
        for (int i = 0; i < GUID_TAIL.length; i++) {
            if (b[p + 4 + i] != GUID_TAIL[i]) {
                return -1;
            }
        }
        return (b[p] & 0xFF) | (b[p + 1] & 0xFF) << 8;
    }

    /** A reader-friendly name for a format tag, or "" if none is known. */
    static String tagName(int tag) {
        return switch (tag) {
            case 0x0000 -> "unknown";
            case 0x0001 -> "PCM";
            case 0x0002 -> "Microsoft ADPCM";
            case 0x0003 -> "IEEE float";
            case 0x0006 -> "A-law";
            case 0x0007 -> "μ-law";
            case 0x0011 -> "IMA ADPCM";
            case 0x0031 -> "GSM 6.10";
            case 0x0050 -> "MPEG";
            case 0x0055 -> "MPEG Layer 3";
            case 0x00FF -> "AAC";
            case 0xF1AC -> "FLAC";
            case 0xFFFE -> "extensible";
            default -> "";
        };
    }
}
