using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using Spectre.Console;

namespace FreqReadout.Host.Commands;

/// <summary>Prints a capture's metadata (known keys, unknown keys, columns) and trailer for people.</summary>
public static class CaptureMetadataView
{
    /// <summary>The metadata as label/value rows, unknown keys included, in a stable order.</summary>
    public static List<KeyValuePair<string, string>> Rows(ICaptureReader reader, CaptureFileFormat format)
    {
        var md = reader.Metadata;
        var rows = new List<KeyValuePair<string, string>>
        {
            new("capture", $"{reader.SourceName} ({(format == CaptureFileFormat.Binary ? "binary" : "text")})"),
            new("kind", md.Kind == CaptureKind.Snapshots ? "snapshots (pulse-counter reads)" : "edges (one row per recorded edge)"),
            new("clock_hz", Number(md.ClockHz)),
            new("prescale", md.Prescale.ToString(CultureInfo.InvariantCulture)),
            new("timer_bits", md.TimerBits.ToString(CultureInfo.InvariantCulture)),
        };
        if (md.Kind == CaptureKind.Snapshots)
        {
            rows.Add(new("count_bits", md.CountBits.ToString(CultureInfo.InvariantCulture)));
        }

        rows.Add(new("signal", md.Signal == SignalKind.Beat
            ? $"beat (search oscillator {(md.BeatSide == BeatSide.Above ? "above" : "below")} the reference)"
            : "search oscillator"));
        if (md.SearchHz is double searchHz)
        {
            rows.Add(new("search_hz", Number(searchHz)));
        }

        if (md.StartedUtc is DateTimeOffset started)
        {
            rows.Add(new("started_utc", started.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", CultureInfo.InvariantCulture)));
        }

        if (md.Note != null)
        {
            rows.Add(new("note", md.Note));
        }

        foreach (var pair in md.Extra)
        {
            rows.Add(new(pair.Key + " (unknown key)", pair.Value));
        }

        rows.Add(new("columns", string.Join(",", new[] { CaptureColumns.Tick }.Concat(md.Kind == CaptureKind.Snapshots ? new[] { CaptureColumns.Count } : Array.Empty<string>()).Concat(md.ExtraColumns))));
        return rows;
    }

    /// <summary>Writes the metadata rows as a two-column grid.</summary>
    public static void Write(IAnsiConsole console, ICaptureReader reader, CaptureFileFormat format)
    {
        WriteGrid(console, Rows(reader, format));
    }

    /// <summary>Writes the trailer (if any) as a grid headed "trailer".</summary>
    public static void WriteTrailer(IAnsiConsole console, ICaptureReader reader)
    {
        if (reader.Trailer.Count == 0)
        {
            return;
        }

        console.WriteLine("trailer:");
        WriteGrid(console, reader.Trailer.ToList());
    }

    private static void WriteGrid(IAnsiConsole console, List<KeyValuePair<string, string>> rows)
    {
        var grid = new Grid();
        grid.AddColumn(new GridColumn().NoWrap().PadRight(2));
        grid.AddColumn();
        foreach (var row in rows)
        {
            grid.AddRow(new Text(row.Key), new Text(row.Value));
        }

        console.Write(grid);
    }

    private static string Number(double value) => value.ToString("R", CultureInfo.InvariantCulture);
}
