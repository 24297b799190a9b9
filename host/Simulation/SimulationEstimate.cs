using System.Diagnostics;
using System.Globalization;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// How big and how long a simulation will be, known before it starts. The row count comes from the
/// scene (counted frequency / prescale, plus glitches, for edges; 1 / snapshot_interval_s for
/// snapshots) times the duration; bytes per row and time per row are measured on a short trial run
/// of the same scene into a byte-counting sink, so they include the real tick widths, jitter and
/// columns of this capture and the speed of this machine.
/// </summary>
public sealed class SimulationEstimate
{
    /// <summary>Runs of more rows than this count as long: their size and time are measured and stated.</summary>
    public const long LongRunRows = 2_000_000;

    /// <summary>Rows simulated by the trial run.</summary>
    public const long TrialRunRows = 200_000;

    private SimulationEstimate(long rows, double bytesPerRow, double secondsPerRow, long trialRows)
    {
        Rows = rows;
        BytesPerRow = bytesPerRow;
        SecondsPerRow = secondsPerRow;
        TrialRows = trialRows;
    }

    /// <summary>Expected rows of the whole capture.</summary>
    public long Rows { get; }

    /// <summary>Bytes per row measured on the trial (0 when no trial ran).</summary>
    public double BytesPerRow { get; }

    /// <summary>Wall-clock seconds per row measured on the trial (0 when no trial ran).</summary>
    public double SecondsPerRow { get; }

    /// <summary>Rows of the trial run (0 when the run is short and none was needed).</summary>
    public long TrialRows { get; }

    /// <summary>True when the run is long enough for its size and time to be stated before it starts.</summary>
    public bool IsLong => Rows > LongRunRows;

    /// <summary>Expected size of the capture file, bytes (rows x bytes per row; 0 when not measured).</summary>
    public double CaptureBytes => Rows * BytesPerRow;

    /// <summary>Expected wall-clock time, s (rows x seconds per row; 0 when not measured).</summary>
    public double Seconds => Rows * SecondsPerRow;

    /// <summary>Expected rows of a simulation of <paramref name="model"/>: rate x duration (dropouts ignored, so a slight overestimate).</summary>
    public static long ExpectedRows(SceneModel model)
    {
        double rate = RowsPerSecond(model);
        double rows = rate * model.DurationS;
        return rows >= long.MaxValue ? long.MaxValue : (long)Math.Ceiling(rows);
    }

    /// <summary>
    /// The estimate for <paramref name="model"/> written in <paramref name="format"/>; for a long run
    /// (more than <see cref="LongRunRows"/> rows) a trial of <see cref="TrialRunRows"/> rows is simulated
    /// first (after a small warm-up) to measure bytes and time per row.
    /// </summary>
    public static SimulationEstimate Measure(SceneModel model, CaptureFileFormat format, CancellationToken cancellationToken)
    {
        long rows = ExpectedRows(model);
        if (rows <= LongRunRows)
        {
            return new SimulationEstimate(rows, 0, 0, 0);
        }

        double rate = RowsPerSecond(model);
        Trial(model, format, 2_000 / rate, cancellationToken, out _, out _, out _); // JIT warm-up, not measured
        Trial(model, format, TrialRunRows / rate, cancellationToken, out long trialRows, out long bytes, out double seconds);
        trialRows = Math.Max(1, trialRows);
        return new SimulationEstimate(rows, (double)bytes / trialRows, seconds / trialRows, trialRows);
    }

    /// <summary>One line for stderr: "about 1.2e9 rows, 13.5 GB (text), about 25 min (measured on a trial of 200000 rows)".</summary>
    public string Describe(string format) =>
        $"about {Rows.ToString(Rows >= 1e7 ? "0.0e0" : "0", CultureInfo.InvariantCulture)} rows, {Bytes(CaptureBytes)} ({format}), about {Duration(Seconds)} on this machine (measured on a trial of {TrialRows.ToString(CultureInfo.InvariantCulture)} rows)";

    /// <summary>A byte count in B, kB, MB, GB or TB (decimal units), three significant digits.</summary>
    public static string Bytes(double bytes)
    {
        string[] units = { "B", "kB", "MB", "GB", "TB", "PB", "EB" };
        int u = 0;
        while (bytes >= 1000 && u < units.Length - 1)
        {
            bytes /= 1000;
            u++;
        }

        return bytes.ToString(bytes >= 100 ? "0" : bytes >= 10 ? "0.0" : "0.00", CultureInfo.InvariantCulture) + " " + units[u];
    }

    /// <summary>A duration in s, min, h or days.</summary>
    public static string Duration(double seconds)
    {
        var ci = CultureInfo.InvariantCulture;
        if (seconds < 90)
        {
            return seconds.ToString("0", ci) + " s";
        }

        if (seconds < 90 * 60)
        {
            return (seconds / 60).ToString("0", ci) + " min";
        }

        if (seconds < 48 * 3600)
        {
            return (seconds / 3600).ToString("0.0", ci) + " h";
        }

        return (seconds / 86400).ToString("0", ci) + " days";
    }

    private static double RowsPerSecond(SceneModel model)
    {
        var h = model.Scene.Hardware;
        if (h.Kind == CaptureKind.Snapshots)
        {
            return 1.0 / h.SnapshotIntervalS;
        }

        // The counted frequency at 16 instants over the run (it moves by ppm, so this is plenty).
        double sum = 0;
        const int n = 16;
        for (int i = 0; i < n; i++)
        {
            sum += Math.Max(CaptureSimulator.MinCountedHz, model.CountedIntendedHz(model.DurationS * i / n));
        }

        return sum / n / h.Prescale + model.Scene.Faults.GlitchesPerS;
    }

    private static void Trial(SceneModel model, CaptureFileFormat format, double durationS, CancellationToken ct, out long rows, out long bytes, out double seconds)
    {
        Scene trial = Scene.Parse(model.Scene.ToJson(), model.Scene.Name);
        trial.DurationS = Math.Min(model.DurationS, Math.Max(durationS, 1e-6));
        var simulator = new CaptureSimulator(new SceneModel(trial, model.Scene.Name));
        var sink = new ByteCountingStream();
        var clock = Stopwatch.StartNew();
        using (ICaptureWriter writer = CaptureFile.Create(sink, simulator.Metadata, format))
        {
            rows = simulator.Run(writer, null, ct, targetTruth: false).Rows;
        }

        seconds = clock.Elapsed.TotalSeconds;
        bytes = sink.Bytes;
    }

    /// <summary>A write-only stream that keeps only the count of bytes written.</summary>
    private sealed class ByteCountingStream : FreqReadout.Host.Output.WriteOnlyStream
    {
        public long Bytes { get; private set; }

        public override long BytesWritten => Bytes;

        public override long Length => Bytes;

        public override void Flush()
        {
        }

        public override void Write(ReadOnlySpan<byte> buffer) => Bytes += buffer.Length;
    }
}
