using System.Globalization;
using FreqReadout.Counting;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Builds <see cref="CaptureMetadata"/> from <c>key = value</c> pairs by the rules of the capture text
/// format (docs/capture-text-format.md): known keys checked, unknown keys kept, duplicates rejected. Shared by the text
/// and binary readers so both formats carry exactly the same metadata. Errors are thrown as
/// <see cref="CaptureFormatException"/> naming the line (text) or block (binary).
/// </summary>
internal sealed class CaptureMetadataParser
{
    /// <summary>The fixed form of <c>started_utc</c>.</summary>
    public const string StartedUtcFormat = "yyyy-MM-dd'T'HH:mm:ss'Z'";

    private readonly string _source;
    private readonly Dictionary<string, long> _seen = new(StringComparer.Ordinal);
    private readonly List<string> _warnings;

    public CaptureMetadataParser(string source, List<string> warnings)
    {
        _source = source;
        _warnings = warnings;
    }

    public CaptureMetadata Metadata { get; } = new();

    /// <summary>Splits the text after <c>#</c> of a header line: true with key and value for a <c>key = value</c> line, false for a comment.</summary>
    public static bool TrySplitKeyValue(string afterHash, out string key, out string value)
    {
        int eq = afterHash.IndexOf('=');
        if (eq < 0)
        {
            key = string.Empty;
            value = string.Empty;
            return false;
        }

        key = afterHash.Substring(0, eq).Trim();
        value = afterHash.Substring(eq + 1).Trim();
        return true;
    }

    /// <summary>Checks a key's spelling: lowercase letters, digits and '_', starting with a letter. Returns the problem or null.</summary>
    public static string? CheckKeySyntax(string key)
    {
        if (key.Length == 0)
        {
            return "expected a metadata key before '=' (as in '# clock_hz = 1000000')";
        }

        bool ok = key[0] >= 'a' && key[0] <= 'z';
        foreach (char c in key)
        {
            ok &= (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') || c == '_';
        }

        if (ok)
        {
            return null;
        }

        if (key.ToLowerInvariant() != key)
        {
            return $"metadata keys are lowercase: expected {TextExcerpt.Quote(key.ToLowerInvariant())}, found {TextExcerpt.Quote(key)}";
        }

        return $"expected a metadata key of lowercase letters, digits and '_' before '=', found {TextExcerpt.Quote(key)}";
    }

    /// <summary>Records a comment line (text after '#').</summary>
    public void AddComment(string afterHash)
    {
        Metadata.HeaderLines.Add(CaptureHeaderLine.ForComment(afterHash));
    }

    /// <summary>Applies one <c>key = value</c> header line.</summary>
    public void Add(string key, string value, long line)
    {
        string? syntax = CheckKeySyntax(key);
        if (syntax != null)
        {
            throw Error(line, syntax);
        }

        if (_seen.TryGetValue(key, out long firstLine))
        {
            throw Error(line, $"duplicate metadata key {TextExcerpt.Quote(key)} (first given at line {firstLine}); each key may appear once");
        }

        _seen[key] = line;
        var md = Metadata;
        switch (key)
        {
            case "clock_hz":
                md.ClockHz = ParseDoubleIn(key, value, line, CaptureMetadata.MinClockHz, CaptureMetadata.MaxClockHz, "the timer clock in Hz, a number in [1, 1e12] such as 1000000 or 9999987.5");
                break;
            case "kind":
                md.Kind = value switch
                {
                    "edges" => CaptureKind.Edges,
                    "snapshots" => CaptureKind.Snapshots,
                    _ => throw Error(line, $"expected kind = edges or kind = snapshots, found {TextExcerpt.Quote(value)}"),
                };
                break;
            case "prescale":
                if (!int.TryParse(value, NumberStyles.None, CultureInfo.InvariantCulture, out int prescale) || prescale < 1 || prescale > CaptureMetadata.MaxPrescale)
                {
                    throw Error(line, $"expected prescale = an integer from 1 to {CaptureMetadata.MaxPrescale} (input edges per recorded edge), found {TextExcerpt.Quote(value)}");
                }

                md.Prescale = prescale;
                break;
            case "timer_bits":
                md.TimerBits = ParseBits(key, value, line);
                break;
            case "count_bits":
                md.CountBits = ParseBits(key, value, line);
                break;
            case "signal":
                md.Signal = value switch
                {
                    "search" => SignalKind.Search,
                    "beat" => SignalKind.Beat,
                    _ => throw Error(line, $"expected signal = search or signal = beat, found {TextExcerpt.Quote(value)}"),
                };
                break;
            case "beat_side":
                md.BeatSide = value switch
                {
                    "above" => BeatSide.Above,
                    "below" => BeatSide.Below,
                    _ => throw Error(line, $"expected beat_side = above or beat_side = below (the search oscillator relative to the reference), found {TextExcerpt.Quote(value)}"),
                };
                break;
            case "search_hz":
                md.SearchHz = ParseDoubleIn(key, value, line, CaptureMetadata.MinSearchHz, CaptureMetadata.MaxSearchHz, "the nominal search-oscillator frequency in Hz, a number in [1, 1e9]");
                break;
            case "started_utc":
                if (!DateTimeOffset.TryParseExact(value, StartedUtcFormat, CultureInfo.InvariantCulture,
                        DateTimeStyles.AssumeUniversal | DateTimeStyles.AdjustToUniversal, out DateTimeOffset started))
                {
                    throw Error(line, $"expected started_utc = YYYY-MM-DDTHH:MM:SSZ (ISO 8601, UTC), found {TextExcerpt.Quote(value)}");
                }

                md.StartedUtc = started;
                break;
            case "note":
                md.Note = value;
                break;
            default:
                md.Extra.Add(new KeyValuePair<string, string>(key, value));
                break;
        }

        md.HeaderLines.Add(CaptureHeaderLine.ForKey(key));
    }

    /// <summary>Checks the whole header once the column header row is reached (required keys, beat rules).</summary>
    /// <param name="headerLine">Line (or block) of the column header, for errors about missing keys.</param>
    public void Finish(long headerLine)
    {
        var md = Metadata;
        if (!_seen.ContainsKey("clock_hz"))
        {
            throw Error(headerLine, "missing required metadata key 'clock_hz' (the timer clock in Hz, > 0), expected a line '# clock_hz = ...' before the column header");
        }

        if (md.Signal == SignalKind.Beat && md.BeatSide == BeatSide.None)
        {
            long line = _seen["signal"];
            throw Error(line, "signal = beat needs the key 'beat_side' (above or below: the search oscillator relative to the reference) before the column header");
        }

        if (md.Signal == SignalKind.Search && md.BeatSide != BeatSide.None)
        {
            _warnings.Add($"{_source}:{_seen["beat_side"]}: beat_side is ignored: signal = search (beat_side only applies to signal = beat)");
        }

        if (md.Kind == CaptureKind.Edges && _seen.TryGetValue("count_bits", out long countLine))
        {
            _warnings.Add($"{_source}:{countLine}: count_bits is ignored: kind = edges (count_bits only applies to kind = snapshots)");
        }
    }

    private int ParseBits(string key, string value, long line)
    {
        if (int.TryParse(value, NumberStyles.None, CultureInfo.InvariantCulture, out int bits) && IsSupportedBits(bits))
        {
            return bits;
        }

        throw Error(line, $"expected {key} = 16, 24, 32 or 64, found {TextExcerpt.Quote(value)}");
    }

    /// <summary>True for a supported timer or counter width: 16, 24, 32 or 64 bits.</summary>
    public static bool IsSupportedBits(int bits) => bits is 16 or 24 or 32 or 64;

    private double ParseDoubleIn(string key, string value, long line, double low, double high, string what)
    {
        if (TryParseDouble(value, out double v) && v >= low && v <= high)
        {
            return v;
        }

        throw Error(line, $"expected {key} = {what}, found {TextExcerpt.Quote(value)}");
    }

    /// <summary>Parses a finite number with '.' as the decimal separator (invariant culture), no thousands separators.</summary>
    public static bool TryParseDouble(ReadOnlySpan<char> text, out double value)
    {
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value))
        {
            return true;
        }

        value = 0;
        return false;
    }

    private CaptureFormatException Error(long line, string problem) => new(_source, line, problem);
}
