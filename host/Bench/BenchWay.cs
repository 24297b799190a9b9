namespace FreqReadout.Host.Bench;

/// <summary>The ways compared on the same captures (names in output: readout, fixed-3s, moving-10s).</summary>
public enum BenchWay
{
    /// <summary>The device pipeline as built, through <c>ReplaySession</c> with replay's default settings.</summary>
    Readout,

    /// <summary>Plain way 1: fixed baseline (mean of the first 3 s).</summary>
    FixedBaseline,

    /// <summary>Plain way 2: moving baseline (mean of the previous 10 s).</summary>
    MovingBaseline,
}
