namespace FreqReadout.Host.Bench;

/// <summary>A placed bench target.</summary>
/// <param name="Material">Material preset name.</param>
/// <param name="RadiusM">Sphere radius, m.</param>
/// <param name="DepthM">Depth of the centre, m.</param>
/// <param name="PeakShiftHz">|Search shift| at the peak for this radius and depth (the bisection's last value), Hz.</param>
/// <param name="HalfPeakOffsetM">Largest coil offset along the line at which |shift| is at least half the peak, m.</param>
/// <param name="LegEndOffsetM">Coil offset at which |shift| has fallen to <see cref="TargetPlacement.LegEndFraction"/> of the peak, m.</param>
public sealed record TargetPlacementResult(string Material, double RadiusM, double DepthM, double PeakShiftHz, double HalfPeakOffsetM, double LegEndOffsetM);
