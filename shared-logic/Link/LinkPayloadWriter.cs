namespace FreqReadout.Link
{
    /// <summary>
    /// Builds one frame's payload in a buffer made once (<see cref="LinkFrameEncoder.MaxPayloadBytes"/> bytes): integers
    /// little-endian, doubles as their IEEE 754 binary64 bits little-endian, unsigned variable-length integers as LEB128
    /// (7 bits a byte, low group first, the high bit set on every byte but the last). A write that does not fit is dropped
    /// and sets <see cref="Overflowed"/>; nothing allocates.
    /// </summary>
    public sealed class LinkPayloadWriter
    {
        private readonly byte[] buffer = new byte[LinkFrameEncoder.MaxPayloadBytes];
        private int length;
        private bool overflowed;

        /// <summary>The payload bytes (the first <see cref="Length"/>).</summary>
        public byte[] Buffer
        {
            get { return buffer; }
        }

        /// <summary>Bytes written so far.</summary>
        public int Length
        {
            get { return length; }
        }

        /// <summary>Room left, bytes.</summary>
        public int Remaining
        {
            get { return buffer.Length - length; }
        }

        /// <summary>True when a write did not fit since the last <see cref="Reset"/> (the payload is then incomplete).</summary>
        public bool Overflowed
        {
            get { return overflowed; }
        }

        /// <summary>Starts an empty payload.</summary>
        public void Reset()
        {
            length = 0;
            overflowed = false;
        }

        /// <summary>Writes one byte.</summary>
        public void WriteByte(int value)
        {
            if (length >= buffer.Length)
            {
                overflowed = true;
                return;
            }

            buffer[length++] = (byte)value;
        }

        /// <summary>Writes the low 16 bits, little-endian.</summary>
        public void WriteUInt16(int value)
        {
            WriteFixed((ulong)value, 2);
        }

        /// <summary>Writes 32 bits, little-endian.</summary>
        public void WriteUInt32(uint value)
        {
            WriteFixed(value, 4);
        }

        /// <summary>Writes 64 bits, little-endian (two's complement for a negative value).</summary>
        public void WriteInt64(long value)
        {
            WriteFixed((ulong)value, 8);
        }

        /// <summary>Writes a double's IEEE 754 binary64 bits, little-endian (NaN marks "no value" where a layout says so).</summary>
        public void WriteDouble(double value)
        {
            WriteFixed((ulong)System.BitConverter.DoubleToInt64Bits(value), 8);
        }

        /// <summary>Writes an unsigned LEB128 integer: 1 byte below 128, at most 10 bytes.</summary>
        public void WriteVarUInt(ulong value)
        {
            if (length + VarUIntBytes(value) > buffer.Length)
            {
                overflowed = true;
                return;
            }

            while (value >= 0x80)
            {
                buffer[length++] = (byte)((value & 0x7F) | 0x80);
                value >>= 7;
            }

            buffer[length++] = (byte)value;
        }

        /// <summary>Writes ASCII text (characters above 126 or below 32, except tab, CR and LF, become '?').</summary>
        public void WriteAscii(string text)
        {
            if (length + text.Length > buffer.Length)
            {
                overflowed = true;
                return;
            }

            for (int i = 0; i < text.Length; i++)
            {
                int c = text[i];
                buffer[length++] = (byte)((c >= 32 && c <= 126) || c == '\t' || c == '\r' || c == '\n' ? c : '?');
            }
        }

        /// <summary>Bytes an unsigned LEB128 encoding of <paramref name="value"/> takes, 1 to 10.</summary>
        public static int VarUIntBytes(ulong value)
        {
            int n = 1;
            while (value >= 0x80)
            {
                value >>= 7;
                n++;
            }

            return n;
        }

        private void WriteFixed(ulong value, int bytes)
        {
            if (length + bytes > buffer.Length)
            {
                overflowed = true;
                return;
            }

            for (int i = 0; i < bytes; i++)
            {
                buffer[length++] = (byte)(value & 0xFF);
                value >>= 8;
            }
        }
    }
}
