using FreqReadout.Counting;
using FreqReadout.Detection;

namespace FreqReadout.Host.Calibration;

/// <summary>
/// Fits the search oscillator's tempco from target-free stretches of a capture: for each point,
/// y = s (f - mean f) / f_ref x 1e6 ppm (s = +1 search or beat above, -1 beat below, so y is the
/// search oscillator's relative change), regressed on temperature by <see cref="LinearRegression"/>.
/// The slope is tempco_ppm_per_k. Drift that is not caused by temperature but correlates with it
/// over the run (settling) biases the fit; the standard error assumes independent residuals.
/// </summary>
public static class TempcoCalibration
{
    /// <summary>Fits the tempco.</summary>
    /// <param name="points">Calibration points (one per temperature sample).</param>
    /// <param name="signal">Counted signal.</param>
    /// <param name="side">Beat side (beat mode).</param>
    /// <param name="referenceHz">Search frequency for ppm; in search mode 0 means the mean counted frequency.</param>
    /// <param name="result">The fit.</param>
    /// <param name="error">Why there is none.</param>
    public static bool TryFit(IReadOnlyList<TempcoPoint> points, SignalKind signal, BeatSide side, double referenceHz, out TempcoFitResult result, out string? error)
    {
        result = default;
        if (points.Count == 0)
        {
            error = "no temperature point with target-free readings (the capture needs a temp_c column and readings after the baseline)";
            return false;
        }

        double mean = points.Average(p => p.FrequencyHz);
        double reference = referenceHz > 0 ? referenceHz : (signal == SignalKind.Search ? mean : 0);
        if (!(reference > 0))
        {
            error = "beat mode needs search_hz (in the capture or as --search-hz) to express the tempco in ppm of the search oscillator";
            return false;
        }

        double lowest = points.Min(p => p.TemperatureC);
        double highest = points.Max(p => p.TemperatureC);
        if (!(highest > lowest))
        {
            error = $"the target-free readings all lie at one temperature ({lowest.ToString("0.###", System.Globalization.CultureInfo.InvariantCulture)} deg C): there is no temperature change to fit";
            return false;
        }

        double s = SignRule.SearchSignPerCounted(signal, side);
        var x = points.Select(p => p.TemperatureC).ToArray();
        var y = points.Select(p => s * (p.FrequencyHz - mean) / reference * 1e6).ToArray();
        if (!LinearRegression.TryFit(x, y, out LineFit fit, out error))
        {
            error = "cannot fit the tempco: " + error;
            return false;
        }

        result = new TempcoFitResult(fit.Slope, fit.SlopeStandardError, reference, x.Min(), x.Max(), points.Count, points.Sum(p => p.Readings), fit.RSquared, fit.ResidualStandardDeviation);
        return true;
    }
}
