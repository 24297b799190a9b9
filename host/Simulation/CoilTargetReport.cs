namespace FreqReadout.Host.Simulation;

/// <summary>The target part of <see cref="CoilReport"/>.</summary>
public sealed class CoilTargetReport
{
    public string Material { get; set; } = "";
    public double ConductivitySPerM { get; set; }
    public double MuR { get; set; }
    public double RadiusM { get; set; }
    public double SkinDepthM { get; set; }

    /// <summary>Re of M / (2 pi a^3) at the operating frequency.</summary>
    public double PolarizabilityRe { get; set; }
    public double PolarizabilityIm { get; set; }
    public string MaterialClass { get; set; } = "";
    public string SignRuleClass { get; set; } = "";
    public double? CrossoverHz { get; set; }
    public bool? AboveCrossover { get; set; }

    /// <summary>Coil plane above the surface, m.</summary>
    public double HeightM { get; set; }

    /// <summary>Expected shift against depth (target on the coil axis).</summary>
    public List<CoilShiftRow> Table { get; set; } = new();
}
