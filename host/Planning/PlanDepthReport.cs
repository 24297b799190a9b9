namespace FreqReadout.Host.Planning;

/// <summary>The depth answer of <c>plan</c>: the target, the shift it makes against depth, and how deep each method sees it.</summary>
public sealed class PlanDepthReport
{
    /// <summary>Material name.</summary>
    public string Material { get; set; } = "";

    /// <summary>Sphere radius, m.</summary>
    public double RadiusM { get; set; }

    /// <summary>Coil plane above the surface, m.</summary>
    public double HeightM { get; set; }

    /// <summary>Coil mean diameter, m.</summary>
    public double CoilDiameterM { get; set; }

    /// <summary>Sweep speed, m/s.</summary>
    public double SpeedMPerS { get; set; }

    /// <summary>Threshold in noise sigmas.</summary>
    public double ThresholdSigma { get; set; }

    /// <summary>Gate, s.</summary>
    public double GateS { get; set; }

    /// <summary>ferrous or non-ferrous: what the sign of the shift says at the search frequency.</summary>
    public string SignRuleClass { get; set; } = "";

    /// <summary>One row per method and estimator.</summary>
    public List<DepthRow> Rows { get; set; } = new();

    /// <summary>Shift against depth.</summary>
    public List<DepthPoint> Curve { get; set; } = new();
}
