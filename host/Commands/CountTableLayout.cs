using System.Globalization;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Commands;

/// <summary>
/// The fixed layout of <c>count</c>'s gate table: column widths chosen once, before the first gate,
/// from the capture's metadata and the counter settings, so the header is printed once and every
/// row lines up however long the capture is. Plain ASCII, right-aligned numbers, state last.
/// </summary>
/// <remarks>
/// Widths come from upper bounds: a frequency cannot exceed one recorded edge per timer tick
/// (clock_hz x prescale) for edges, and is taken as below 1e10 Hz for pulse-counter snapshots; a
/// gate cannot hold more rows than timer ticks in (gate + no-signal timeout). Times get room for
/// 9 999 999 s (115 days). A value wider than its column (a longer capture) widens only its row.
/// </remarks>
public sealed class CountTableLayout
{
    /// <summary>Gate end times up to this many seconds fit the time column.</summary>
    public const double MaxTimeSeconds = 9_999_999.0;

    /// <summary>Upper bound taken for a snapshot capture's frequency, Hz (a pulse counter does not count 10 GHz).</summary>
    public const double MaxSnapshotHz = 1e10;

    private const string Gap = "  ";

    /// <summary>Chooses the column widths for a capture and its counter settings.</summary>
    /// <param name="metadata">The capture's metadata (clock, prescale, kind).</param>
    /// <param name="settings">The counter settings the gates are made with (gate length, no-signal timeout).</param>
    /// <param name="beat">Beat mode: the frequency and shift columns are the beat note's, and a search-shift column follows.</param>
    public CountTableLayout(CaptureMetadata metadata, CounterSettings settings, bool beat = false)
    {
        Beat = beat;
        double maxHz = metadata.Kind == CaptureKind.Snapshots ? MaxSnapshotHz : metadata.ClockHz * metadata.Prescale;
        TimeWidth = Math.Max("time s".Length, Digits(MaxTimeSeconds) + 7);
        FrequencyWidth = Math.Max("frequency Hz".Length, Digits(maxHz) + 4);
        ShiftWidth = Math.Max("search shift Hz".Length, Digits(maxHz) + 5);
        double maxRows = settings.Mode == GateMode.Edges
            ? settings.GateEdges + 1.0
            : Math.Ceiling((settings.GateSeconds + settings.NoSignalSeconds) * metadata.ClockHz) + 1.0;
        EdgesWidth = Math.Max("edges".Length, Digits(maxRows));
        ErrorWidth = Math.Max("scatter Hz".Length, "0.000E+00".Length);
    }

    /// <summary>Beat mode (beat columns and a search-shift column).</summary>
    public bool Beat { get; }

    /// <summary>Width of the gate end time column (six decimals).</summary>
    public int TimeWidth { get; }

    /// <summary>Width of the frequency column (three decimals).</summary>
    public int FrequencyWidth { get; }

    /// <summary>Width of the shift column (sign and three decimals).</summary>
    public int ShiftWidth { get; }

    /// <summary>Width of the edges column.</summary>
    public int EdgesWidth { get; }

    /// <summary>Width of the predicted error column (scientific).</summary>
    public int ErrorWidth { get; }

    /// <summary>The header line (printed once).</summary>
    public string Header() => Line(
        "time s", Beat ? "beat Hz" : "frequency Hz", Beat ? "beat shift Hz" : "shift Hz", Beat ? "search shift Hz" : null, "edges", "error Hz", "scatter Hz", "state");

    /// <summary>The rule under the header.</summary>
    public string Rule() => Line(
        new string('-', TimeWidth), new string('-', FrequencyWidth), new string('-', ShiftWidth), Beat ? new string('-', ShiftWidth) : null,
        new string('-', EdgesWidth), new string('-', ErrorWidth), new string('-', ErrorWidth), "-----");

    /// <summary>One gate's row; frequency, shift and error are "-" when the gate has no frequency.</summary>
    /// <param name="endSeconds">Gate end, s.</param>
    /// <param name="frequencyHz">Frequency of the counted signal, Hz, or null.</param>
    /// <param name="shiftHz">Shift from the first gate with a frequency, Hz, or null (the counted signal's).</param>
    /// <param name="searchShiftHz">The search oscillator's shift (beat side applied), Hz, or null; shown in beat mode only.</param>
    /// <param name="edges">Rows in the gate.</param>
    /// <param name="errorHz">Predicted 1-sigma error, Hz, or null.</param>
    /// <param name="scatterHz">Measured scatter of consecutive gates, Hz, or null.</param>
    /// <param name="state">State text (with inferred edges and marks).</param>
    public string Row(double endSeconds, double? frequencyHz, double? shiftHz, double? searchShiftHz, long edges, double? errorHz, double? scatterHz, string state) => Line(
        Num(endSeconds, "0.000000"),
        frequencyHz is double f ? Num(f, "0.000") : "-",
        shiftHz is double s ? Num(s, "+0.000;-0.000;0.000") : "-",
        Beat ? (searchShiftHz is double ss ? Num(ss, "+0.000;-0.000;0.000") : "-") : null,
        edges.ToString(CultureInfo.InvariantCulture),
        errorHz is double e ? Num(e, "0.000E+0") : "-",
        scatterHz is double sc ? Num(sc, "0.000E+0") : "-",
        state);

    private string Line(string time, string frequency, string shift, string? searchShift, string edges, string error, string scatter, string state)
    {
        var b = new StringBuilder(TimeWidth + FrequencyWidth + (2 * ShiftWidth) + EdgesWidth + (2 * ErrorWidth) + 32);
        b.Append(Gap).Append(time.PadLeft(TimeWidth))
            .Append(Gap).Append(frequency.PadLeft(FrequencyWidth))
            .Append(Gap).Append(shift.PadLeft(ShiftWidth));
        if (searchShift != null)
        {
            b.Append(Gap).Append(searchShift.PadLeft(ShiftWidth));
        }

        b.Append(Gap).Append(edges.PadLeft(EdgesWidth))
            .Append(Gap).Append(error.PadLeft(ErrorWidth))
            .Append(Gap).Append(scatter.PadLeft(ErrorWidth))
            .Append(Gap).Append(state);
        return b.ToString();
    }

    /// <summary>Digits before the decimal point of a positive bound (at least 1).</summary>
    private static int Digits(double bound) => bound < 10 ? 1 : (int)Math.Floor(Math.Log10(bound)) + 1;

    private static string Num(double value, string format) => value.ToString(format, CultureInfo.InvariantCulture);
}
