namespace FreqReadout.Host.Bench;

/// <summary>How much the speed bench does: the large capture's edges, the simulated seconds, the runs per case.</summary>
public sealed class SpeedBenchSize
{
    /// <summary>Runs per case the medians are taken over, at least.</summary>
    public const int MinRuns = 5;

    /// <summary>The full bench: a 10 M-edge capture, 60 s of the demo scene simulated, 5 runs, the row-by-row path too.</summary>
    public static SpeedBenchSize Full() => new() { Edges = 10_000_000, SimulateSeconds = 60, Runs = MinRuns, IncludeRowByRow = true };

    /// <summary>The quick subset for CI (well under a minute): a 200 000-edge capture, 5 s simulated, 5 runs, no row-by-row case.</summary>
    public static SpeedBenchSize Quick() => new() { Edges = 200_000, SimulateSeconds = 5, Runs = MinRuns, IncludeRowByRow = false };

    /// <summary>Edges of the large capture.</summary>
    public long Edges { get; set; }

    /// <summary>Seconds of the demo scene the simulate case writes.</summary>
    public double SimulateSeconds { get; set; }

    /// <summary>Timed runs per case.</summary>
    public int Runs { get; set; }

    /// <summary>True to time the line-based, row-by-row reading path too (the fast path's oracle).</summary>
    public bool IncludeRowByRow { get; set; }
}
