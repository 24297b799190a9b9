using System.Globalization;
using FreqReadout.Counting;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Turns <see cref="CaptureMetadata"/> into the ordered header lines both writers emit: the order of
/// <see cref="CaptureMetadata.HeaderLines"/> first (comments in place), then every other key that has to
/// be written in a fixed order (<c>clock_hz</c> always, known keys that differ from their defaults,
/// unknown keys). Numbers use the shortest round-trip invariant form ("R").
/// </summary>
internal static class CaptureMetadataFormatter
{
    private static readonly string[] KnownOrder =
    {
        "clock_hz", "kind", "prescale", "timer_bits", "count_bits", "signal", "beat_side", "search_hz", "started_utc", "note",
    };

    /// <summary>Checks what a writer needs; throws <see cref="ArgumentException"/> naming the bad property and its allowed range.</summary>
    public static void Validate(CaptureMetadata md)
    {
        if (!(md.ClockHz >= CaptureMetadata.MinClockHz && md.ClockHz <= CaptureMetadata.MaxClockHz))
        {
            throw new ArgumentException($"ClockHz (clock_hz) must be in [1, 1e12] Hz, was {md.ClockHz.ToString("R", CultureInfo.InvariantCulture)}", nameof(md));
        }

        if (md.Prescale < 1 || md.Prescale > CaptureMetadata.MaxPrescale)
        {
            throw new ArgumentException($"Prescale (prescale) must be an integer from 1 to {CaptureMetadata.MaxPrescale}, was {md.Prescale}", nameof(md));
        }

        if (!CaptureMetadataParser.IsSupportedBits(md.TimerBits))
        {
            throw new ArgumentException($"TimerBits (timer_bits) must be 16, 24, 32 or 64, was {md.TimerBits}", nameof(md));
        }

        if (!CaptureMetadataParser.IsSupportedBits(md.CountBits))
        {
            throw new ArgumentException($"CountBits (count_bits) must be 16, 24, 32 or 64, was {md.CountBits}", nameof(md));
        }

        if (md.Signal == SignalKind.Beat && md.BeatSide == BeatSide.None)
        {
            throw new ArgumentException("BeatSide (beat_side) must be above or below when Signal is beat", nameof(md));
        }

        if (md.SearchHz is double s && !(s >= CaptureMetadata.MinSearchHz && s <= CaptureMetadata.MaxSearchHz))
        {
            throw new ArgumentException("SearchHz (search_hz) must be in [1, 1e9] Hz when given", nameof(md));
        }

        CheckValue("note", md.Note);
        var keys = new HashSet<string>(KnownOrder, StringComparer.Ordinal);
        foreach (var pair in md.Extra)
        {
            string? syntax = CaptureMetadataParser.CheckKeySyntax(pair.Key);
            if (syntax != null)
            {
                throw new ArgumentException($"metadata key {TextExcerpt.Quote(pair.Key)}: {syntax}", nameof(md));
            }

            if (!keys.Add(pair.Key))
            {
                throw new ArgumentException($"metadata key {TextExcerpt.Quote(pair.Key)} appears twice (or is a known key kept in Extra)", nameof(md));
            }

            CheckValue(pair.Key, pair.Value);
        }

        foreach (var line in md.HeaderLines)
        {
            if (line.IsComment)
            {
                string c = line.Comment ?? string.Empty;
                if (c.Contains('=') || c.Contains('\n') || c.Contains('\r'))
                {
                    throw new ArgumentException($"header comment {TextExcerpt.Quote(c)} must not contain '=' or a line break", nameof(md));
                }
            }
        }

        var columns = new HashSet<string>(StringComparer.Ordinal);
        foreach (string column in md.ExtraColumns)
        {
            if (!CaptureColumns.Optional.Contains(column) || !columns.Add(column))
            {
                throw new ArgumentException($"ExtraColumns may hold temp_c and mark, each once; found {TextExcerpt.Quote(column)}", nameof(md));
            }
        }
    }

    /// <summary>Checks a trailer for writing: valid unique keys, values without line breaks.</summary>
    public static void ValidateTrailer(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        var keys = new HashSet<string>(StringComparer.Ordinal);
        foreach (var pair in trailer)
        {
            string? syntax = CaptureMetadataParser.CheckKeySyntax(pair.Key);
            if (syntax != null)
            {
                throw new ArgumentException($"trailer key {TextExcerpt.Quote(pair.Key)}: {syntax}", nameof(trailer));
            }

            if (!keys.Add(pair.Key))
            {
                throw new ArgumentException($"trailer key {TextExcerpt.Quote(pair.Key)} appears twice", nameof(trailer));
            }

            CheckValue(pair.Key, pair.Value);
        }
    }

    /// <summary>The header lines to write, in order.</summary>
    public static List<CaptureHeaderEntry> Entries(CaptureMetadata md)
    {
        var result = new List<CaptureHeaderEntry>();
        var written = new HashSet<string>(StringComparer.Ordinal);
        foreach (var line in md.HeaderLines)
        {
            if (line.IsComment)
            {
                result.Add(new CaptureHeaderEntry(null, line.Comment ?? string.Empty));
                continue;
            }

            string key = line.Key!;
            if (written.Contains(key))
            {
                continue;
            }

            string? value = ValueOf(md, key, listed: true);
            if (value != null)
            {
                written.Add(key);
                result.Add(new CaptureHeaderEntry(key, value));
            }
        }

        foreach (string key in KnownOrder)
        {
            string? value = written.Contains(key) ? null : ValueOf(md, key, listed: false);
            if (value != null)
            {
                written.Add(key);
                result.Add(new CaptureHeaderEntry(key, value));
            }
        }

        foreach (var pair in md.Extra)
        {
            if (written.Add(pair.Key))
            {
                result.Add(new CaptureHeaderEntry(pair.Key, pair.Value));
            }
        }

        return result;
    }

    /// <summary>Number in the shortest form that parses back to the same double (invariant culture).</summary>
    public static string FormatDouble(double value) => value.ToString("R", CultureInfo.InvariantCulture);

    /// <summary>
    /// The text of a key's value, or null when it is not written: a listed key (in HeaderLines) is written
    /// whenever it has a value; an unlisted known key only when it differs from its default.
    /// </summary>
    private static string? ValueOf(CaptureMetadata md, string key, bool listed)
    {
        switch (key)
        {
            case "clock_hz":
                return FormatDouble(md.ClockHz);
            case "kind":
                return listed || md.Kind != CaptureKind.Edges ? (md.Kind == CaptureKind.Snapshots ? "snapshots" : "edges") : null;
            case "prescale":
                return listed || md.Prescale != 1 ? md.Prescale.ToString(CultureInfo.InvariantCulture) : null;
            case "timer_bits":
                return listed || md.TimerBits != 64 ? md.TimerBits.ToString(CultureInfo.InvariantCulture) : null;
            case "count_bits":
                return listed || md.CountBits != 64 ? md.CountBits.ToString(CultureInfo.InvariantCulture) : null;
            case "signal":
                return listed || md.Signal != SignalKind.Search ? (md.Signal == SignalKind.Beat ? "beat" : "search") : null;
            case "beat_side":
                return md.BeatSide switch { BeatSide.Above => "above", BeatSide.Below => "below", _ => null };
            case "search_hz":
                return md.SearchHz is double s ? FormatDouble(s) : null;
            case "started_utc":
                return md.StartedUtc is DateTimeOffset t
                    ? t.ToUniversalTime().ToString(CaptureMetadataParser.StartedUtcFormat, CultureInfo.InvariantCulture)
                    : null;
            case "note":
                return md.Note;
            default:
                return md.GetExtra(key);
        }
    }

    private static void CheckValue(string key, string? value)
    {
        if (value != null && (value.Contains('\n') || value.Contains('\r')))
        {
            throw new ArgumentException($"the value of '{key}' must not contain a line break");
        }
    }
}
