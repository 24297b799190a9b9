using System.Text.Json;
using FreqReadout.Settings;

namespace FreqReadout.Tests.Commands;

/// <summary>
/// <c>calibrate --settings-out</c> writes a device settings file the device's own parser reads without a problem,
/// carrying the fitted tempco (the JSON's, rounded to the format's 2 decimals) and the capture's signal and search
/// frequency; an output that is the capture itself is refused.
/// </summary>
[Collection(ConsoleCollection.Name)]
public sealed class CalibrateSettingsOutTests : IClassFixture<SimulatedDemoCapture>
{
    private readonly SimulatedDemoCapture _sim;

    public CalibrateSettingsOutTests(SimulatedDemoCapture sim)
    {
        _sim = sim;
    }

    [Fact]
    public void The_settings_file_carries_the_fitted_tempco_and_parses_cleanly_with_the_device_parser()
    {
        string file = Path.Combine(_sim.Dir, "calibrated.settings");
        var (exit, stdout, stderr) = ConsoleCapture.Run("calibrate", _sim.CapturePath, "--json", "--settings-out", file);
        Assert.True(exit == 0, stderr);
        double fitted = JsonDocument.Parse(stdout).RootElement.GetProperty("tempco_ppm_per_k").GetDouble();

        var values = new DeviceSettingsValues();
        var problems = new SettingsProblemList();
        Assert.True(DeviceSettingsParser.TryParse(File.ReadAllText(file), values, problems));
        Assert.Equal(0, problems.TotalCount);
        Assert.Equal(Math.Round(fitted, 2, MidpointRounding.AwayFromZero), values.TempcoPpmPerK, 9);
        Assert.Equal(100_000, values.SearchHz);    // the demo capture's search_hz
        Assert.Equal(FreqReadout.Counting.SignalKind.Search, values.Signal);
        Assert.Contains("record --port DEV --send-settings", stderr);
    }

    [Fact]
    public void The_capture_itself_is_never_overwritten()
    {
        byte[] before = File.ReadAllBytes(_sim.CapturePath);
        var (exit, _, stderr) = ConsoleCapture.Run("calibrate", _sim.CapturePath, "--settings-out", _sim.CapturePath);
        Assert.Equal(2, exit);
        Assert.Contains("never writes over its own input", stderr);
        Assert.Equal(before, File.ReadAllBytes(_sim.CapturePath));
    }
}
