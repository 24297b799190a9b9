namespace FreqReadout.Link
{
    /// <summary>
    /// The capture link's frame check: CRC-16/CCITT-FALSE (also catalogued as CRC-16/IBM-3740): polynomial 0x1021,
    /// initial value 0xFFFF, no reflection of input or output, no final XOR; the check value (the CRC of the ASCII bytes
    /// "123456789") is 0x29B1. Computed bit by bit (8 shifts per byte, no table, so no static array to keep): O(n), nothing
    /// allocates; the empty input gives the initial value 0xFFFF.
    /// </summary>
    public static class FrameCrc
    {
        /// <summary>Initial value of the register, and the CRC of no bytes.</summary>
        public const int InitialValue = 0xFFFF;

        private const int Polynomial = 0x1021;

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
                crc ^= data[i] << 8;
                for (int bit = 0; bit < 8; bit++)
                {
                    crc = (crc & 0x8000) != 0 ? (crc << 1) ^ Polynomial : crc << 1;
                }

                crc &= 0xFFFF;
            }

            return crc;
        }
    }
}
