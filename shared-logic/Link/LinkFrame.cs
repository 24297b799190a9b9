namespace FreqReadout.Link
{
    /// <summary>One frame of the capture link as <see cref="LinkFrameDecoder"/> delivers it (docs/link-protocol.md); the decoder fills it.</summary>
    public sealed class LinkFrame
    {
        private readonly byte[] payload = new byte[LinkFrameEncoder.MaxPayloadBytes];

        /// <summary>Protocol version the frame was written with.</summary>
        public int Version { get; internal set; }

        /// <summary>Frame type, 1-255 (<see cref="LinkFrameType"/>).</summary>
        public int FrameType { get; internal set; }

        /// <summary>Sequence number, 0-65535.</summary>
        public int Sequence { get; internal set; }

        /// <summary>The payload (its first <see cref="PayloadLength"/> bytes).</summary>
        public byte[] Payload
        {
            get { return payload; }
        }

        /// <summary>Bytes of payload.</summary>
        public int PayloadLength { get; internal set; }
    }
}
