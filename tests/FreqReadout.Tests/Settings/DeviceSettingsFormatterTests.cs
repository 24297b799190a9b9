using System.Text;
using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Link;
using FreqReadout.Settings;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// DeviceSettingsFormatter: every key once in a fixed order, numbers the same in every culture, within one link
/// frame's payload, and read back by the parser to the very same values.
/// </summary>
public sealed class DeviceSettingsFormatterTests
{
    private static string Format(DeviceSettingsValues v)
    {
        Assert.True(DeviceSettingsFormatter.TryFormat(v, out string? text, out string? error), error);
        Assert.NotNull(text);
        return text!;
    }

    [Fact]
    public void The_defaults_are_written_as_the_page_shows_them()
    {
        Assert.Equal(
            "# freqreadout settings 1\n" +
            "gate_s=0.1\n" +
            "estimator=regression\n" +
            "threshold_sigma=5\n" +
            "polarity=normal\n" +
            "signal=search\n" +
            "beat_side=none\n" +
            "search_hz=0\n" +
            "tempco_ppm_per_k=0\n" +
            "link=capture\n" +
            "read_rate_hz=1000\n" +
            "stall_ms=50\n",
            Format(new DeviceSettingsValues()));
    }

    [Fact]
    public void Numbers_are_written_the_same_in_a_comma_culture()
    {
        var v = new DeviceSettingsValues { GateSeconds = 0.000001, ThresholdSigma = 12.34, SearchHz = 1234567.89, TempcoPpmPerK = -0.5, Signal = SignalKind.Beat, BeatSide = BeatSide.Above };
        string invariant = Format(v);
        Assert.Equal(invariant, CommaCulture.Run(() => Format(v)));
        Assert.Contains("\ngate_s=0.000001\n", invariant);
        Assert.Contains("\nthreshold_sigma=12.34\n", invariant);
        Assert.Contains("\nsearch_hz=1234567.89\n", invariant);
        Assert.Contains("\ntempco_ppm_per_k=-0.5\n", invariant);
    }

    [Theory]
    [InlineData("gate_s")]
    [InlineData("threshold_sigma")]
    [InlineData("read_rate_hz")]
    [InlineData("beat_side")]
    [InlineData("estimator")]
    public void Invalid_values_are_not_written(string key)
    {
        var v = new DeviceSettingsValues();
        switch (key)
        {
            case "gate_s": v.GateSeconds = 0.1 + 0.2; break;        // off the 1 us steps
            case "threshold_sigma": v.ThresholdSigma = double.NaN; break;
            case "read_rate_hz": v.ReadRateHz = 50; break;
            case "beat_side": v.Signal = SignalKind.Beat; break;     // beat without a side
            case "estimator": v.Estimator = EstimatorKind.SnapshotRegression; break;
        }

        Assert.False(DeviceSettingsFormatter.TryFormat(v, out string? text, out string? error));
        Assert.Null(text);
        Assert.Contains(key, error);
        Assert.False(DeviceSettingsFormatter.TryFormat(null!, out _, out _));
    }

    /// <summary>Per key, the values whose text is longest: the ends of each range and one step inside them, every word.</summary>
    private static IEnumerable<Action<DeviceSettingsValues>> Candidates(int keyIndex)
    {
        switch (keyIndex)
        {
            case 0: return new[] { 0.000001, 0.000002, 86400, 86399.999999, 9999.999999 }.Select(x => (Action<DeviceSettingsValues>)(v => v.GateSeconds = x));
            case 1: return new[] { EstimatorKind.Reciprocal, EstimatorKind.Regression }.Select(x => (Action<DeviceSettingsValues>)(v => v.Estimator = x));
            case 2: return new[] { 2.01, 1000, 999.99, 99.99 }.Select(x => (Action<DeviceSettingsValues>)(v => v.ThresholdSigma = x));
            case 3: return new[] { Polarity.Normal, Polarity.Inverted }.Select(x => (Action<DeviceSettingsValues>)(v => v.Polarity = x));
            case 4: return new[] { SignalKind.Search, SignalKind.Beat }.Select(x => (Action<DeviceSettingsValues>)(v => { v.Signal = x; v.BeatSide = BeatSide.Above; }));
            case 5: return new[] { BeatSide.None, BeatSide.Above, BeatSide.Below }.Select(x => (Action<DeviceSettingsValues>)(v => v.BeatSide = x));
            case 6: return new[] { 0, 0.01, 1e12, 999999999999.99, 99999999999.99 }.Select(x => (Action<DeviceSettingsValues>)(v => v.SearchHz = x));
            case 7: return new[] { -1000, -999.99, 999.99, 1000, -99.99 }.Select(x => (Action<DeviceSettingsValues>)(v => v.TempcoPpmPerK = x));
            case 8: return new[] { LinkMode.Off, LinkMode.Readings, LinkMode.Capture }.Select(x => (Action<DeviceSettingsValues>)(v => v.LinkMode = x));
            case 9: return new[] { 100, 999, 2000, 1999 }.Select(x => (Action<DeviceSettingsValues>)(v => v.ReadRateHz = x));
            case 10: return new[] { 10, 9999, 10000 }.Select(x => (Action<DeviceSettingsValues>)(v => v.StallLimitMilliseconds = x));
            default: throw new ArgumentOutOfRangeException(nameof(keyIndex));
        }
    }

    // The lines are independent, so the longest text is the magic line plus each key's longest line; that text is
    // written, read back, and fits one link frame's payload (LinkFrameEncoder.MaxPayloadBytes = 240).
    [Fact]
    public void The_longest_formatting_fits_one_link_frame()
    {
        var longest = new DeviceSettingsValues();
        for (int k = 0; k < SettingsKeys.Count; k++)
        {
            int best = -1;
            Action<DeviceSettingsValues>? bestSet = null;
            foreach (Action<DeviceSettingsValues> set in Candidates(k))
            {
                var v = new DeviceSettingsValues();
                set(v);
                Assert.True(v.TryValidate(out string? error), $"candidate for {SettingsKeys.KeyAt(k)}: {error}");
                int length = DeviceSettingsFormatter.ValueText(v, k).Length;
                if (length > best)
                {
                    best = length;
                    bestSet = set;
                }
            }

            bestSet!(longest);
        }

        string text = Format(longest);
        Assert.Equal(
            "# freqreadout settings 1\ngate_s=86399.999999\nestimator=reciprocal\nthreshold_sigma=999.99\npolarity=inverted\n" +
            "signal=search\nbeat_side=above\nsearch_hz=999999999999.99\ntempco_ppm_per_k=-999.99\nlink=readings\nread_rate_hz=2000\nstall_ms=10000\n",
            text);
        int bytes = Encoding.ASCII.GetByteCount(text);
        Assert.True(bytes <= LinkFrameEncoder.MaxPayloadBytes, $"longest settings text is {bytes} bytes, a frame payload holds {LinkFrameEncoder.MaxPayloadBytes}");
        Assert.Equal(SettingsKeys.MaxTextBytes, LinkFrameEncoder.MaxPayloadBytes);

        var back = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        Assert.True(DeviceSettingsParser.TryParse(text, back, problems));
        Assert.Equal(0, problems.TotalCount);
        Assert.True(SettingsTestValues.Same(longest, back));
    }

    // Any valid values: written as ASCII within 240 bytes, every key once in order, read back with no problem to the
    // very same values, and written again to the same text.
    [Property(MaxTest = 1000)]
    public Property Valid_values_round_trip_exactly() =>
        Prop.ForAll(SettingsTestValues.Valid().ToArbitrary(), v =>
        {
            if (!v.TryValidate(out string? invalid))
            {
                return false.Label("generator made invalid values: " + invalid + " " + SettingsTestValues.Describe(v));
            }

            bool written = DeviceSettingsFormatter.TryFormat(v, out string? text, out _);
            var back = new DeviceSettingsValues();
            var problems = new SettingsProblemList();
            bool read = DeviceSettingsParser.TryParse(text, back, problems);
            DeviceSettingsFormatter.TryFormat(back, out string? again, out _);
            string[] lines = text!.Split('\n');
            bool inOrder = lines.Length == SettingsKeys.Count + 2 && lines[0] == SettingsKeys.MagicLine && lines[^1].Length == 0
                && Enumerable.Range(0, SettingsKeys.Count).All(k => lines[k + 1].StartsWith(SettingsKeys.KeyAt(k) + "=", StringComparison.Ordinal));
            bool ascii = text.All(c => c >= ' ' && c <= '~' || c == '\n');
            return (written && read && problems.TotalCount == 0 && SettingsTestValues.Same(v, back) && again == text && inOrder && ascii
                    && Encoding.ASCII.GetByteCount(text) <= SettingsKeys.MaxTextBytes)
                .Label(SettingsTestValues.Describe(v) + "\n" + text + "\nback: " + SettingsTestValues.Describe(back));
        });
}
