namespace FreqReadout.Link
{
    /// <summary>
    /// Writes frames of the capture link (docs/link-protocol.md): version (1 byte), frame type (1 byte), sequence number
    /// (2 bytes, little-endian, one more per frame written, modulo 65536), payload (0 to <see cref="MaxPayloadBytes"/>
    /// bytes), CRC-32 (<see cref="FrameCrc"/>) of all of that (4 bytes, little-endian), then
    /// COBS-stuffed (<see cref="ByteStuffing"/>) and ended by one zero byte. Its buffer is made once; writing a frame
    /// allocates nothing and costs O(payload). One encoder per link: it owns the sequence numbers.
    /// </summary>
    public sealed class LinkFrameEncoder
    {
        /// <summary>The protocol version this encoder writes.</summary>
        public const int Version = 1;

        /// <summary>Largest payload of one frame, bytes.</summary>
        public const int MaxPayloadBytes = 240;

        /// <summary>Bytes before the payload: version, type, sequence number.</summary>
        public const int HeaderBytes = 4;

        /// <summary>Bytes of the frame check after the payload (CRC-32, little-endian).</summary>
        public const int CrcBytes = 4;

        /// <summary>Longest frame on the wire: header, payload and CRC stuffed (one code byte more, as they stay under 254 bytes), and the delimiter.</summary>
        public const int MaxWireBytes = HeaderBytes + MaxPayloadBytes + CrcBytes + 2;

        private readonly byte[] raw = new byte[HeaderBytes + MaxPayloadBytes + CrcBytes];
        private int sequence;

        /// <summary>The sequence number the next frame gets, 0-65535.</summary>
        public int NextSequence
        {
            get { return sequence; }
        }

        /// <summary>
        /// Uses up one sequence number without writing a frame: a sender that has to drop a frame (its queue was full)
        /// calls this, so the receiver sees the loss as a gap in the sequence numbers, where it happened.
        /// </summary>
        public void SkipSequence()
        {
            sequence = (sequence + 1) & 0xFFFF;
        }

        /// <summary>
        /// Writes one frame into <paramref name="destination"/> (room for <see cref="MaxWireBytes"/> bytes from
        /// <paramref name="destinationOffset"/> is enough); false, and nothing written, when the type is not 1-255 or the
        /// payload is longer than <see cref="MaxPayloadBytes"/>.
        /// </summary>
        /// <param name="frameType">Frame type, 1-255 (docs/link-protocol.md).</param>
        /// <param name="payload">The payload bytes.</param>
        /// <param name="offset">First payload byte.</param>
        /// <param name="count">Payload bytes.</param>
        /// <param name="destination">Where the stuffed frame and its delimiter go.</param>
        /// <param name="destinationOffset">First byte written.</param>
        /// <param name="written">Bytes written, the delimiter included.</param>
        /// <returns>True when the frame was written.</returns>
        public bool TryEncode(int frameType, byte[] payload, int offset, int count, byte[] destination, int destinationOffset, out int written)
        {
            written = 0;
            if (frameType < 1 || frameType > 255 || count < 0 || count > MaxPayloadBytes)
            {
                return false;
            }

            raw[0] = Version;
            raw[1] = (byte)frameType;
            raw[2] = (byte)(sequence & 0xFF);
            raw[3] = (byte)(sequence >> 8);
            for (int i = 0; i < count; i++)
            {
                raw[HeaderBytes + i] = payload[offset + i];
            }

            int length = HeaderBytes + count;
            uint crc = FrameCrc.Compute(raw, 0, length);
            raw[length] = (byte)(crc & 0xFF);
            raw[length + 1] = (byte)((crc >> 8) & 0xFF);
            raw[length + 2] = (byte)((crc >> 16) & 0xFF);
            raw[length + 3] = (byte)(crc >> 24);
            length += CrcBytes;

            int n = ByteStuffing.Encode(raw, 0, length, destination, destinationOffset);
            destination[destinationOffset + n] = 0;
            written = n + 1;
            sequence = (sequence + 1) & 0xFFFF;
            return true;
        }
    }
}
