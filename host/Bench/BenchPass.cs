namespace FreqReadout.Host.Bench;

/// <summary>One truth pass of a bench scene: target k on leg k.</summary>
/// <param name="Target">Target name (t0, t1, ...).</param>
/// <param name="Index">Target and leg number.</param>
/// <param name="StartSeconds">Leg start (the target's |shift| is 0.5 % of its peak), s.</param>
/// <param name="EndSeconds">Leg end, s.</param>
/// <param name="PeakSeconds">Truth peak time, s.</param>
/// <param name="PeakShiftHz">Truth peak shift of the search oscillator (this target alone, no drift or noise), Hz.</param>
/// <param name="MaterialClass">ferrous or non-ferrous: what it is made of.</param>
/// <param name="SignRuleClass">What the sign rule should call it at the operating frequency (the class scored).</param>
/// <param name="PeakNoise">|Truth peak| over the scene's gate noise.</param>
public sealed record BenchPass(string Target, int Index, double StartSeconds, double EndSeconds, double PeakSeconds, double PeakShiftHz, string MaterialClass, string SignRuleClass, double PeakNoise);
