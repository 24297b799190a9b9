using System.Diagnostics;
using System.Globalization;
using System.Text;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Bench;

/// <summary>
/// The speed bench (<c>freqreadout bench speed</c>, host/Bench/README.md): builds its captures in a folder, then times
/// whole <c>freqreadout</c> processes — the raw read (the yardstick), text replay, binary replay, replay of a
/// 1000-edge capture (start-up), the row-by-row reading path (the oracle) and simulate — wall clock, warm page
/// cache (one untimed round first), interleaved (every case once per round), and reports the median of each case
/// and its ratio to the raw read's median of the same run.
/// </summary>
public sealed class SpeedBench
{
    /// <summary>Environment variable naming a file where a <c>freqreadout</c> process writes its peak working set on exit.</summary>
    public const string PeakMemoryVariable = "FREQREADOUT_PEAK_MEMORY_FILE";

    /// <summary>Edges of the start-up case's capture.</summary>
    public const long StartupEdges = 1000;

    private readonly string _directory;
    private readonly SpeedBenchSize _size;

    /// <summary>Prepares a bench in <paramref name="directory"/> (created if missing; its capture files are replaced).</summary>
    public SpeedBench(string directory, SpeedBenchSize size)
    {
        _directory = directory;
        _size = size;
    }

    /// <summary>Called with a line of progress (building a capture, a round started).</summary>
    public Action<string>? Progress { get; set; }

    /// <summary>The program and the arguments before a command's own, for the <c>freqreadout</c> being run.</summary>
    internal static (string FileName, IReadOnlyList<string> Prefix) SelfCommand()
    {
        string? process = Environment.ProcessPath;
        if (process != null && Path.GetFileNameWithoutExtension(process) == "freqreadout")
        {
            return (process, Array.Empty<string>()); // an apphost: a published or installed freqreadout
        }

        string dll = typeof(Program).Assembly.Location;
        string dotnet = Environment.GetEnvironmentVariable("DOTNET_HOST_PATH") is { Length: > 0 } host && File.Exists(host)
            ? host
            : process != null && Path.GetFileNameWithoutExtension(process) == "dotnet" ? process : "dotnet";
        return (dotnet, new[] { dll });
    }

    /// <summary>Builds the captures: the large one as text and converted to binary, the 1000-edge one.</summary>
    public IReadOnlyList<SpeedCase> Prepare(CancellationToken cancellationToken)
    {
        Directory.CreateDirectory(_directory);
        string big = Path.Combine(_directory, "big.csv");
        string binary = Path.Combine(_directory, "big.frb");
        string small = Path.Combine(_directory, "small.csv");
        string simulated = Path.Combine(_directory, "simulated.csv");
        Progress?.Invoke($"writing {big} ({_size.Edges:N0} edges, invented synthetic capture)");
        SyntheticEdgeCapture.Write(big, _size.Edges, CaptureFileFormat.Text);
        cancellationToken.ThrowIfCancellationRequested();
        SyntheticEdgeCapture.Write(small, StartupEdges, CaptureFileFormat.Text, prescale: 32); // 0.32 s: three gates
        Progress?.Invoke($"converting to {binary}");
        RunOnce(new SpeedCase("convert", "convert", new[] { "convert", big, binary, "--to", "binary" }, 0), null);
        cancellationToken.ThrowIfCancellationRequested();

        // The demo scene records about 3125 edges per second (100 kHz behind a prescaler of 32).
        // The synthetic capture records every cycle of its 100 kHz oscillator, so 10 M edges are 100 s and 1000 gates.
        long simulatedEdges = (long)(_size.SimulateSeconds * 100e3 / 32);
        var cases = new List<SpeedCase>
        {
            new("raw read", "FileStream, 1 MiB blocks, span.Count('\\n') of the text capture", new[] { RawRead.Argument, big }, _size.Edges),
            new("text replay", "replay big.csv --json", new[] { "replay", big, "--json" }, _size.Edges),
            new("binary replay", "replay big.frb --json (after convert --to binary)", new[] { "replay", binary, "--json" }, _size.Edges),
            new("start-up", "replay small.csv --json (1000 edges, 0.32 s)", new[] { "replay", small, "--json" }, StartupEdges),
        };
        if (_size.IncludeRowByRow)
        {
            cases.Add(new("text replay, row by row", "replay big.csv --json on the line-based path (FREQREADOUT_ROW_READER=1)", new[] { "replay", big, "--json" }, _size.Edges, RowByRow: true));
        }

        cases.Add(new("simulate", $"simulate --demo --duration-s {_size.SimulateSeconds.ToString(CultureInfo.InvariantCulture)} (text, about {simulatedEdges:N0} edges)", new[] { "simulate", "--demo", "--duration-s", _size.SimulateSeconds.ToString(CultureInfo.InvariantCulture), "--out", simulated, "--quiet" }, simulatedEdges));
        return cases;
    }

    /// <summary>Times every case <see cref="SpeedBenchSize.Runs"/> times, interleaved, after one untimed warm-up round.</summary>
    public IReadOnlyList<SpeedCaseResult> Run(IReadOnlyList<SpeedCase> cases, CancellationToken cancellationToken)
    {
        var results = cases.Select(c => new SpeedCaseResult(c)).ToList();
        for (int round = 0; round <= _size.Runs; round++)
        {
            Progress?.Invoke(round == 0 ? "warm-up round (not timed)" : $"round {round} of {_size.Runs}");
            foreach (SpeedCaseResult result in results)
            {
                cancellationToken.ThrowIfCancellationRequested();
                (double seconds, long peak) = RunOnce(result.Case, Path.Combine(_directory, "peak.txt"));
                if (round > 0)
                {
                    result.Seconds.Add(seconds);
                    result.PeakWorkingSetBytes.Add(peak);
                }
            }
        }

        return results;
    }

    /// <summary>Runs one case as a process; returns its wall-clock seconds and reported peak working set (0: none).</summary>
    /// <exception cref="InvalidOperationException">The process failed (its stderr is in the message).</exception>
    private static (double Seconds, long PeakBytes) RunOnce(SpeedCase speedCase, string? peakFile)
    {
        (string fileName, IReadOnlyList<string> prefix) = SelfCommand();
        var psi = new ProcessStartInfo(fileName)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (string a in prefix.Concat(speedCase.Arguments))
        {
            psi.ArgumentList.Add(a);
        }

        psi.Environment["NO_COLOR"] = "1";
        psi.Environment["FREQREADOUT_ROW_READER"] = speedCase.RowByRow ? "1" : "0";
        if (peakFile != null)
        {
            File.Delete(peakFile);
            psi.Environment[PeakMemoryVariable] = peakFile;
        }
        else
        {
            psi.Environment.Remove(PeakMemoryVariable);
        }

        var clock = Stopwatch.StartNew();
        using var process = Process.Start(psi) ?? throw new InvalidOperationException("could not start " + fileName);
        Task drainOut = process.StandardOutput.BaseStream.CopyToAsync(Stream.Null);
        Task<string> err = process.StandardError.ReadToEndAsync();
        process.WaitForExit();
        clock.Stop();
        drainOut.Wait();
        if (process.ExitCode != 0)
        {
            throw new InvalidOperationException($"{speedCase.Name}: freqreadout {string.Join(' ', speedCase.Arguments)} exited {process.ExitCode}: {err.Result.Trim()}");
        }

        long peak = 0;
        if (peakFile != null && File.Exists(peakFile))
        {
            string[] parts = File.ReadAllText(peakFile).Split(' ');
            peak = long.Parse(parts[^1], CultureInfo.InvariantCulture);
        }

        return (clock.Elapsed.TotalSeconds, peak);
    }

    /// <summary>The table as Markdown, with a line on the size, runs and machine after it.</summary>
    public static string Markdown(IReadOnlyList<SpeedCaseResult> results, SpeedBenchSize size, long textBytes)
    {
        double raw = results.First(r => r.Case.Arguments[0] == RawRead.Argument).MedianSeconds;
        var text = new StringBuilder();
        text.Append("| case | what | median s | min s | max s | x raw read | edges/s | peak MiB |\n");
        text.Append("|---|---|---:|---:|---:|---:|---:|---:|\n");
        foreach (SpeedCaseResult r in results)
        {
            double median = r.MedianSeconds;
            double perSecond = r.Case.Edges / median;
            string rate = r.Case.Edges == 0 ? string.Empty
                : perSecond >= 1e6 ? FormattableString.Invariant($"{perSecond / 1e6:0.0} M")
                : FormattableString.Invariant($"{perSecond / 1e3:0} k");
            string peak = r.PeakMiB > 0 ? FormattableString.Invariant($"{r.PeakMiB:0}") : "-";
            text.Append(FormattableString.Invariant(
                $"| {r.Case.Name} | {r.Case.What} | {median:0.000} | {r.Seconds.Min():0.000} | {r.Seconds.Max():0.000} | {median / raw:0.0} | {rate} | {peak} |\n"));
        }

        text.Append(FormattableString.Invariant(
            $"\n{size.Edges:N0}-edge text capture ({textBytes / 1048576.0:0.0} MiB); whole processes, wall clock, warm page cache, {size.Runs} interleaved runs per case after one untimed round, medians; x raw read: the case's median over the raw read's median in the same run; peak MiB: the process's peak working set as it reported it; {Environment.ProcessorCount} processors, {System.Runtime.InteropServices.RuntimeInformation.OSDescription}, .NET {Environment.Version}.\n"));
        return text.ToString();
    }

    /// <summary>
    /// The same results as one JSON object (docs/json-output.md, keys: bench speed): the size, the machine, and per case
    /// its median, least and most seconds, ratio to the raw read's median, edges a second and peak memory.
    /// </summary>
    public static string Json(IReadOnlyList<SpeedCaseResult> results, SpeedBenchSize size, long textBytes)
    {
        double raw = results.First(r => r.Case.Arguments[0] == RawRead.Argument).MedianSeconds;
        return Commands.JsonValues.Document(w =>
        {
            w.WriteStartObject();
            w.WriteNumber("edges", size.Edges);
            w.WriteNumber("text_bytes", textBytes);
            w.WriteNumber("runs", size.Runs);
            w.WriteNumber("processors", Environment.ProcessorCount);
            w.WriteString("os", System.Runtime.InteropServices.RuntimeInformation.OSDescription);
            w.WriteString("runtime", Environment.Version.ToString());
            w.WriteStartArray("cases");
            foreach (SpeedCaseResult r in results)
            {
                double median = r.MedianSeconds;
                w.WriteStartObject();
                w.WriteString("name", r.Case.Name);
                w.WriteString("what", r.Case.What);
                w.WriteString("arguments", string.Join(' ', r.Case.Arguments));
                Commands.JsonValues.NumberOrNull(w, "median_s", median);
                Commands.JsonValues.NumberOrNull(w, "min_s", r.Seconds.Count > 0 ? r.Seconds.Min() : double.NaN);
                Commands.JsonValues.NumberOrNull(w, "max_s", r.Seconds.Count > 0 ? r.Seconds.Max() : double.NaN);
                Commands.JsonValues.NumberOrNull(w, "x_raw_read", median / raw);
                Commands.JsonValues.NumberOrNull(w, "edges_per_s", r.Case.Edges == 0 ? double.NaN : r.Case.Edges / median);
                Commands.JsonValues.NumberOrNull(w, "peak_mib", r.PeakMiB > 0 ? r.PeakMiB : double.NaN);
                w.WriteEndObject();
            }

            w.WriteEndArray();
            w.WriteEndObject();
        });
    }
}
