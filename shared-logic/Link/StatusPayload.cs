namespace FreqReadout.Link
{
    /// <summary>
    /// The device's health and what it lost, in a <see cref="LinkFrameType.Status"/> frame (about once a second and on
    /// request). Every count runs from the device's start. Layout: boot id (u32), uptime (µs, i64), reads taken (i64),
    /// reads dropped (i64: the pulse counter gave a step no wrap explains), wraps mended (i64), loop stalls (i64), longest
    /// gap between reads (µs, i64), deadlines missed (i64), link frames lost (i64: the send queue was full), rejected
    /// timer values (i64), the settings' check (u32: the CRC-32 of <see cref="FrameCrc"/> over the settings text in force), settings problems
    /// (1 byte: stored settings that fell back to defaults), flags (1 byte: 1 hold).
    /// </summary>
    public sealed class StatusPayload
    {
        /// <summary>Bytes of the layout.</summary>
        public const int Bytes = 4 + (9 * 8) + 4 + 1 + 1;

        /// <summary>Changes at every start of the device.</summary>
        public uint BootId { get; set; }

        /// <summary>Time since the device started, µs.</summary>
        public long UptimeMicroseconds { get; set; }

        /// <summary>Pulse-counter reads (or edges) taken.</summary>
        public long Reads { get; set; }

        /// <summary>Reads dropped because the count stepped by an amount no counter wrap explains.</summary>
        public long ReadsDropped { get; set; }

        /// <summary>Reads mended that had raced the counter's overflow interrupt.</summary>
        public long WrapsMended { get; set; }

        /// <summary>Gaps between reads longer than the stall limit (garbage collection shows this way).</summary>
        public long Stalls { get; set; }

        /// <summary>Longest gap between two reads, µs.</summary>
        public long LongestGapMicroseconds { get; set; }

        /// <summary>Read deadlines skipped after the loop fell behind.</summary>
        public long MissedDeadlines { get; set; }

        /// <summary>Link frames dropped because the send queue was full.</summary>
        public long FramesLost { get; set; }

        /// <summary>Timer or count values the unwrapper refused.</summary>
        public long RejectedTicks { get; set; }

        /// <summary>The CRC-32 (<see cref="FrameCrc"/>) of the settings text in force (its ASCII bytes).</summary>
        public uint SettingsCheck { get; set; }

        /// <summary>Stored settings that were invalid and fell back to their defaults, 0-255.</summary>
        public int SettingsProblems { get; set; }

        /// <summary>True in hold.</summary>
        public bool HoldActive { get; set; }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            writer.WriteUInt32(BootId);
            writer.WriteInt64(UptimeMicroseconds);
            writer.WriteInt64(Reads);
            writer.WriteInt64(ReadsDropped);
            writer.WriteInt64(WrapsMended);
            writer.WriteInt64(Stalls);
            writer.WriteInt64(LongestGapMicroseconds);
            writer.WriteInt64(MissedDeadlines);
            writer.WriteInt64(FramesLost);
            writer.WriteInt64(RejectedTicks);
            writer.WriteUInt32(SettingsCheck);
            writer.WriteByte(SettingsProblems > 255 ? 255 : SettingsProblems);
            writer.WriteByte(HoldActive ? 1 : 0);
        }

        /// <summary>Reads the layout (later bytes ignored); false when short.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            uint boot;
            long uptime;
            long reads;
            long dropped;
            long mended;
            long stalls;
            long gap;
            long missed;
            long lost;
            long rejected;
            uint check;
            int problems;
            int flags;
            if (!reader.TryReadUInt32(out boot) || !reader.TryReadInt64(out uptime) || !reader.TryReadInt64(out reads) || !reader.TryReadInt64(out dropped)
                || !reader.TryReadInt64(out mended) || !reader.TryReadInt64(out stalls) || !reader.TryReadInt64(out gap) || !reader.TryReadInt64(out missed)
                || !reader.TryReadInt64(out lost) || !reader.TryReadInt64(out rejected) || !reader.TryReadUInt32(out check)
                || !reader.TryReadByte(out problems) || !reader.TryReadByte(out flags))
            {
                return false;
            }

            BootId = boot;
            UptimeMicroseconds = uptime;
            Reads = reads;
            ReadsDropped = dropped;
            WrapsMended = mended;
            Stalls = stalls;
            LongestGapMicroseconds = gap;
            MissedDeadlines = missed;
            FramesLost = lost;
            RejectedTicks = rejected;
            SettingsCheck = check;
            SettingsProblems = problems;
            HoldActive = (flags & 1) != 0;
            return true;
        }
    }
}
