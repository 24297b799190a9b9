using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;

namespace FreqReadout.Tests.Tracking;

/// <summary>Each bad setting gives its own error naming the setting and its allowed range.</summary>
public class ReadoutSettingsTests
{
    public static IEnumerable<object[]> BadSettings()
    {
        object[] Case(string name, string range, Action<ReadoutSettings> set) => new object[] { name, range, set };
        yield return Case("signal", "search or beat", s => s.Signal = (SignalKind)7);
        yield return Case("beat_side", "above or below", s => s.Signal = SignalKind.Beat);
        yield return Case("search_hz", "[0, 1e12]", s => s.SearchHz = -1);
        yield return Case("settling_s", "[0, 3600]", s => s.SettlingSeconds = 4000);
        yield return Case("baseline_s", "(0, 600]", s => s.BaselineSeconds = 0);
        yield return Case("baseline_max_gates", "[8, 8192]", s => s.BaselineMaxGates = 4);
        yield return Case("outlier_sigma", "[2, 20]", s => s.OutlierSigma = 1);
        yield return Case("noise_window_gates", "[16, 4096]", s => s.NoiseWindowGates = 10_000);
        yield return Case("noise_floor_hz", "(0, 1e6]", s => s.NoiseFloorHz = 0);
        yield return Case("tracker_memory_s", "[0.4, 120]", s => s.TrackerMemorySeconds = double.NaN);
        yield return Case("tracker_memory_s", "[0.4, 120]", s => s.TrackerMemorySeconds = 0.3);
        yield return Case("tracker_delay_gates", "[0, 1000]", s => s.TrackerDelayGates = -1);
        yield return Case("guard_sigma", "(0, 100]", s => s.GuardSigma = 0);
        yield return Case("threshold_sigma", "[1, 1000]", s => s.ThresholdSigma = 0.5);
        yield return Case("hysteresis_sigma", "[0, threshold_sigma)", s => s.HysteresisSigma = 5);
        yield return Case("min_duration_s", "[0, 60]", s => s.MinDurationSeconds = double.PositiveInfinity);
        yield return Case("release_s", "[0, 60]", s => s.ReleaseSeconds = -0.1);
        yield return Case("unclear_band_sigma", "[0, 1000]", s => s.UnclearBandSigma = -1);
        yield return Case("polarity", "normal or inverted", s => s.Polarity = (Polarity)5);
        yield return Case("persistent_shift_s", "[1, 86400]", s => s.PersistentShiftSeconds = 0.5);
        yield return Case("beat_floor_hz", "[0, 1e9]", s => s.BeatFloorHz = -5);
        yield return Case("tempco_ppm_per_k", "[-1000, 1000]", s => s.TempcoPpmPerK = 5000);
        yield return Case("tempco_ppm_per_k", "search_hz > 0", s => { s.Signal = SignalKind.Beat; s.BeatSide = BeatSide.Above; s.TempcoPpmPerK = -8; });
    }

    [Theory]
    [MemberData(nameof(BadSettings))]
    public void Each_bad_setting_is_named_with_its_range(string name, string range, Action<ReadoutSettings> set)
    {
        var settings = new ReadoutSettings();
        set(settings);
        Assert.False(settings.TryValidate(out string error));
        Assert.StartsWith(name + " ", error);
        Assert.Contains(range, error);

        ArgumentException ex = Assert.Throws<ArgumentException>(() => new ReadoutPipeline(settings));
        Assert.Equal(error, ex.Message);
    }

    [Fact]
    public void Defaults_are_valid_and_documented_values()
    {
        var s = new ReadoutSettings();
        Assert.True(s.TryValidate(out string error), error);
        Assert.Null(error);
        Assert.Equal(5.0, s.ThresholdSigma);
        Assert.Equal(2.0, s.HysteresisSigma);
        Assert.Equal(30.0, s.PersistentShiftSeconds);
        Assert.Equal(Polarity.Normal, s.Polarity);
    }

    [Fact]
    public void Each_error_is_distinct()
    {
        var errors = BadSettings().Select(c =>
        {
            var s = new ReadoutSettings();
            ((Action<ReadoutSettings>)c[2])(s);
            s.TryValidate(out string e);
            return e;
        }).ToList();
        Assert.Equal(errors.Count, errors.Distinct().Count());
    }

    [Fact]
    public void Clone_copies_every_setting()
    {
        var s = new ReadoutSettings();
        int k = 0;
        foreach (var p in typeof(ReadoutSettings).GetProperties())
        {
            k++;
            object value = p.PropertyType == typeof(double) ? 1000.5 + k
                : p.PropertyType == typeof(int) ? 100 + k
                : Enum.ToObject(p.PropertyType, 1);
            p.SetValue(s, value);
        }

        ReadoutSettings c = s.Clone();
        foreach (var p in typeof(ReadoutSettings).GetProperties())
        {
            Assert.Equal(p.GetValue(s), p.GetValue(c));
        }
    }
}
