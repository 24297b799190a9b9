namespace FreqReadout.Host.Simulation;

/// <summary>A target material: conductivity and initial relative permeability.</summary>
/// <param name="Name">Preset name or "custom".</param>
/// <param name="ConductivitySPerM">sigma, S/m (&gt; 0).</param>
/// <param name="RelativePermeability">mu_r (&gt;= 1).</param>
public sealed record Material(string Name, double ConductivitySPerM, double RelativePermeability)
{
    /// <summary>Ferrous (flux-concentrating) when mu_r &gt; 1.5; the material class the truth file reports.</summary>
    public bool IsFerrous => RelativePermeability > 1.5;
}
