using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// The lines of the character display, each exactly as wide as the display (padded with spaces, so an adapter that
    /// rewrites only the changed characters clears old text) and ASCII only (the HD44780's character ROM shows 0x20-0x7D
    /// as ASCII except 0x5C; nothing here uses 0x5C, 0x7E or 0x7F). Built for 16 and 20 columns: from 20 columns on,
    /// the wide layouts; below 16 the lines are cut (no supported display is that narrow). Numbers sit in fixed-width
    /// fields with their units (<see cref="DisplayNumber"/>), so digits stay in place from one refresh to the next.
    /// <para>
    /// Line 1, the counted frequency: "F   130012.4 Hz" (up to 1 place, 7 significant digits: 0 from 1 MHz); "F        --- Hz"
    /// without a signal. Line 2, the search-oscillator shift: " +12.35 Hz +95.3 ppm" on 20 columns, "+12.35Hz  +95ppm" on
    /// 16 (ppm only when a ppm reference is known); "check input" without a signal; "taking baseline" before a baseline.
    /// Line 3, the status: the class of a present target or the readout state, then the warnings (near zero beat,
    /// baseline moved, hold), shortened as needed to fit (<see cref="StatusLine"/>). Line 4 (4-row displays), the
    /// loop's health (<see cref="HealthLine"/>).
    /// </para>
    /// Called once per display refresh (at most a few times a second), never per read, so the strings it builds do not
    /// load the device's garbage collector.
    /// </summary>
    public static class DisplayText
    {
        /// <summary>Narrowest display the layouts are made for (16x2).</summary>
        public const int NarrowWidth = 16;

        /// <summary>Width from which the wide layouts are used (20x4).</summary>
        public const int WideWidth = 20;

        /// <summary>Line 1: "F" and the counted frequency in a 10-character field with " Hz".</summary>
        /// <param name="reading">The reading shown.</param>
        /// <param name="width">Characters per line (IDisplayPort.LineWidth).</param>
        public static string FrequencyLine(Reading reading, int width)
        {
            string field = reading.HasFrequency
                ? DisplayNumber.Measured(reading.FrequencyHz, false, 10, 1, 7)
                : "---".PadLeft(10);
            return Fit("F " + field + " Hz", width);
        }

        /// <summary>
        /// Line 2: the shift in Hz (signed, up to 2 places, 5 significant digits) and, when known, in ppm (signed, up to
        /// 2 places, 3 significant digits). 20 columns and more: 7 + " Hz " + 5 + " ppm"; narrower: 6 + "Hz " + 4 + "ppm".
        /// "check input" without a signal, "taking baseline" before a baseline is tracked.
        /// </summary>
        /// <param name="reading">The reading shown.</param>
        /// <param name="width">Characters per line (IDisplayPort.LineWidth).</param>
        public static string ShiftLine(Reading reading, int width)
        {
            if (reading.State == ReadoutState.NoSignal)
            {
                return Fit("check input", width);
            }

            if (!reading.HasShift)
            {
                return Fit("taking baseline", width);
            }

            bool wide = width >= WideWidth;
            string line = wide
                ? DisplayNumber.Measured(reading.ShiftHz, true, 7, 2, 5) + " Hz"
                : DisplayNumber.Measured(reading.ShiftHz, true, 6, 2, 5) + "Hz";
            if (reading.HasPpm)
            {
                line += wide
                    ? " " + DisplayNumber.Measured(reading.ShiftPpm, true, 5, 2, 3) + " ppm"
                    : " " + DisplayNumber.Measured(reading.ShiftPpm, true, 4, 2, 3) + "ppm";
            }

            return Fit(line, width);
        }

        /// <summary>
        /// Line 3: the class of a present target (FERROUS, NON-FERROUS, UNCLEAR, TARGET) or the state (NO SIGNAL,
        /// SETTLING, TRACKING, HOLD), then the warnings in this order: the beat note is below its floor, where the two
        /// oscillators pull together and may lock (NEAR ZERO BEAT); the baseline capture was disturbed (BASELINE MOVED);
        /// hold is on while a target is shown (HOLD). The first of these that fits the width is shown: every word in
        /// full; the warnings short (ZERO BEAT, BASE MOVED); the class or state short too (FE, NON-FE, UNCLR, NO SIG,
        /// SETTLE, TRACK); the warnings as tags (ZB!, BM!, H). The last always fits 16 columns.
        /// </summary>
        /// <param name="reading">The reading shown.</param>
        /// <param name="width">Characters per line (IDisplayPort.LineWidth).</param>
        public static string StatusLine(Reading reading, int width)
        {
            bool beat = reading.BelowBeatFloor;
            bool moved = reading.BaselineDisturbed;
            bool hold = reading.HoldActive && (reading.TargetPresent || reading.State != ReadoutState.Hold);

            string primary = PrimaryWord(reading, false);
            string line = primary + Warnings(beat, moved, hold, 0);
            if (line.Length > width)
            {
                string shortWarnings = Warnings(beat, moved, hold, 1);
                line = primary + shortWarnings;
                if (line.Length > width)
                {
                    primary = PrimaryWord(reading, true);
                    line = primary + shortWarnings;
                    if (line.Length > width)
                    {
                        line = primary + Warnings(beat, moved, hold, 2);
                    }
                }
            }

            return Fit(line, width);
        }

        /// <summary>
        /// Line 4 (4-row displays): the device loop's health. 16 columns: reads a second (4 characters) "/s", "S" and the
        /// stalls (3), "M" and the missed deadlines (3): "1000/s S  0 M 12". 20 columns and more: stalls and missed
        /// deadlines in 2 characters each and the longest gap between reads in whole ms (3): "1000/s S 0 M12  45ms".
        /// A count too large for its field shows nines and '+' ("99+"), a negative one '?'.
        /// </summary>
        /// <param name="readsPerSecond">Reads a second over the last interval (DeviceLoop.Reads differences over time).</param>
        /// <param name="stalls">Stalls so far (ReadPacer.Stalls).</param>
        /// <param name="missedDeadlines">Deadlines missed so far (ReadPacer.MissedDeadlines).</param>
        /// <param name="longestGapMicroseconds">Longest gap between two reads so far, us (ReadPacer.LongestGapMicroseconds); rounded to ms.</param>
        /// <param name="width">Characters per line (IDisplayPort.LineWidth).</param>
        public static string HealthLine(long readsPerSecond, long stalls, long missedDeadlines, long longestGapMicroseconds, int width)
        {
            string line = DisplayNumber.Count(readsPerSecond, 4) + "/s";
            if (width >= WideWidth)
            {
                long gapMilliseconds = longestGapMicroseconds < 0 ? -1 : (longestGapMicroseconds / 1000) + (longestGapMicroseconds % 1000 >= 500 ? 1 : 0);
                line += " S" + DisplayNumber.Count(stalls, 2) + " M" + DisplayNumber.Count(missedDeadlines, 2)
                    + " " + DisplayNumber.Count(gapMilliseconds, 3) + "ms";
            }
            else
            {
                line += " S" + DisplayNumber.Count(stalls, 3) + " M" + DisplayNumber.Count(missedDeadlines, 3);
            }

            return Fit(line, width);
        }

        /// <summary>The word shown for a class (full or short).</summary>
        /// <param name="targetClass">The class.</param>
        /// <param name="isShort">True for the short word (at most 6 characters).</param>
        public static string ClassWord(TargetClass targetClass, bool isShort)
        {
            switch (targetClass)
            {
                case TargetClass.Ferrous: return isShort ? "FE" : "FERROUS";
                case TargetClass.NonFerrous: return isShort ? "NON-FE" : "NON-FERROUS";
                case TargetClass.Unclear: return isShort ? "UNCLR" : "UNCLEAR";
                default: return "TARGET";
            }
        }

        /// <summary><paramref name="text"/> padded with spaces to exactly <paramref name="width"/> characters, cut when longer.</summary>
        private static string Fit(string text, int width)
        {
            if (width <= 0)
            {
                return string.Empty;
            }

            return text.Length > width ? text.Substring(0, width) : text.PadRight(width);
        }

        private static string PrimaryWord(Reading reading, bool isShort)
        {
            if (reading.TargetPresent)
            {
                return ClassWord(reading.Class, isShort);
            }

            switch (reading.State)
            {
                case ReadoutState.NoSignal: return isShort ? "NO SIG" : "NO SIGNAL";
                case ReadoutState.Settling: return isShort ? "SETTLE" : "SETTLING";
                case ReadoutState.Hold: return "HOLD";
                default: return isShort ? "TRACK" : "TRACKING";
            }
        }

        /// <summary>The warnings, each after a space; <paramref name="form"/> 0 full, 1 short, 2 tags.</summary>
        private static string Warnings(bool beat, bool moved, bool hold, int form)
        {
            string text = string.Empty;
            if (beat)
            {
                text += form == 0 ? " NEAR ZERO BEAT" : (form == 1 ? " ZERO BEAT" : " ZB!");
            }

            if (moved)
            {
                text += form == 0 ? " BASELINE MOVED" : (form == 1 ? " BASE MOVED" : " BM!");
            }

            if (hold)
            {
                text += form == 2 ? " H" : " HOLD";
            }

            return text;
        }
    }
}
