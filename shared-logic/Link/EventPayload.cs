using FreqReadout.Detection;

namespace FreqReadout.Link
{
    /// <summary>
    /// A finished detection event in a <see cref="LinkFrameType.Event"/> frame. Layout: start, end and peak time (s),
    /// peak shift (Hz), peak shift (ppm, 0 when not known), peak in noise sigmas, noise (Hz), doubles; class, how it ended
    /// (the enums' values) and flags (1 ppm known, 2 below beat floor, 4 mixed sign), 1 byte each.
    /// </summary>
    public sealed class EventPayload
    {
        /// <summary>Bytes of the layout.</summary>
        public const int Bytes = (7 * 8) + 3;

        /// <summary>Start, s.</summary>
        public double StartSeconds { get; set; }

        /// <summary>End, s.</summary>
        public double EndSeconds { get; set; }

        /// <summary>Time of the peak, s.</summary>
        public double PeakSeconds { get; set; }

        /// <summary>Peak shift, Hz.</summary>
        public double PeakShiftHz { get; set; }

        /// <summary>Peak shift, ppm (0 when <see cref="HasPpm"/> is false).</summary>
        public double PeakShiftPpm { get; set; }

        /// <summary>Peak in noise sigmas.</summary>
        public double PeakSigma { get; set; }

        /// <summary>Noise at the event, Hz.</summary>
        public double NoiseHz { get; set; }

        /// <summary>Class.</summary>
        public TargetClass Class { get; set; }

        /// <summary>How the event ended.</summary>
        public EventEnd End { get; set; }

        /// <summary>True when ppm is known.</summary>
        public bool HasPpm { get; set; }

        /// <summary>Beat mode: near zero beat during the event.</summary>
        public bool BelowBeatFloor { get; set; }

        /// <summary>Shifts of both signs were seen.</summary>
        public bool MixedSign { get; set; }

        /// <summary>Takes every field from an event.</summary>
        public void CopyFrom(DetectionEvent detection)
        {
            StartSeconds = detection.StartSeconds;
            EndSeconds = detection.EndSeconds;
            PeakSeconds = detection.PeakSeconds;
            PeakShiftHz = detection.PeakShiftHz;
            HasPpm = detection.HasPpm;
            PeakShiftPpm = detection.HasPpm ? detection.PeakShiftPpm : 0;
            PeakSigma = detection.PeakSigma;
            NoiseHz = detection.NoiseHz;
            Class = detection.Class;
            End = detection.End;
            BelowBeatFloor = detection.BelowBeatFloor;
            MixedSign = detection.MixedSign;
        }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            writer.WriteDouble(StartSeconds);
            writer.WriteDouble(EndSeconds);
            writer.WriteDouble(PeakSeconds);
            writer.WriteDouble(PeakShiftHz);
            writer.WriteDouble(PeakShiftPpm);
            writer.WriteDouble(PeakSigma);
            writer.WriteDouble(NoiseHz);
            writer.WriteByte((int)Class);
            writer.WriteByte((int)End);
            writer.WriteByte((HasPpm ? 1 : 0) | (BelowBeatFloor ? 2 : 0) | (MixedSign ? 4 : 0));
        }

        /// <summary>Reads the layout (later bytes ignored); false when short or the class or end is not one this version knows.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            double start;
            double end;
            double peak;
            double hz;
            double ppm;
            double sigma;
            double noise;
            int cls;
            int how;
            int flags;
            if (!reader.TryReadDouble(out start) || !reader.TryReadDouble(out end) || !reader.TryReadDouble(out peak) || !reader.TryReadDouble(out hz)
                || !reader.TryReadDouble(out ppm) || !reader.TryReadDouble(out sigma) || !reader.TryReadDouble(out noise)
                || !reader.TryReadByte(out cls) || !reader.TryReadByte(out how) || !reader.TryReadByte(out flags))
            {
                return false;
            }

            if (cls > (int)TargetClass.Unclear || how > (int)EventEnd.Resolved)
            {
                return false;
            }

            StartSeconds = start;
            EndSeconds = end;
            PeakSeconds = peak;
            PeakShiftHz = hz;
            PeakShiftPpm = ppm;
            PeakSigma = sigma;
            NoiseHz = noise;
            Class = (TargetClass)cls;
            End = (EventEnd)how;
            HasPpm = (flags & 1) != 0;
            BelowBeatFloor = (flags & 2) != 0;
            MixedSign = (flags & 4) != 0;
            return true;
        }
    }
}
