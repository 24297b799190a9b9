namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: how the coil moves (JSON object <c>sweep</c>). The coil rests at <see cref="StartM"/> for <see cref="LeadInS"/>, then
/// makes <see cref="Passes"/> passes at <see cref="SpeedMPerS"/>, pausing <see cref="PauseS"/> between them, then rests for
/// <see cref="TailS"/>. Alternating passes go back and forth; otherwise the coil is lifted clear during each pause and
/// carried back to the start (no coupling while lifted).
/// </summary>
public sealed class SceneSweep
{
    /// <summary>Start of the line, m. Default 0.</summary>
    public double StartM { get; set; }

    /// <summary>End of the line, m. Default 2.</summary>
    public double EndM { get; set; } = 2.0;

    /// <summary>Coil speed, m/s (&gt; 0). Default 0.3.</summary>
    public double SpeedMPerS { get; set; } = 0.3;

    /// <summary>Height of the coil plane above the surface, m (&gt;= 0). Default 0.02.</summary>
    public double HeightM { get; set; } = 0.02;

    /// <summary>Number of passes, 1..10000. Default 2.</summary>
    public int Passes { get; set; } = 2;

    /// <summary>Pause between passes, s. Default 2.</summary>
    public double PauseS { get; set; } = 2.0;

    /// <summary>Rest at the start before the first pass, s (the readout's baseline settling). Default 10.</summary>
    public double LeadInS { get; set; } = 10.0;

    /// <summary>Rest at the end after the last pass, s. Default 3.</summary>
    public double TailS { get; set; } = 3.0;

    /// <summary>Passes alternate direction. Default true.</summary>
    public bool Alternate { get; set; } = true;
}
