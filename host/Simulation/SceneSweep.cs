namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: how the coil moves (JSON object <c>sweep</c>). The coil rests at <see cref="StartM"/> for <see cref="LeadInS"/>, then
/// makes <see cref="Passes"/> passes at <see cref="SpeedMPerS"/>, pausing <see cref="PauseS"/> between them, then rests for
/// <see cref="TailS"/>. Alternating passes go back and forth; otherwise the coil is lifted clear during each pause and
/// carried back to the start (no coupling while lifted).
/// <para>Instead, <see cref="Legs"/> may list the passes one by one (start time, ends, duration); then start_m, end_m,
/// speed_m_per_s, passes, pause_s, lead_in_s and alternate are not used, and tail_s follows the last leg.</para>
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

    /// <summary>
    /// Explicit passes in time order, or null (default) for the regular sweep above. Before the first leg the coil rests at
    /// its start; between legs it rests where the last one ended when the next starts there, and is otherwise lifted clear
    /// (no coupling) until the next leg starts; after the last it rests at its end.
    /// </summary>
    public List<SceneSweepLeg>? Legs { get; set; }
}
