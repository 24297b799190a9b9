namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: one buried target (JSON array <c>targets</c>). Geometry: x along the sweep line (<see cref="PositionM"/>), y across it
/// (<see cref="OffsetM"/>), depth of the centre below the surface (<see cref="DepthM"/>).
/// </summary>
public sealed class SceneTarget
{
    /// <summary>Label used in the truth file. Default "target".</summary>
    public string Name { get; set; } = "target";

    /// <summary>Material preset (silver, copper, aluminium, brass, cupronickel, stainless, carbon_steel) or "custom". Default copper.</summary>
    public string Material { get; set; } = "copper";

    /// <summary>Conductivity, S/m: required for custom, else overrides the preset.</summary>
    public double? ConductivitySPerM { get; set; }

    /// <summary>Relative permeability: carbon steel's parameter (default 100), custom (default 1), or an override.</summary>
    public double? MuR { get; set; }

    /// <summary>Shape. Default sphere.</summary>
    public TargetShape Shape { get; set; } = TargetShape.Sphere;

    /// <summary>Sphere radius (or pipe outer radius), m.</summary>
    public double RadiusM { get; set; } = 0.01;

    /// <summary>Pipe length across the sweep line, m (pipe only: required there, ignored for spheres).</summary>
    public double? LengthM { get; set; }

    /// <summary>Depth of the centre below the surface, m (&gt; radius).</summary>
    public double DepthM { get; set; } = 0.05;

    /// <summary>Position along the sweep line, m.</summary>
    public double PositionM { get; set; }

    /// <summary>Lateral offset from the sweep line, m. Default 0.</summary>
    public double OffsetM { get; set; }
}
