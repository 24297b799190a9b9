namespace FreqReadout.Link
{
    /// <summary>
    /// The capture link's frame check: CRC-16/CCITT-FALSE (also catalogued as CRC-16/IBM-3740): polynomial 0x1021,
    /// initial value 0xFFFF, no reflection of input or output, no final XOR; the check value (the CRC of the ASCII bytes
    /// "123456789") is 0x29B1. Computed a byte at a time without a table (so no static array to keep): with
    /// x = (crc >> 8) ^ b, then x ^= x >> 4, the register becomes (crc << 8) ^ (x << 12) ^ (x << 5) ^ x (mod 2^16), which
    /// is the eight shifts of the bitwise form folded for this polynomial (a common embedded formulation, from memory;
    /// tests check it against the bitwise form and the check value). O(n), about a quarter of the bitwise form's
    /// operations; nothing allocates; the empty input gives the initial value 0xFFFF.
    /// </summary>
    public static class FrameCrc
    {
        /// <summary>Initial value of the register, and the CRC of no bytes.</summary>
        public const int InitialValue = 0xFFFF;

        /// <summary>The generator polynomial, x^16 + x^12 + x^5 + 1 without its top term.</summary>
        public const int Polynomial = 0x1021;

        /// <summary>The CRC of <paramref name="count"/> bytes of <paramref name="data"/> from <paramref name="offset"/>.</summary>
        /// <param name="data">The bytes.</param>
        /// <param name="offset">First byte.</param>
        /// <param name="count">Bytes to include.</param>
        /// <returns>The 16-bit CRC, 0-65535.</returns>
        public static int Compute(byte[] data, int offset, int count)
        {
            return Continue(InitialValue, data, offset, count);
        }

        /// <summary>Continues a CRC over more bytes (for a frame checked in pieces); start from <see cref="InitialValue"/>.</summary>
        /// <param name="crc">The CRC so far.</param>
        /// <param name="data">The bytes.</param>
        /// <param name="offset">First byte.</param>
        /// <param name="count">Bytes to include.</param>
        /// <returns>The 16-bit CRC, 0-65535.</returns>
        public static int Continue(int crc, byte[] data, int offset, int count)
        {
            int end = offset + count;
            for (int i = offset; i < end; i++)
            {
                int x = ((crc >> 8) ^ data[i]) & 0xFF;
                x ^= x >> 4;
                crc = ((crc << 8) ^ (x << 12) ^ (x << 5) ^ x) & 0xFFFF;
            }

            return crc;
        }
    }
}
