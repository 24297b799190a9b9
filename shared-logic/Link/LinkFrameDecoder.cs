namespace FreqReadout.Link
{
    /// <summary>
    /// Reads frames of the capture link from a byte stream (docs/link-protocol.md) and resynchronises after anything
    /// else: bytes are gathered up to a zero byte (the delimiter); what lies between two delimiters is un-stuffed (COBS),
    /// and is a frame when it is at least a header and a CRC long, its CRC checks, and its version is one this decoder
    /// reads. Everything else is counted and dropped; a run of more than <see cref="LinkFrameEncoder.MaxWireBytes"/> bytes
    /// without a delimiter is dropped up to the next one. Counts of what was lost go into the capture's trailer when
    /// recording. Nothing allocates per byte or per frame.
    /// </summary>
    public sealed class LinkFrameDecoder
    {
        private readonly byte[] gathered = new byte[LinkFrameEncoder.MaxWireBytes];
        private readonly byte[] raw = new byte[LinkFrameEncoder.MaxWireBytes];
        private int count;
        private bool overrun;
        private int lastSequence = -1;

        /// <summary>Frames delivered.</summary>
        public long Frames { get; private set; }

        /// <summary>Stretches between delimiters whose CRC did not check.</summary>
        public long CrcErrors { get; private set; }

        /// <summary>Stretches that were not a frame at all: not a COBS encoding, too short, too long, or of a version this decoder does not read.</summary>
        public long Malformed { get; private set; }

        /// <summary>Frames missing by their sequence numbers (the gaps between consecutive delivered frames).</summary>
        public long SequenceGaps { get; private set; }

        /// <summary>The gap counted at the last frame delivered (0 when it followed its predecessor): a receiver that learns from that frame that the device restarted takes it back out of its own count.</summary>
        public long LastGap { get; private set; }

        /// <summary>Takes one byte; true when it completed a frame, which is then in <paramref name="into"/>.</summary>
        /// <param name="value">The next byte of the stream.</param>
        /// <param name="into">Filled with the frame when one completes.</param>
        /// <returns>True when a frame was delivered.</returns>
        public bool Push(byte value, LinkFrame into)
        {
            if (value != 0)
            {
                if (count < gathered.Length)
                {
                    gathered[count++] = value;
                }
                else
                {
                    overrun = true;
                }

                return false;
            }

            int n = count;
            int length;
            bool wasOverrun = overrun;
            count = 0;
            overrun = false;
            if (n == 0)
            {
                return false;    // back-to-back delimiters: nothing between them
            }

            if (wasOverrun || !ByteStuffing.TryDecode(gathered, 0, n, raw, 0, out length) || length < LinkFrameEncoder.HeaderBytes + LinkFrameEncoder.CrcBytes || length > LinkFrameEncoder.HeaderBytes + LinkFrameEncoder.MaxPayloadBytes + LinkFrameEncoder.CrcBytes)
            {
                Malformed++;
                return false;
            }

            int body = length - LinkFrameEncoder.CrcBytes;
            uint stated = (uint)(raw[body] | (raw[body + 1] << 8) | (raw[body + 2] << 16)) | ((uint)raw[body + 3] << 24);
            if (FrameCrc.Compute(raw, 0, body) != stated)
            {
                CrcErrors++;
                return false;
            }

            if (raw[0] != LinkFrameEncoder.Version)
            {
                Malformed++;
                return false;
            }

            int sequence = raw[2] | (raw[3] << 8);
            LastGap = lastSequence >= 0 ? (sequence - lastSequence - 1) & 0xFFFF : 0;
            SequenceGaps += LastGap;

            lastSequence = sequence;
            into.Version = raw[0];
            into.FrameType = raw[1];
            into.Sequence = sequence;
            into.PayloadLength = length - LinkFrameEncoder.HeaderBytes - LinkFrameEncoder.CrcBytes;
            System.Array.Copy(raw, LinkFrameEncoder.HeaderBytes, into.Payload, 0, into.PayloadLength);
            Frames++;
            return true;
        }
    }
}
