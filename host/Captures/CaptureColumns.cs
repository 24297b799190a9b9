namespace FreqReadout.Host.Captures;

/// <summary>Column names of the capture formats (docs/capture-text-format.md).</summary>
public static class CaptureColumns
{
    /// <summary>First column: the raw timer value.</summary>
    public const string Tick = "tick";

    /// <summary>Second column of <c>kind = snapshots</c>: the raw cumulative pulse count.</summary>
    public const string Count = "count";

    /// <summary>Optional: a new temperature sample in deg C (blank when none).</summary>
    public const string TemperatureC = "temp_c";

    /// <summary>Optional: a mark (free text without commas; <c>rebaseline</c>, <c>hold</c>, <c>release</c> are commands).</summary>
    public const string Mark = "mark";

    /// <summary>Lowest <c>temp_c</c>, deg C: absolute zero.</summary>
    public const double MinTemperatureC = -273.15;

    /// <summary>Highest <c>temp_c</c>, deg C: far above any working coil (solder melts near 190 deg C, enamelled wire fails near 200 deg C); higher is a broken sensor or a wrong unit.</summary>
    public const double MaxTemperatureC = 1000;

    /// <summary>What is wrong with a temperature sample (the range and the unit), or null when it is a plausible one.</summary>
    public static string? TemperatureProblem(double temperatureC)
    {
        if (double.IsNaN(temperatureC) || double.IsInfinity(temperatureC))
        {
            return "expected temp_c as a finite number of deg C in [-273.15, 1000]";
        }

        if (temperatureC < MinTemperatureC)
        {
            return "temp_c " + temperatureC.ToString("R", System.Globalization.CultureInfo.InvariantCulture) + " is below absolute zero (-273.15 deg C); expected a number of deg C in [-273.15, 1000]";
        }

        if (temperatureC > MaxTemperatureC)
        {
            return "temp_c " + temperatureC.ToString("G6", System.Globalization.CultureInfo.InvariantCulture) + " is above 1000 deg C, not a coil temperature (a broken sensor or another unit?); expected a number of deg C in [-273.15, 1000]";
        }

        return null;
    }

    /// <summary>The optional columns, any order, each at most once, after the first (or first two).</summary>
    public static IReadOnlyList<string> Optional { get; } = new[] { TemperatureC, Mark };
}
