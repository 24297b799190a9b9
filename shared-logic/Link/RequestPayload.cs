namespace FreqReadout.Link
{
    /// <summary>A PC's request in a <see cref="LinkFrameType.Request"/> frame. Layout: the frame type wanted now (1 byte): capture header, status or settings.</summary>
    public sealed class RequestPayload
    {
        /// <summary>The frame type asked for: <see cref="LinkFrameType.CaptureHeader"/>, <see cref="LinkFrameType.Status"/> or <see cref="LinkFrameType.Settings"/>.</summary>
        public int WantedType { get; set; }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            writer.WriteByte(WantedType);
        }

        /// <summary>Reads the layout; false when empty or the type is not one a device sends on request.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            int wanted;
            if (!reader.TryReadByte(out wanted) || (wanted != LinkFrameType.CaptureHeader && wanted != LinkFrameType.Status && wanted != LinkFrameType.Settings))
            {
                return false;
            }

            WantedType = wanted;
            return true;
        }
    }
}
