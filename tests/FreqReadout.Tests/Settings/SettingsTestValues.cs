using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Settings;
using FsCheck;
using FsCheck.Fluent;

namespace FreqReadout.Tests.Settings;

/// <summary>Generators and comparison of settings values for the settings tests.</summary>
internal static class SettingsTestValues
{
    /// <summary>Every property of the object, in key order, as "key=value" with values written by .NET ("R" doubles), for messages and comparisons.</summary>
    public static string Describe(DeviceSettingsValues v) =>
        FormattableString.Invariant($"gate_s={v.GateSeconds:R} estimator={v.Estimator} threshold_sigma={v.ThresholdSigma:R} polarity={v.Polarity} signal={v.Signal} beat_side={v.BeatSide} search_hz={v.SearchHz:R} tempco_ppm_per_k={v.TempcoPpmPerK:R} link={v.LinkMode} read_rate_hz={v.ReadRateHz} stall_ms={v.StallLimitMilliseconds}");

    /// <summary>True when every value is equal (doubles by ==).</summary>
    public static bool Same(DeviceSettingsValues a, DeviceSettingsValues b) =>
        a.GateSeconds == b.GateSeconds && a.Estimator == b.Estimator && a.ThresholdSigma == b.ThresholdSigma && a.Polarity == b.Polarity
        && a.Signal == b.Signal && a.BeatSide == b.BeatSide && a.SearchHz == b.SearchHz && a.TempcoPpmPerK == b.TempcoPpmPerK
        && a.LinkMode == b.LinkMode && a.ReadRateHz == b.ReadRateHz && a.StallLimitMilliseconds == b.StallLimitMilliseconds;

    /// <summary>A scaled integer in [lo, hi], often one of the ends (the ranges of docs/settings-format.md).</summary>
    private static Gen<long> Scaled(long lo, long hi) =>
        Gen.Frequency(
            (1, Gen.Elements(lo, hi, lo + 1, hi - 1)),
            (4, from a in Gen.Choose(0, int.MaxValue) from b in Gen.Choose(0, int.MaxValue) select lo + (long)((((ulong)a << 31) | (uint)b) % (ulong)(hi - lo + 1))));

    /// <summary>Valid values: every key within its range on its steps, and the rules between keys kept.</summary>
    public static Gen<DeviceSettingsValues> Valid() =>
        from gate in Scaled(1, 86_400_000_000)        // [1e-6, 86400] s in 1 us steps
        from estimator in Gen.Elements(EstimatorKind.Reciprocal, EstimatorKind.Regression)
        from threshold in Scaled(201, 100_000)        // (2, 1000] sigma in 0.01 steps: above the default hysteresis of 2
        from polarity in Gen.Elements(Polarity.Normal, Polarity.Inverted)
        from signal in Gen.Elements(SignalKind.Search, SignalKind.Beat)
        from side in signal == SignalKind.Beat ? Gen.Elements(BeatSide.Above, BeatSide.Below) : Gen.Elements(BeatSide.None, BeatSide.Above, BeatSide.Below)
        from search in Gen.Frequency((1, Gen.Constant(0L)), (3, Scaled(0, 100_000_000_000_000)))
        from tempco in Gen.Frequency((1, Gen.Constant(0L)), (3, Scaled(-100_000, 100_000)))
        from link in Gen.Elements(LinkMode.Off, LinkMode.Readings, LinkMode.Capture)
        from rate in Gen.Choose(100, 2000)
        from stall in Gen.Frequency((1, Gen.Elements(10, 10_000)), (3, Gen.Choose(10, 10_000)))
        select new DeviceSettingsValues
        {
            GateSeconds = SettingsDecimal.ToValue(gate, 6),
            Estimator = estimator,
            ThresholdSigma = SettingsDecimal.ToValue(threshold, 2),
            Polarity = polarity,
            Signal = signal,
            BeatSide = side,
            SearchHz = SettingsDecimal.ToValue(search, 2),
            TempcoPpmPerK = signal == SignalKind.Beat && search == 0 ? 0 : SettingsDecimal.ToValue(tempco, 2),
            LinkMode = link,
            ReadRateHz = rate,
            StallLimitMilliseconds = stall,
        };
}
