using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Planning;

/// <summary>The coil, target and sweep of <c>plan</c>'s depth answer.</summary>
public sealed class PlanTarget
{
    /// <summary>The search coil.</summary>
    public required SearchCoil Coil { get; init; }

    /// <summary>Inductance that sets the frequency (the coil's model), H.</summary>
    public required double InductanceH { get; init; }

    /// <summary>The target's material.</summary>
    public required Material Material { get; init; }

    /// <summary>Sphere radius, m.</summary>
    public required double RadiusM { get; init; }

    /// <summary>Coil plane above the surface, m.</summary>
    public required double HeightM { get; init; }

    /// <summary>Coil speed along the line, m/s.</summary>
    public required double SpeedMPerS { get; init; }

    /// <summary>Detection threshold in noise sigmas (the readout's threshold_sigma).</summary>
    public required double ThresholdSigma { get; init; }
}
