using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Bench;

/// <summary>A drawn bench scene: the simulator's scene plus what was drawn for it and its measured gate noise.</summary>
public sealed class BenchScene
{
    /// <summary>Which scene.</summary>
    public required BenchSceneKey Key { get; init; }

    /// <summary>The scene to simulate.</summary>
    public required Scene Scene { get; init; }

    /// <summary>Gate noise: standard deviation of the 0.1 s reciprocal gates of a drift-free, target-free stretch of the same hardware and oscillators, counted signal, Hz.</summary>
    public required double GateNoiseHz { get; init; }

    /// <summary>The gate noise in ppm of the nominal search frequency.</summary>
    public required double GateNoisePpm { get; init; }

    /// <summary>The drift drawn: settling, ramp or onset (a mains scene draws one of the three).</summary>
    public required BenchKind Drift { get; init; }

    /// <summary>Drift rate (settling: at t = 0), signed, ppm/s of the search frequency.</summary>
    public required double RatePpmPerS { get; init; }

    /// <summary>Settling time constant, s (NaN for ramps and onsets).</summary>
    public double TauSeconds { get; init; } = double.NaN;

    /// <summary>Onset time, s (NaN unless an onset).</summary>
    public double OnsetSeconds { get; init; } = double.NaN;

    /// <summary>Targets drawn (empty for a drift-only scene).</summary>
    public required IReadOnlyList<BenchTargetPlan> Targets { get; init; }
}
