namespace FreqReadout.Link
{
    /// <summary>
    /// Consistent Overhead Byte Stuffing (COBS; S. Cheshire and M. Baker, "Consistent Overhead Byte Stuffing", IEEE/ACM
    /// Transactions on Networking 7(2), 1999), which the capture link uses so that a zero byte only ever ends a frame: the
    /// data is cut at its zero bytes into blocks of at most 254 non-zero bytes; each block is written as one code byte
    /// (its length + 1, 0xFF for a full block of 254 that no zero ends) followed by its bytes, and the zero that ended it is
    /// dropped. n bytes encode to at most n + 1 + n / 254 bytes; the empty input encodes to the single code byte 0x01.
    /// The frame delimiter (a zero byte after the encoded bytes) is the caller's. Both directions work in the caller's
    /// buffers, O(n), and allocate nothing.
    /// </summary>
    public static class ByteStuffing
    {
        /// <summary>Longest encoding of <paramref name="count"/> bytes: count + 1 + count / 254.</summary>
        /// <param name="count">Bytes to encode.</param>
        /// <returns>Bytes the destination must have room for.</returns>
        public static int MaxEncodedLength(int count)
        {
            return count + 1 + (count / 254);
        }

        /// <summary>Encodes bytes into a destination with room for <see cref="MaxEncodedLength"/> of them.</summary>
        /// <param name="source">The data.</param>
        /// <param name="offset">First byte of the data.</param>
        /// <param name="count">Bytes of data.</param>
        /// <param name="destination">Where the encoding goes (no zero byte is written).</param>
        /// <param name="destinationOffset">First byte written.</param>
        /// <returns>Bytes written.</returns>
        public static int Encode(byte[] source, int offset, int count, byte[] destination, int destinationOffset)
        {
            int codeAt = destinationOffset;
            int write = destinationOffset + 1;
            int code = 1;
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                byte b = source[i];
                if (b == 0)
                {
                    destination[codeAt] = (byte)code;
                    codeAt = write++;
                    code = 1;
                    continue;
                }

                destination[write++] = b;
                code++;
                if (code == 0xFF && i + 1 < end)
                {
                    destination[codeAt] = 0xFF;
                    codeAt = write++;
                    code = 1;
                }
            }

            destination[codeAt] = (byte)code;
            return write - destinationOffset;
        }

        /// <summary>
        /// Decodes one frame's encoded bytes (without its delimiter); false when they cannot be an encoding (a zero byte,
        /// or a code that runs past the end), and then what was written means nothing.
        /// </summary>
        /// <param name="source">The encoded bytes.</param>
        /// <param name="offset">First encoded byte.</param>
        /// <param name="count">Encoded bytes.</param>
        /// <param name="destination">Where the data goes; room for count - 1 bytes is enough.</param>
        /// <param name="destinationOffset">First byte written.</param>
        /// <param name="written">Bytes of data written.</param>
        /// <returns>True when the bytes were a valid encoding.</returns>
        public static bool TryDecode(byte[] source, int offset, int count, byte[] destination, int destinationOffset, out int written)
        {
            written = 0;
            int end = offset + count;
            int i = offset;
            int write = destinationOffset;
            if (count <= 0)
            {
                return false;
            }

            while (i < end)
            {
                int code = source[i++];
                if (code == 0 || i + code - 1 > end)
                {
                    return false;
                }

                for (int k = 1; k < code; k++)
                {
                    byte b = source[i++];
                    if (b == 0)
                    {
                        return false;
                    }

                    destination[write++] = b;
                }

                if (code != 0xFF && i < end)
                {
                    destination[write++] = 0;
                }
            }

            written = write - destinationOffset;
            return true;
        }
    }
}
