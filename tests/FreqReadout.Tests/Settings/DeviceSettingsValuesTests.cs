using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Readout;
using FreqReadout.Settings;

namespace FreqReadout.Tests.Settings;

/// <summary>DeviceSettingsValues: defaults and ranges owned by CounterSettings and ReadoutSettings, applied to them and read back.</summary>
public sealed class DeviceSettingsValuesTests
{
    [Fact]
    public void Defaults_are_the_counter_and_readout_defaults_and_are_valid()
    {
        var v = new DeviceSettingsValues();
        var counter = new CounterSettings();
        var readout = new ReadoutSettings();
        Assert.Equal(counter.GateSeconds, v.GateSeconds);
        Assert.Equal(counter.Estimator, v.Estimator);
        Assert.Equal(readout.ThresholdSigma, v.ThresholdSigma);
        Assert.Equal(readout.Polarity, v.Polarity);
        Assert.Equal(readout.Signal, v.Signal);
        Assert.Equal(readout.BeatSide, v.BeatSide);
        Assert.Equal(readout.SearchHz, v.SearchHz);
        Assert.Equal(readout.TempcoPpmPerK, v.TempcoPpmPerK);
        Assert.Equal(LinkMode.Capture, v.LinkMode);
        Assert.Equal(1000, v.ReadRateHz);
        Assert.Equal(50, v.StallLimitMilliseconds);
        Assert.True(v.TryValidate(out string? error), error);
    }

    // The ranges are the owners': a value at the edge of CounterSettings' / ReadoutSettings' range is valid here
    // exactly when it is valid there.
    [Theory]
    [InlineData(CounterSettings.MinGateSeconds, true)]
    [InlineData(CounterSettings.MaxGateSeconds, true)]
    [InlineData(CounterSettings.MaxGateSeconds + 0.000001, false)]
    [InlineData(0.0, false)]
    public void The_gate_range_is_the_counters(double gate, bool valid)
    {
        var counter = new CounterSettings { ClockHz = 1e6, GateSeconds = gate };
        Assert.Equal(valid, counter.TryValidate(out _));
        var v = new DeviceSettingsValues { GateSeconds = gate };
        Assert.Equal(valid, v.TryValidate(out string? error));
        if (!valid)
        {
            counter.TryValidate(out string? counterError);
            Assert.Equal(counterError, error);
        }
    }

    [Theory]
    [InlineData(1000.0, -1000.0, 1e12, true)]
    [InlineData(1000.01, 0.0, 0.0, false)]
    [InlineData(5.0, -1000.01, 0.0, false)]
    [InlineData(5.0, 0.0, 1.00000000001e12, false)]
    [InlineData(2.0, 0.0, 0.0, false)] // not above the default hysteresis_sigma (2)
    public void The_readout_ranges_are_the_readouts(double threshold, double tempco, double searchHz, bool valid)
    {
        var readout = new ReadoutSettings { ThresholdSigma = threshold, TempcoPpmPerK = tempco, SearchHz = searchHz };
        Assert.Equal(valid, readout.TryValidate(out string? readoutError));
        var v = new DeviceSettingsValues { ThresholdSigma = threshold, TempcoPpmPerK = tempco, SearchHz = searchHz };
        Assert.Equal(valid, v.TryValidate(out string? error));
        Assert.Equal(readoutError, error);
    }

    [Theory]
    [InlineData(99, 50, "read_rate_hz must be an integer in [100, 2000]")]
    [InlineData(2001, 50, "read_rate_hz must be an integer in [100, 2000]")]
    [InlineData(1000, 9, "stall_ms must be an integer in [10, 10000]")]
    [InlineData(1000, 10001, "stall_ms must be an integer in [10, 10000]")]
    public void The_read_loop_ranges_are_named_with_their_key(int rate, int stall, string expected)
    {
        var v = new DeviceSettingsValues { ReadRateHz = rate, StallLimitMilliseconds = stall };
        Assert.False(v.TryValidate(out string? error));
        Assert.Equal(expected, error);
        Assert.True(new DeviceSettingsValues { ReadRateHz = 100, StallLimitMilliseconds = 10 }.TryValidate(out _));
        Assert.True(new DeviceSettingsValues { ReadRateHz = 2000, StallLimitMilliseconds = 10000 }.TryValidate(out _));
    }

    [Fact]
    public void Values_between_the_steps_of_the_text_are_not_valid()
    {
        Assert.False(new DeviceSettingsValues { GateSeconds = 0.1000005 }.TryValidate(out string? gate));
        Assert.Equal("gate_s must be a whole number of steps of 0.000001 (the settings text keeps 6 decimal places)", gate);
        Assert.False(new DeviceSettingsValues { TempcoPpmPerK = 0.005 }.TryValidate(out string? tempco));
        Assert.StartsWith("tempco_ppm_per_k must be a whole number of steps of 0.01", tempco);
        Assert.False(new DeviceSettingsValues { LinkMode = (LinkMode)7 }.TryValidate(out string? link));
        Assert.Equal("link must be off, readings or capture", link);
        Assert.False(new DeviceSettingsValues { Polarity = (Polarity)5 }.TryValidate(out _));
        Assert.False(new DeviceSettingsValues { Signal = (SignalKind)5 }.TryValidate(out _));
        Assert.False(new DeviceSettingsValues { BeatSide = (BeatSide)5 }.TryValidate(out _));
    }

    [Fact]
    public void ApplyTo_writes_only_its_settings_and_TryTakeFrom_reads_them_back()
    {
        var v = new DeviceSettingsValues
        {
            GateSeconds = 0.025, Estimator = EstimatorKind.Reciprocal, ThresholdSigma = 7.5, Polarity = Polarity.Inverted,
            Signal = SignalKind.Beat, BeatSide = BeatSide.Below, SearchHz = 95000.5, TempcoPpmPerK = -3.25,
            LinkMode = LinkMode.Capture, ReadRateHz = 500, StallLimitMilliseconds = 200,
        };
        var counter = new CounterSettings { ClockHz = 80e6, Prescale = 4, MainsHz = 50 };
        var readout = new ReadoutSettings { HysteresisSigma = 1.5, BaselineSeconds = 7 };
        v.ApplyTo(counter, readout);
        Assert.Equal(0.025, counter.GateSeconds);
        Assert.Equal(EstimatorKind.Reciprocal, counter.Estimator);
        Assert.Equal(SignalKind.Beat, counter.Signal);
        Assert.Equal(80e6, counter.ClockHz);
        Assert.Equal(4, counter.Prescale);
        Assert.Equal(50, counter.MainsHz);
        Assert.Equal(7.5, readout.ThresholdSigma);
        Assert.Equal(Polarity.Inverted, readout.Polarity);
        Assert.Equal(SignalKind.Beat, readout.Signal);
        Assert.Equal(BeatSide.Below, readout.BeatSide);
        Assert.Equal(95000.5, readout.SearchHz);
        Assert.Equal(-3.25, readout.TempcoPpmPerK);
        Assert.Equal(1.5, readout.HysteresisSigma);
        Assert.Equal(7, readout.BaselineSeconds);
        Assert.True(counter.TryValidate(out string? ce), ce);
        Assert.True(readout.TryValidate(out string? re), re);

        var back = new DeviceSettingsValues { LinkMode = LinkMode.Capture, ReadRateHz = 500, StallLimitMilliseconds = 200 };
        Assert.True(back.TryTakeFrom(counter, readout, out string? error), error);
        Assert.True(SettingsTestValues.Same(v, back), SettingsTestValues.Describe(back));
    }

    [Fact]
    public void TryTakeFrom_rounds_to_the_steps_and_refuses_what_is_not_valid_leaving_the_values_unchanged()
    {
        var v = new DeviceSettingsValues { LinkMode = LinkMode.Readings };
        var counter = new CounterSettings { GateSeconds = 0.1 + 0.2 };            // 0.30000000000000004
        var readout = new ReadoutSettings { ThresholdSigma = 6.666, TempcoPpmPerK = -0.125 };
        Assert.True(v.TryTakeFrom(counter, readout, out string? error), error);
        Assert.Equal(0.3, v.GateSeconds);
        Assert.Equal(6.67, v.ThresholdSigma);
        Assert.Equal(-0.13, v.TempcoPpmPerK);                                    // half away from zero
        Assert.Equal(LinkMode.Readings, v.LinkMode);

        var before = new DeviceSettingsValues();
        before.CopyFrom(v);
        Assert.False(v.TryTakeFrom(new CounterSettings { GateSeconds = double.NaN }, new ReadoutSettings(), out error));
        Assert.StartsWith("gate seconds must be in", error);
        Assert.False(v.TryTakeFrom(new CounterSettings(), new ReadoutSettings { SearchHz = 1e300 }, out error));
        Assert.StartsWith("search_hz must be in [0, 1e12]", error);
        Assert.False(v.TryTakeFrom(new CounterSettings(), new ReadoutSettings { Signal = SignalKind.Beat, BeatSide = BeatSide.Above }, out error));
        Assert.Equal("signal: the counter and the readout settings disagree", error);
        Assert.False(v.TryTakeFrom(null!, new ReadoutSettings(), out _));
        Assert.True(SettingsTestValues.Same(before, v));
    }
}
