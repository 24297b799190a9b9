namespace FreqReadout.Host.Simulation;

/// <summary>Truth for one target: parameters, physics at the operating frequency and per-pass expectations.</summary>
public sealed class TargetTruth
{
    public string Name { get; set; } = "";
    public string Material { get; set; } = "";
    public string Shape { get; set; } = "";
    public double ConductivitySPerM { get; set; }
    public double MuR { get; set; }
    public double RadiusM { get; set; }
    public double? LengthM { get; set; }
    public double DepthM { get; set; }
    public double PositionM { get; set; }
    public double OffsetM { get; set; }

    /// <summary>What the material is: "ferrous" or "non-ferrous".</summary>
    public string MaterialClass { get; set; } = "";

    /// <summary>What the sign rule should report at the operating frequency (differs for iron above its crossover).</summary>
    public string SignRuleClass { get; set; } = "";

    /// <summary>Re of M / (2 pi a^3) at the operating frequency.</summary>
    public double PolarizabilityRe { get; set; }

    /// <summary>Im of M / (2 pi a^3).</summary>
    public double PolarizabilityIm { get; set; }

    /// <summary>Skin depth at the operating frequency, m.</summary>
    public double SkinDepthM { get; set; }

    /// <summary>Ferrous crossover frequency, Hz (null for non-magnetic targets).</summary>
    public double? CrossoverHz { get; set; }

    /// <summary>True when the operating frequency is above the crossover (iron reads non-ferrous); null for non-magnetic.</summary>
    public bool? AboveCrossover { get; set; }

    /// <summary>Plain-language note on the sign rule for this part.</summary>
    public string Explanation { get; set; } = "";

    /// <summary>Closest coil-plane-to-centre distance in target radii (the dipole model wants about 10 or more).</summary>
    public double ClosestDistanceRadii { get; set; }

    /// <summary>Per-pass expectations.</summary>
    public List<PassTruth> Passes { get; set; } = new();
}
