namespace FreqReadout.Link
{
    /// <summary>
    /// Reads a payload written by <see cref="LinkPayloadWriter"/> (same encodings). Every read is <c>TryRead...</c>: false,
    /// and the position unchanged, when the payload ends first (or a LEB128 integer runs past 10 bytes), so a short or
    /// damaged payload is refused, never misread. Point it at a payload with <see cref="Reset"/>; nothing allocates
    /// except <see cref="TryReadAscii"/>.
    /// </summary>
    public sealed class LinkPayloadReader
    {
        private byte[] buffer;
        private int end;
        private int position;

        /// <summary>Bytes not read yet.</summary>
        public int Remaining
        {
            get { return end - position; }
        }

        /// <summary>Reads from <paramref name="payload"/>'s first <paramref name="length"/> bytes.</summary>
        public void Reset(byte[] payload, int length)
        {
            buffer = payload;
            end = length;
            position = 0;
        }

        /// <summary>Reads one byte.</summary>
        public bool TryReadByte(out int value)
        {
            value = 0;
            if (position >= end)
            {
                return false;
            }

            value = buffer[position++];
            return true;
        }

        /// <summary>Reads 16 bits, little-endian.</summary>
        public bool TryReadUInt16(out int value)
        {
            ulong v;
            bool ok = TryReadFixed(2, out v);
            value = (int)v;
            return ok;
        }

        /// <summary>Reads 32 bits, little-endian.</summary>
        public bool TryReadUInt32(out uint value)
        {
            ulong v;
            bool ok = TryReadFixed(4, out v);
            value = (uint)v;
            return ok;
        }

        /// <summary>Reads 64 bits, little-endian.</summary>
        public bool TryReadInt64(out long value)
        {
            ulong v;
            bool ok = TryReadFixed(8, out v);
            value = (long)v;
            return ok;
        }

        /// <summary>Reads a double from its IEEE 754 binary64 bits.</summary>
        public bool TryReadDouble(out double value)
        {
            ulong v;
            bool ok = TryReadFixed(8, out v);
            value = System.BitConverter.Int64BitsToDouble((long)v);
            return ok;
        }

        /// <summary>Reads an unsigned LEB128 integer of at most 10 bytes (bits beyond 64 refuse it).</summary>
        public bool TryReadVarUInt(out ulong value)
        {
            value = 0;
            int p = position;
            int shift = 0;
            while (p < end && shift < 70)
            {
                int b = buffer[p++];
                ulong bits = (ulong)(b & 0x7F);
                if (shift == 63 && bits > 1)
                {
                    return false;
                }

                value |= bits << shift;
                if ((b & 0x80) == 0)
                {
                    position = p;
                    return true;
                }

                shift += 7;
            }

            value = 0;
            return false;
        }

        /// <summary>Reads the rest of the payload as ASCII text (bytes above 126 become '?').</summary>
        public bool TryReadAscii(out string text)
        {
            char[] chars = new char[end - position];
            for (int i = 0; i < chars.Length; i++)
            {
                int c = buffer[position + i];
                chars[i] = c <= 126 ? (char)c : '?';
            }

            position = end;
            text = new string(chars);
            return true;
        }

        private bool TryReadFixed(int bytes, out ulong value)
        {
            value = 0;
            if (end - position < bytes)
            {
                return false;
            }

            for (int i = bytes - 1; i >= 0; i--)
            {
                value = (value << 8) | buffer[position + i];
            }

            position += bytes;
            return true;
        }
    }
}
