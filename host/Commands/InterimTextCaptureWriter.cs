using System.Globalization;
using System.Text;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Commands;

/// <summary>
/// INTERIM: a minimal writer of the capture text format (PRODUCT.md contract) so <c>simulate</c> works before the capture
/// formats land on main; replaced by <c>CaptureFile.Create</c> then. UTF-8 without BOM, LF, invariant numbers.
/// </summary>
internal sealed class InterimTextCaptureWriter : ICaptureWriter
{
    private readonly StreamWriter _w;
    private readonly bool _snapshots;
    private readonly bool _temp;
    private bool _done;

    public InterimTextCaptureWriter(string path, CaptureMetadata m)
    {
        _w = new StreamWriter(new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.None, 65536), new UTF8Encoding(false), 65536) { NewLine = "\n" };
        var ci = CultureInfo.InvariantCulture;
        _snapshots = m.Kind == CaptureKind.Snapshots;
        _temp = m.ExtraColumns.Contains("temp_c");
        _w.Write("# freqreadout capture 1\n");
        _w.Write($"# clock_hz = {m.ClockHz.ToString("R", ci)}\n");
        if (_snapshots)
        {
            _w.Write("# kind = snapshots\n");
            _w.Write($"# count_bits = {m.CountBits.ToString(ci)}\n");
        }

        _w.Write($"# prescale = {m.Prescale.ToString(ci)}\n");
        _w.Write($"# timer_bits = {m.TimerBits.ToString(ci)}\n");
        _w.Write(m.Signal == SignalKind.Beat ? "# signal = beat\n" : "# signal = search\n");
        if (m.Signal == SignalKind.Beat)
        {
            _w.Write(m.BeatSide == BeatSide.Above ? "# beat_side = above\n" : "# beat_side = below\n");
        }

        if (m.SearchHz.HasValue) _w.Write($"# search_hz = {m.SearchHz.Value.ToString("R", ci)}\n");
        if (m.StartedUtc.HasValue) _w.Write($"# started_utc = {m.StartedUtc.Value.UtcDateTime.ToString("yyyy-MM-dd'T'HH:mm:ss'Z'", ci)}\n");
        if (!string.IsNullOrEmpty(m.Note)) _w.Write($"# note = {m.Note}\n");
        foreach (var kv in m.Extra) _w.Write($"# {kv.Key} = {kv.Value}\n");
        _w.Write(_snapshots ? "tick,count" : "tick");
        if (_temp) _w.Write(",temp_c");
        _w.Write('\n');
    }

    public void WriteRow(in CaptureRow row)
    {
        var ci = CultureInfo.InvariantCulture;
        _w.Write(row.Tick.ToString(ci));
        if (_snapshots)
        {
            _w.Write(',');
            _w.Write(row.Count.ToString(ci));
        }

        if (_temp)
        {
            _w.Write(',');
            if (row.TemperatureC.HasValue) _w.Write(row.TemperatureC.Value.ToString("R", ci));
        }

        _w.Write('\n');
    }

    public void Complete(IReadOnlyList<KeyValuePair<string, string>> trailer)
    {
        foreach (var kv in trailer) _w.Write($"# {kv.Key} = {kv.Value}\n");
        _w.Flush();
        _done = true;
    }

    public void Dispose()
    {
        _ = _done;
        _w.Dispose();
    }
}
