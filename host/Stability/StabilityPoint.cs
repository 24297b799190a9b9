namespace FreqReadout.Host.Stability;

/// <summary>The stability figures at one averaging time.</summary>
/// <param name="TauSeconds">Averaging time, s.</param>
/// <param name="M">Averaging factor: tau / tau0.</param>
/// <param name="Adev">Overlapping Allan deviation, fractional.</param>
/// <param name="AdevLow">Lower bound of its 68.3 % interval.</param>
/// <param name="AdevHigh">Upper bound of its 68.3 % interval.</param>
/// <param name="Mdev">Modified Allan deviation, fractional (NaN where too few points).</param>
/// <param name="Edf">Equivalent degrees of freedom used for the interval.</param>
/// <param name="Noise">Noise type suggested by the local slope of the modified deviation.</param>
public sealed record StabilityPoint(double TauSeconds, int M, double Adev, double AdevLow, double AdevHigh, double Mdev, double Edf, NoiseType Noise);
