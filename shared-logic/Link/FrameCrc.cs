namespace FreqReadout.Link
{
    /// <summary>
    /// The capture link's frame check: CRC-32 as catalogued CRC-32/ISO-HDLC (the CRC of Ethernet, zip and PNG):
    /// reflected polynomial 0xEDB88320 (0x04C11DB7 unreflected), initial register 0xFFFFFFFF, input and output
    /// reflected, final XOR 0xFFFFFFFF; the check value (the CRC of the ASCII bytes "123456789") is 0xCBF43926. Computed
    /// bit by bit without a table (no static array to keep): per byte, register ^= byte, then eight times
    /// register = (register &gt;&gt; 1) ^ (0xEDB88320 when the bit shifted out was 1). O(n), nothing allocates; the empty
    /// input gives 0. A damaged frame passes it with odds of about 1 in 2^32 (a 16-bit check would pass 1 in 65536,
    /// which a long recording over a noisy line meets).
    /// </summary>
    public static class FrameCrc
    {
        /// <summary>The reflected generator polynomial.</summary>
        public const uint ReflectedPolynomial = 0xEDB88320;

        /// <summary>The CRC of <paramref name="count"/> bytes of <paramref name="data"/> from <paramref name="offset"/>.</summary>
        /// <param name="data">The bytes.</param>
        /// <param name="offset">First byte.</param>
        /// <param name="count">Bytes to include.</param>
        /// <returns>The 32-bit CRC.</returns>
        public static uint Compute(byte[] data, int offset, int count)
        {
            return Continue(0, data, offset, count);
        }

        /// <summary>Continues a CRC over more bytes (for data checked in pieces): start from 0, the CRC of no bytes.</summary>
        /// <param name="crc">The CRC of the bytes so far.</param>
        /// <param name="data">The bytes.</param>
        /// <param name="offset">First byte.</param>
        /// <param name="count">Bytes to include.</param>
        /// <returns>The 32-bit CRC of all the bytes.</returns>
        public static uint Continue(uint crc, byte[] data, int offset, int count)
        {
            uint register = ~crc;
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                register ^= data[i];
                for (int bit = 0; bit < 8; bit++)
                {
                    register = (register & 1) != 0 ? (register >> 1) ^ ReflectedPolynomial : register >> 1;
                }
            }

            return ~register;
        }
    }
}
