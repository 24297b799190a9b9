using FreqReadout.Counting;

namespace FreqReadout.Host.Captures;

/// <summary>
/// The metadata of a capture (text format contract in docs/capture-text-format.md; the binary format carries the same).
/// Defaults are the contract's defaults.
/// </summary>
public sealed class CaptureMetadata
{
    /// <summary>Lowest <c>clock_hz</c>, Hz (a timer slower than 1 Hz cannot time an oscillator).</summary>
    public const double MinClockHz = 1;

    /// <summary>Highest <c>clock_hz</c>, Hz (1 THz, beyond any counter or logic analyser).</summary>
    public const double MaxClockHz = 1e12;

    /// <summary>Lowest <c>search_hz</c>, Hz.</summary>
    public const double MinSearchHz = 1;

    /// <summary>Highest <c>search_hz</c>, Hz (1 GHz, far above any LC search oscillator).</summary>
    public const double MaxSearchHz = 1e9;

    /// <summary>Largest <c>prescale</c> (2^24, beyond any prescaler chain).</summary>
    public const int MaxPrescale = 1 << 24;

    /// <summary>Timer clock, Hz, in [<see cref="MinClockHz"/>, <see cref="MaxClockHz"/>]. Required key <c>clock_hz</c>.</summary>
    public double ClockHz { get; set; }

    /// <summary>Key <c>kind</c>: edges (default) or snapshots.</summary>
    public CaptureKind Kind { get; set; } = CaptureKind.Edges;

    /// <summary>Key <c>prescale</c>: input edges per recorded edge, 1 to <see cref="MaxPrescale"/>, default 1.</summary>
    public int Prescale { get; set; } = 1;

    /// <summary>Key <c>timer_bits</c>: 16, 24, 32 or 64 (default).</summary>
    public int TimerBits { get; set; } = 64;

    /// <summary>Key <c>count_bits</c> (snapshots only): width of the pulse counter, default 64.</summary>
    public int CountBits { get; set; } = 64;

    /// <summary>Key <c>signal</c>: search (default) or beat.</summary>
    public SignalKind Signal { get; set; } = SignalKind.Search;

    /// <summary>Key <c>beat_side</c>: required when signal = beat.</summary>
    public BeatSide BeatSide { get; set; } = BeatSide.None;

    /// <summary>Key <c>search_hz</c>: nominal search-oscillator frequency, Hz, in [<see cref="MinSearchHz"/>, <see cref="MaxSearchHz"/>], if given.</summary>
    public double? SearchHz { get; set; }

    /// <summary>Key <c>started_utc</c>, if given.</summary>
    public DateTimeOffset? StartedUtc { get; set; }

    /// <summary>Key <c>note</c>, if given.</summary>
    public string? Note { get; set; }

    /// <summary>Unknown keys, kept in file order (shown by tools that print metadata).</summary>
    public List<KeyValuePair<string, string>> Extra { get; } = new();

    /// <summary>Data columns after the first (<c>tick</c>, or <c>tick,count</c>): any of <c>temp_c</c>, <c>mark</c>, in file order.</summary>
    public List<string> ExtraColumns { get; } = new();

    /// <summary>
    /// The header lines in the order they were read (keys and comments), so a writer reproduces them;
    /// empty for metadata built in code (writers then use a fixed order and write only keys that
    /// differ from their defaults, plus <c>clock_hz</c>).
    /// </summary>
    public List<CaptureHeaderLine> HeaderLines { get; } = new();

    /// <summary>True when the capture has a <c>temp_c</c> column.</summary>
    public bool HasTemperatureColumn => ExtraColumns.Contains(CaptureColumns.TemperatureC);

    /// <summary>True when the capture has a <c>mark</c> column.</summary>
    public bool HasMarkColumn => ExtraColumns.Contains(CaptureColumns.Mark);

    /// <summary>The value of an unknown key, or null.</summary>
    public string? GetExtra(string key)
    {
        foreach (var pair in Extra)
        {
            if (pair.Key == key)
            {
                return pair.Value;
            }
        }

        return null;
    }
}
