using FreqReadout.Counting;

namespace FreqReadout.Link
{
    /// <summary>
    /// The capture's metadata in a <see cref="LinkFrameType.CaptureHeader"/> frame, so that a PC that starts listening
    /// mid-stream can begin a capture. Layout: boot id (u32), kind (1 byte: 0 edges, 1 snapshots), clock Hz (double),
    /// prescale (u32), timer bits, count bits (1 byte each), signal (1 byte: 0 search, 1 beat), beat side (1 byte: 0 none,
    /// 1 above, 2 below), search Hz (double, 0 = not known). Rows of batch frames are unwrapped 64-bit ticks and counts,
    /// so a recorded capture has <c>timer_bits = 64</c> and <c>count_bits = 64</c> whatever the board's hardware.
    /// </summary>
    public sealed class CaptureHeaderPayload
    {
        /// <summary>Bytes of the layout.</summary>
        public const int Bytes = 4 + 1 + 8 + 4 + 1 + 1 + 1 + 1 + 8;

        /// <summary>A number that changes at every start of the device (a stored boot counter, or one drawn at start): a new value starts a new capture on the PC.</summary>
        public uint BootId { get; set; }

        /// <summary>True for pulse-counter snapshots, false for edges.</summary>
        public bool Snapshots { get; set; }

        /// <summary>Tick rate of the rows' times, Hz.</summary>
        public double ClockHz { get; set; }

        /// <summary>Input edges per counted edge (a divider before the counter), at least 1.</summary>
        public uint Prescale { get; set; } = 1;

        /// <summary>Width of the rows' ticks: 64 (the device unwraps).</summary>
        public int TimerBits { get; set; } = 64;

        /// <summary>Width of the rows' counts: 64 (the device unwraps).</summary>
        public int CountBits { get; set; } = 64;

        /// <summary>What is counted.</summary>
        public SignalKind Signal { get; set; }

        /// <summary>Beat mode: where the search oscillator is tuned.</summary>
        public BeatSide BeatSide { get; set; }

        /// <summary>Nominal search-oscillator frequency, Hz; 0 when not known.</summary>
        public double SearchHz { get; set; }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            writer.WriteUInt32(BootId);
            writer.WriteByte(Snapshots ? 1 : 0);
            writer.WriteDouble(ClockHz);
            writer.WriteUInt32(Prescale);
            writer.WriteByte(TimerBits);
            writer.WriteByte(CountBits);
            writer.WriteByte((int)Signal);
            writer.WriteByte((int)BeatSide);
            writer.WriteDouble(SearchHz);
        }

        /// <summary>Reads the layout (bytes after it are ignored: later versions may append fields); false when short or a field is out of its range.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            uint boot;
            int kind;
            double clock;
            uint prescale;
            int timerBits;
            int countBits;
            int signal;
            int side;
            double search;
            if (!reader.TryReadUInt32(out boot) || !reader.TryReadByte(out kind) || !reader.TryReadDouble(out clock)
                || !reader.TryReadUInt32(out prescale) || !reader.TryReadByte(out timerBits) || !reader.TryReadByte(out countBits)
                || !reader.TryReadByte(out signal) || !reader.TryReadByte(out side) || !reader.TryReadDouble(out search))
            {
                return false;
            }

            if (kind > 1 || !(clock > 0) || double.IsInfinity(clock) || prescale < 1 || !IsWidth(timerBits) || !IsWidth(countBits)
                || signal > 1 || side > 2 || !(search >= 0) || double.IsInfinity(search))
            {
                return false;
            }

            BootId = boot;
            Snapshots = kind == 1;
            ClockHz = clock;
            Prescale = prescale;
            TimerBits = timerBits;
            CountBits = countBits;
            Signal = (SignalKind)signal;
            BeatSide = (BeatSide)side;
            SearchHz = search;
            return true;
        }

        private static bool IsWidth(int bits)
        {
            return bits == 16 || bits == 24 || bits == 32 || bits == 64;
        }
    }
}
