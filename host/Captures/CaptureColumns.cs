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

    /// <summary>The optional columns, any order, each at most once, after the first (or first two).</summary>
    public static IReadOnlyList<string> Optional { get; } = new[] { TemperatureC, Mark };
}
