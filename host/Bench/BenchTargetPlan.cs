namespace FreqReadout.Host.Bench;

/// <summary>What the bench drew for one target (its pass is the leg with the same index).</summary>
/// <param name="Index">Target and leg number in the scene, from 0.</param>
/// <param name="SignRuleClass">ferrous or non-ferrous: the class dealt (the sign rule's at the operating frequency; half of each per kind and mode).</param>
/// <param name="Material">Material preset.</param>
/// <param name="PassSeconds">Drawn pass width (full width at half peak), s.</param>
/// <param name="PeakNoise">Drawn peak in gate-noise units.</param>
/// <param name="Placement">Radius, depth and the pass geometry that give that peak.</param>
public sealed record BenchTargetPlan(int Index, string SignRuleClass, string Material, double PassSeconds, double PeakNoise, TargetPlacementResult Placement);
