namespace FreqReadout.Link
{
    /// <summary>The frame types of link protocol version 1 (docs/link-protocol.md has each payload's layout).</summary>
    public static class LinkFrameType
    {
        /// <summary>Device to PC: the capture's metadata (<see cref="CaptureHeaderPayload"/>); sent at start, every few seconds and on request.</summary>
        public const int CaptureHeader = 1;

        /// <summary>Device to PC: pulse-counter reads, delta-encoded (<see cref="SnapshotBatchPayload"/>).</summary>
        public const int SnapshotBatch = 2;

        /// <summary>Device to PC: edge times, delta-encoded (<see cref="EdgeBatchPayload"/>).</summary>
        public const int EdgeBatch = 3;

        /// <summary>Device to PC: one gate's reading (<see cref="ReadingPayload"/>).</summary>
        public const int Reading = 4;

        /// <summary>Device to PC: a finished detection event (<see cref="EventPayload"/>).</summary>
        public const int Event = 5;

        /// <summary>Device to PC: a temperature sample (<see cref="TemperaturePayload"/>).</summary>
        public const int Temperature = 6;

        /// <summary>Device to PC: loop health, counts of what was lost and the settings in force (<see cref="StatusPayload"/>).</summary>
        public const int Status = 7;

        /// <summary>Both ways: a settings text (docs/settings-format.md); from the PC it replaces the device's settings, from the device it shows those in force.</summary>
        public const int Settings = 8;

        /// <summary>PC to device: asks for a frame now (<see cref="RequestPayload"/>).</summary>
        public const int Request = 9;
    }
}
