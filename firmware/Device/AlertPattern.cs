using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Maps each reading to what the alert does (this project's own design; the numbers are choices, not from a source):
    /// <list type="bullet">
    /// <item>no signal, settling, or no target open: silent;</item>
    /// <item>non-ferrous: a steady tone in the high range, <see cref="NonFerrousLowHz"/> to <see cref="NonFerrousHighHz"/>;</item>
    /// <item>ferrous: a chopped tone (on half of each period) in the low range, <see cref="FerrousLowHz"/> to
    /// <see cref="FerrousHighHz"/>, chopped faster as the shift grows (<see cref="FerrousSlowPeriodMicroseconds"/> down
    /// to <see cref="FerrousFastPeriodMicroseconds"/>), so an LED alert shows the strength by its blink rate;</item>
    /// <item>unclear class, or a beat note below its floor (sign unknown): a short blip (<see cref="UnclearOnMicroseconds"/>)
    /// every <see cref="UnclearPeriodMicroseconds"/> in the middle range, <see cref="UnclearLowHz"/> to <see cref="UnclearHighHz"/>.</item>
    /// </list>
    /// The strength is |ShiftSigma| clamped to [<see cref="SigmaLow"/>, <see cref="SigmaHigh"/>] and mapped linearly onto
    /// each range: pitch never falls as the shift grows. O(1) per call, nothing allocated.
    /// <para>
    /// <see cref="Update"/> takes each new reading, <see cref="Drive"/> runs once a loop step and touches the port only when
    /// the tone changes (the chopping needs the step's time). <see cref="ForcedToneHz"/> sounds a steady tone whatever
    /// the readings say, for the supply-pulling check in hardware-notes/peripherals.md.
    /// </para>
    /// </summary>
    public sealed class AlertPattern
    {
        /// <summary>Strength at or below which the pitch is the bottom of its range, noise sigmas.</summary>
        public const double SigmaLow = 3.0;

        /// <summary>Strength at or above which the pitch is the top of its range, noise sigmas.</summary>
        public const double SigmaHigh = 30.0;

        /// <summary>Non-ferrous tone at <see cref="SigmaLow"/>, Hz.</summary>
        public const int NonFerrousLowHz = 1200;

        /// <summary>Non-ferrous tone at <see cref="SigmaHigh"/>, Hz.</summary>
        public const int NonFerrousHighHz = 2400;

        /// <summary>Ferrous tone at <see cref="SigmaLow"/>, Hz.</summary>
        public const int FerrousLowHz = 300;

        /// <summary>Ferrous tone at <see cref="SigmaHigh"/>, Hz.</summary>
        public const int FerrousHighHz = 700;

        /// <summary>Ferrous chop period at <see cref="SigmaLow"/>, us (on for half of it).</summary>
        public const long FerrousSlowPeriodMicroseconds = 240000;

        /// <summary>Ferrous chop period at <see cref="SigmaHigh"/>, us.</summary>
        public const long FerrousFastPeriodMicroseconds = 80000;

        /// <summary>Unclear tone at <see cref="SigmaLow"/>, Hz.</summary>
        public const int UnclearLowHz = 850;

        /// <summary>Unclear tone at <see cref="SigmaHigh"/>, Hz.</summary>
        public const int UnclearHighHz = 1050;

        /// <summary>Unclear blip length, us.</summary>
        public const long UnclearOnMicroseconds = 40000;

        /// <summary>Unclear blip period, us.</summary>
        public const long UnclearPeriodMicroseconds = 400000;

        private int toneHz;
        private long periodMicroseconds;
        private long onMicroseconds;
        private long startMicroseconds;
        private int sentHz = -1;
        private TargetClass kindShown = TargetClass.None;

        /// <summary>The tone of the current pattern while it sounds, Hz (0 = silent).</summary>
        public int ToneHz
        {
            get { return toneHz; }
        }

        /// <summary>The chop period of the current pattern, us (0 = steady).</summary>
        public long PeriodMicroseconds
        {
            get { return periodMicroseconds; }
        }

        /// <summary>How long the tone sounds in each period, us (the whole period when steady).</summary>
        public long OnMicroseconds
        {
            get { return onMicroseconds; }
        }

        /// <summary>A steady tone sounded whatever the readings say (a check of supply pulling), Hz; 0 (default) = off.</summary>
        public int ForcedToneHz { get; set; }

        /// <summary>Times the port refused a tone.</summary>
        public long PortFailures { get; private set; }

        /// <summary>Takes a new reading at <paramref name="nowMicroseconds"/>; a pattern that changes kind starts its period afresh.</summary>
        public void Update(Reading reading, long nowMicroseconds)
        {
            if (reading == null || !reading.TargetPresent || !reading.HasShift
                || reading.State == ReadoutState.NoSignal || reading.State == ReadoutState.Settling)
            {
                toneHz = 0;
                periodMicroseconds = 0;
                onMicroseconds = 0;
                kindShown = TargetClass.None;
                return;
            }

            double strength = Strength(reading.ShiftSigma);
            TargetClass kind = reading.BelowBeatFloor ? TargetClass.Unclear : reading.Class;
            if (kind != TargetClass.Ferrous && kind != TargetClass.NonFerrous)
            {
                kind = TargetClass.Unclear;    // a target whose class is not (yet) known
            }

            if (kind == TargetClass.NonFerrous)
            {
                toneHz = Interpolate(NonFerrousLowHz, NonFerrousHighHz, strength);
                periodMicroseconds = 0;
                onMicroseconds = 0;
            }
            else if (kind == TargetClass.Ferrous)
            {
                toneHz = Interpolate(FerrousLowHz, FerrousHighHz, strength);
                periodMicroseconds = (long)(FerrousSlowPeriodMicroseconds + (FerrousFastPeriodMicroseconds - FerrousSlowPeriodMicroseconds) * strength + 0.5);
                onMicroseconds = periodMicroseconds / 2;
            }
            else
            {
                toneHz = Interpolate(UnclearLowHz, UnclearHighHz, strength);
                periodMicroseconds = UnclearPeriodMicroseconds;
                onMicroseconds = UnclearOnMicroseconds;
            }

            if (kind != kindShown)
            {
                kindShown = kind;
                startMicroseconds = nowMicroseconds;    // a new pattern starts with its tone on
            }
        }

        /// <summary>The tone the alert should sound at <paramref name="nowMicroseconds"/>, Hz (0 = off).</summary>
        public int ToneAt(long nowMicroseconds)
        {
            if (ForcedToneHz > 0)
            {
                return ForcedToneHz;
            }

            if (toneHz == 0 || periodMicroseconds == 0)
            {
                return toneHz;
            }

            long phase = (nowMicroseconds - startMicroseconds) % periodMicroseconds;
            if (phase < 0)
            {
                phase += periodMicroseconds;
            }

            return phase < onMicroseconds ? toneHz : 0;
        }

        /// <summary>Sets the port to the tone due at <paramref name="nowMicroseconds"/>, calling it only when that tone changed (or the last call failed).</summary>
        public void Drive(IAlertPort port, long nowMicroseconds)
        {
            int due = ToneAt(nowMicroseconds);
            if (due == sentHz)
            {
                return;
            }

            if (port.TrySetTone(due))
            {
                sentHz = due;
            }
            else
            {
                sentHz = -1;
                PortFailures++;
            }
        }

        /// <summary>|sigma| clamped to [SigmaLow, SigmaHigh], as a fraction of that span (0 to 1; NaN counts as 0).</summary>
        private static double Strength(double shiftSigma)
        {
            double s = shiftSigma < 0 ? -shiftSigma : shiftSigma;
            if (!(s > SigmaLow))
            {
                return 0;
            }

            if (s >= SigmaHigh)
            {
                return 1;
            }

            return (s - SigmaLow) / (SigmaHigh - SigmaLow);
        }

        private static int Interpolate(int lowHz, int highHz, double fraction)
        {
            return (int)(lowHz + (highHz - lowHz) * fraction + 0.5);
        }
    }
}
