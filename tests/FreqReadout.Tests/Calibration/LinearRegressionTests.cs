using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Calibration;

namespace FreqReadout.Tests.Calibration;

/// <summary>The straight-line fit behind calibrate, against NIST's certified values.</summary>
public class LinearRegressionTests
{
    private static (double[] X, double[] Y) Norris()
    {
        var x = new List<double>();
        var y = new List<double>();
        foreach (string line in File.ReadLines(Path.Combine(AppContext.BaseDirectory, "Data", "Calibration", "nist-strd-norris.txt")))
        {
            if (line.StartsWith('#') || line.Trim().Length == 0)
            {
                continue;
            }

            string[] parts = line.Split(' ', StringSplitOptions.RemoveEmptyEntries);
            y.Add(double.Parse(parts[0], CultureInfo.InvariantCulture));
            x.Add(double.Parse(parts[1], CultureInfo.InvariantCulture));
        }

        return (x.ToArray(), y.ToArray());
    }

    [Fact]
    public void Norris_certified_values()
    {
        // NIST StRD Norris (Norris, J., NIST, Calibration of Ozone Monitors), certified values; tolerance:
        // 1e-9 relative (a lower-difficulty dataset; NIST's certified values carry 15 digits).
        (double[] x, double[] y) = Norris();
        Assert.Equal(36, x.Length);
        Assert.True(LinearRegression.TryFit(x, y, out LineFit fit, out string? error), error);
        Assert.Equal(-0.262323073774029, fit.Intercept, 1e-9);
        Assert.Equal(1.00211681802045, fit.Slope, 1e-9);
        Assert.Equal(0.232818234301152, fit.InterceptStandardError, 1e-9);
        Assert.Equal(0.429796848199937E-03, fit.SlopeStandardError, 1e-12);
        Assert.Equal(0.884796396144373, fit.ResidualStandardDeviation, 1e-9);
        Assert.Equal(0.999993745883712, fit.RSquared, 1e-12);
    }

    [Fact]
    public void Too_few_points_or_constant_x_give_an_error()
    {
        Assert.False(LinearRegression.TryFit(new[] { 1.0, 2.0 }, new[] { 1.0, 2.0 }, out _, out string? e1));
        Assert.Contains("at least 3", e1);
        Assert.False(LinearRegression.TryFit(new[] { 1.0, 1.0, 1.0 }, new[] { 1.0, 2.0, 3.0 }, out _, out string? e2));
        Assert.Contains("all x values are equal", e2);
    }

    [Theory]
    [InlineData(SignalKind.Search, BeatSide.None, 0.0)]
    [InlineData(SignalKind.Beat, BeatSide.Above, 100_000.0)]
    [InlineData(SignalKind.Beat, BeatSide.Below, 100_000.0)]
    public void Tempco_fit_recovers_a_known_tempco_on_either_side(SignalKind signal, BeatSide side, double searchHz)
    {
        // Synthetic truth (invented data): f_search = 100 kHz (1 - 8 ppm/K (T - 20)) plus 0.02 Hz noise;
        // beat = |f_search - f_ref| with f_ref 1 kHz away.
        var rng = new Random(4);
        var points = new List<TempcoPoint>();
        for (int i = 0; i < 60; i++)
        {
            double t = 15 + (i * 0.25);
            double fs = 100_000 * (1 - (8e-6 * (t - 20))) + (0.02 * Tracking.SyntheticGateStream.Gaussian(rng));
            double counted = signal == SignalKind.Search ? fs : side == BeatSide.Above ? fs - 99_000 : 101_000 - fs;
            points.Add(new TempcoPoint(t, counted, i, 10));
        }

        Assert.True(TempcoCalibration.TryFit(points, signal, side, searchHz, out TempcoFitResult fit, out string? error), error);
        Assert.InRange(fit.TempcoPpmPerK, -8 - (4 * fit.StandardErrorPpmPerK), -8 + (4 * fit.StandardErrorPpmPerK));
        Assert.InRange(fit.StandardErrorPpmPerK, 0.0005, 0.02); // 0.2 ppm noise over 15 K, 60 points: about 0.003
        Assert.Equal(60, fit.Points);
        Assert.Equal(600, fit.Readings);
    }

    [Fact]
    public void Beat_mode_without_search_hz_cannot_give_ppm()
    {
        var points = new[] { new TempcoPoint(20, 1000, 0, 1), new TempcoPoint(21, 999, 1, 1), new TempcoPoint(22, 998, 2, 1) };
        Assert.False(TempcoCalibration.TryFit(points, SignalKind.Beat, BeatSide.Above, 0, out _, out string? error));
        Assert.Contains("search_hz", error);
    }

    [Fact]
    public void One_temperature_only_is_said_plainly()
    {
        var points = new[] { new TempcoPoint(21, 1000, 0, 1), new TempcoPoint(21, 999, 1, 1), new TempcoPoint(21, 998, 2, 1) };
        Assert.False(TempcoCalibration.TryFit(points, SignalKind.Search, BeatSide.None, 0, out _, out string? error));
        Assert.Contains("all lie at one temperature (21 deg C)", error);
    }
}
