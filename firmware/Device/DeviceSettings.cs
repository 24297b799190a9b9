using FreqReadout.Counting;
using FreqReadout.Readout;
using FreqReadout.Settings;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Everything the device loop needs: the counter and readout settings the host tools use too,
    /// plus the board's timer and counter widths and the loop's work limits.
    /// </summary>
    public sealed class DeviceSettings
    {
        public DeviceSettings(CounterSettings counter, ReadoutSettings readout)
        {
            Counter = counter;
            Readout = readout;
        }

        /// <summary>Counting settings (clock, prescaler, gate, estimator, guards).</summary>
        public CounterSettings Counter { get; }

        /// <summary>Baseline, tracker and detection settings.</summary>
        public ReadoutSettings Readout { get; }

        /// <summary>Edges or pulse-counter snapshots. Default edges.</summary>
        public InputKind Input { get; set; } = InputKind.Edges;

        /// <summary>Width of the timer that stamps edges or snapshots: 16, 24, 32 or 64. Default 32.</summary>
        public int TimerBits { get; set; } = 32;

        /// <summary>Width of the pulse counter (snapshots): 16, 24, 32 or 64. Default 32.</summary>
        public int CountBits { get; set; } = 32;

        /// <summary>At most this many edges are taken per <see cref="DeviceLoop.Step"/> (&gt;= 1), so buttons and the display stay responsive. Default 256.</summary>
        public int MaxEdgesPerStep { get; set; } = 256;

        /// <summary>
        /// The display is refreshed at most this often, seconds of capture time ([0, 60]; 0 = every gate),
        /// and at once when the state or the target class changes. The display lines are strings, so
        /// this bounds the device's per-second allocations whatever the gate rate. Default 0.5 s.
        /// </summary>
        public double DisplayIntervalSeconds { get; set; } = 0.5;

        /// <summary>
        /// Pulse-counter reads a second when the loop is paced by a clock (settings key read_rate_hz: 100 to 2000). Default
        /// 1000: the per-gate cost table in hardware-notes/device-budget.md says whether a board holds it.
        /// </summary>
        public int ReadRateHz { get; set; } = DeviceSettingsValues.DefaultReadRateHz;

        /// <summary>A gap between two paced reads longer than this is a stall of the loop (counted, never a dropout), ms (settings key stall_ms: 10 to 10000). Default 50.</summary>
        public int StallLimitMilliseconds { get; set; } = DeviceSettingsValues.DefaultStallLimitMilliseconds;

        /// <summary>
        /// The span a pulse-counter read can be off by when it races the driver's overflow interrupt (32767 with the ESP32
        /// driver); 0 turns the mending off. Needs <see cref="CountBits"/> = 64 (the driver's extended count). Default 0.
        /// </summary>
        public long CountWrapSpan { get; set; }

        /// <summary>With a link: a status frame this often, seconds of capture time ([0.1, 60]). Default 1.</summary>
        public double StatusIntervalSeconds { get; set; } = 1.0;

        /// <summary>With a link: the capture header again this often, so a PC that starts listening late can begin, seconds ([0.5, 600]). Default 5.</summary>
        public double HeaderIntervalSeconds { get; set; } = 5.0;

        /// <summary>With a link: what is sent (settings key link). Default capture: every read, reading and event, status and headers.</summary>
        public LinkMode Link { get; set; } = LinkMode.Capture;

        /// <summary>A number that changes at every start of the device (a stored counter, or drawn at start); the PC starts a new capture when it changes.</summary>
        public uint BootId { get; set; }

        /// <summary>The settings text in force (docs/settings-format.md), reported by its check in the status frame; null when none.</summary>
        public string SettingsText { get; set; }

        /// <summary>Stored settings that were invalid and fell back to their defaults (reported in the status frame).</summary>
        public int SettingsProblems { get; set; }

        /// <summary>
        /// Reads a settings text (docs/settings-format.md) with the shared parser and puts its values in force: gate,
        /// estimator, signal, beat side, search frequency, tempco, threshold and polarity into <see cref="Counter"/> and
        /// <see cref="Readout"/>, and link, read rate and stall limit here. A bad value falls back to its default and is
        /// counted in <see cref="SettingsProblems"/>; a text without the magic line changes nothing (and is counted as
        /// one problem). <see cref="SettingsText"/> becomes the canonical text of the values now in force (what the
        /// status frame's check is computed from). Allocates (rare: at start and when the PC sends settings).
        /// </summary>
        /// <param name="text">The settings text.</param>
        /// <param name="problems">Filled with what was wrong (may be null).</param>
        /// <returns>True when the text was a settings text of this version and its values are in force.</returns>
        public bool TryApplyText(string text, SettingsProblemList problems)
        {
            if (problems == null)
            {
                problems = new SettingsProblemList();
            }

            DeviceSettingsValues values = new DeviceSettingsValues();
            if (!DeviceSettingsParser.TryParse(text, values, problems))
            {
                SettingsProblems = problems.TotalCount;
                return false;
            }

            values.ApplyTo(Counter, Readout);
            Link = values.LinkMode;
            ReadRateHz = values.ReadRateHz;
            StallLimitMilliseconds = values.StallLimitMilliseconds;
            SettingsProblems = problems.TotalCount;
            string canonical;
            string error;
            SettingsText = DeviceSettingsFormatter.TryFormat(values, out canonical, out error) ? canonical : null;
            return true;
        }

        /// <summary>
        /// Sets <see cref="SettingsText"/> to the canonical settings text of what is in force now (the counter and readout
        /// values rounded to the format's steps, and link, read rate and stall limit), so that the status frame's check
        /// and the settings frame describe the device even when no settings text was ever applied. False, and
        /// <see cref="SettingsText"/> unchanged, when a value in force is outside what the format can hold.
        /// </summary>
        public bool TryDescribeInForce()
        {
            DeviceSettingsValues values = new DeviceSettingsValues();
            values.LinkMode = Link;
            values.ReadRateHz = ReadRateHz;
            values.StallLimitMilliseconds = StallLimitMilliseconds;
            string error;
            string text;
            if (!values.TryTakeFrom(Counter, Readout, out error) || !DeviceSettingsFormatter.TryFormat(values, out text, out error))
            {
                return false;
            }

            SettingsText = text;
            return true;
        }

        /// <summary>Checks every setting; the first bad one is named with its allowed range.</summary>
        public bool TryValidate(out string error)
        {
            if (Counter == null || Readout == null)
            {
                error = "counter and readout settings are required";
                return false;
            }

            if (!Counter.TryValidate(out error))
            {
                return false;
            }

            if (!Readout.TryValidate(out error))
            {
                return false;
            }

            if (!IsWidth(TimerBits))
            {
                error = "timer bits must be 16, 24, 32 or 64";
                return false;
            }

            if (!IsWidth(CountBits))
            {
                error = "count bits must be 16, 24, 32 or 64";
                return false;
            }

            if (!(DisplayIntervalSeconds >= 0 && DisplayIntervalSeconds <= 60))
            {
                error = "display interval seconds must be in [0, 60]";
                return false;
            }

            if (!DeviceSettingsValues.TryCheckReadRateHz(ReadRateHz, out error) || !DeviceSettingsValues.TryCheckStallLimitMilliseconds(StallLimitMilliseconds, out error)
                || !DeviceSettingsValues.TryCheckLinkMode(Link, out error))
            {
                return false;
            }

            if (CountWrapSpan != 0 && (CountWrapSpan < 2 || CountBits != 64))
            {
                error = "count wrap span must be 0 (off) or at least 2 with count bits 64";
                return false;
            }

            if (!(StatusIntervalSeconds >= 0.1 && StatusIntervalSeconds <= 60))
            {
                error = "status interval seconds must be in [0.1, 60]";
                return false;
            }

            if (!(HeaderIntervalSeconds >= 0.5 && HeaderIntervalSeconds <= 600))
            {
                error = "header interval seconds must be in [0.5, 600]";
                return false;
            }

            if (MaxEdgesPerStep < 1)
            {
                error = "max edges per step must be an integer >= 1";
                return false;
            }

            error = null;
            return true;
        }

        private static bool IsWidth(int bits)
        {
            return bits == 16 || bits == 24 || bits == 32 || bits == 64;
        }
    }
}
