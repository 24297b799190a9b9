using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Link
{
    /// <summary>
    /// One gate's reading in a <see cref="LinkFrameType.Reading"/> frame, for a live view on the PC. Layout: time in s
    /// (double), state, class (1 byte each, the enums' values), flags (1 byte: 1 frequency, 2 shift, 4 ppm, 8 target
    /// present, 16 hold, 32 below beat floor, 64 baseline disturbed), then frequency, baseline, shift (Hz), shift (ppm),
    /// shift (noise sigmas), noise (Hz) and drift (Hz/s), doubles. A value whose flag is clear is written as 0.
    /// </summary>
    public sealed class ReadingPayload
    {
        /// <summary>Bytes of the layout.</summary>
        public const int Bytes = 8 + 3 + (7 * 8);

        private const int FlagFrequency = 1;
        private const int FlagShift = 2;
        private const int FlagPpm = 4;
        private const int FlagTarget = 8;
        private const int FlagHold = 16;
        private const int FlagBelowFloor = 32;
        private const int FlagDisturbed = 64;

        /// <summary>Capture time of the gate, s.</summary>
        public double TimeSeconds { get; set; }

        /// <summary>Readout state.</summary>
        public ReadoutState State { get; set; }

        /// <summary>Class of the target present, if any.</summary>
        public TargetClass Class { get; set; }

        /// <summary>True when the gate had a frequency.</summary>
        public bool HasFrequency { get; set; }

        /// <summary>True when a baseline gave a shift.</summary>
        public bool HasShift { get; set; }

        /// <summary>True when the shift in ppm is known.</summary>
        public bool HasPpm { get; set; }

        /// <summary>True while a target is present.</summary>
        public bool TargetPresent { get; set; }

        /// <summary>True in hold.</summary>
        public bool HoldActive { get; set; }

        /// <summary>Beat mode: the beat is below its floor (near zero beat).</summary>
        public bool BelowBeatFloor { get; set; }

        /// <summary>The baseline was disturbed.</summary>
        public bool BaselineDisturbed { get; set; }

        /// <summary>Counted frequency, Hz.</summary>
        public double FrequencyHz { get; set; }

        /// <summary>Baseline, Hz.</summary>
        public double BaselineHz { get; set; }

        /// <summary>Shift of the search oscillator, Hz.</summary>
        public double ShiftHz { get; set; }

        /// <summary>Shift, ppm of the search frequency.</summary>
        public double ShiftPpm { get; set; }

        /// <summary>Shift in noise sigmas.</summary>
        public double ShiftSigma { get; set; }

        /// <summary>Noise, Hz.</summary>
        public double NoiseHz { get; set; }

        /// <summary>Drift, Hz/s.</summary>
        public double DriftHzPerSecond { get; set; }

        /// <summary>Takes every field from a reading.</summary>
        public void CopyFrom(Reading reading)
        {
            TimeSeconds = reading.TimeSeconds;
            State = reading.State;
            Class = reading.Class;
            HasFrequency = reading.HasFrequency;
            HasShift = reading.HasShift;
            HasPpm = reading.HasPpm;
            TargetPresent = reading.TargetPresent;
            HoldActive = reading.HoldActive;
            BelowBeatFloor = reading.BelowBeatFloor;
            BaselineDisturbed = reading.BaselineDisturbed;
            FrequencyHz = reading.HasFrequency ? reading.FrequencyHz : 0;
            BaselineHz = reading.HasShift ? reading.BaselineHz : 0;
            ShiftHz = reading.HasShift ? reading.ShiftHz : 0;
            ShiftPpm = reading.HasPpm ? reading.ShiftPpm : 0;
            ShiftSigma = reading.HasShift ? reading.ShiftSigma : 0;
            NoiseHz = reading.NoiseHz;
            DriftHzPerSecond = reading.DriftHzPerSecond;
        }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            int flags = (HasFrequency ? FlagFrequency : 0) | (HasShift ? FlagShift : 0) | (HasPpm ? FlagPpm : 0) | (TargetPresent ? FlagTarget : 0)
                | (HoldActive ? FlagHold : 0) | (BelowBeatFloor ? FlagBelowFloor : 0) | (BaselineDisturbed ? FlagDisturbed : 0);
            writer.WriteDouble(TimeSeconds);
            writer.WriteByte((int)State);
            writer.WriteByte((int)Class);
            writer.WriteByte(flags);
            writer.WriteDouble(FrequencyHz);
            writer.WriteDouble(BaselineHz);
            writer.WriteDouble(ShiftHz);
            writer.WriteDouble(ShiftPpm);
            writer.WriteDouble(ShiftSigma);
            writer.WriteDouble(NoiseHz);
            writer.WriteDouble(DriftHzPerSecond);
        }

        /// <summary>Reads the layout (later bytes ignored); false when short, or the state or class is not one this version knows.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            double time;
            int state;
            int cls;
            int flags;
            double f;
            double b;
            double s;
            double ppm;
            double sigma;
            double noise;
            double drift;
            if (!reader.TryReadDouble(out time) || !reader.TryReadByte(out state) || !reader.TryReadByte(out cls) || !reader.TryReadByte(out flags)
                || !reader.TryReadDouble(out f) || !reader.TryReadDouble(out b) || !reader.TryReadDouble(out s) || !reader.TryReadDouble(out ppm)
                || !reader.TryReadDouble(out sigma) || !reader.TryReadDouble(out noise) || !reader.TryReadDouble(out drift))
            {
                return false;
            }

            if (state > (int)ReadoutState.Hold || cls > (int)TargetClass.Unclear)
            {
                return false;
            }

            TimeSeconds = time;
            State = (ReadoutState)state;
            Class = (TargetClass)cls;
            HasFrequency = (flags & FlagFrequency) != 0;
            HasShift = (flags & FlagShift) != 0;
            HasPpm = (flags & FlagPpm) != 0;
            TargetPresent = (flags & FlagTarget) != 0;
            HoldActive = (flags & FlagHold) != 0;
            BelowBeatFloor = (flags & FlagBelowFloor) != 0;
            BaselineDisturbed = (flags & FlagDisturbed) != 0;
            FrequencyHz = f;
            BaselineHz = b;
            ShiftHz = s;
            ShiftPpm = ppm;
            ShiftSigma = sigma;
            NoiseHz = noise;
            DriftHzPerSecond = drift;
            return true;
        }
    }
}
