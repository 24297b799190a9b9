namespace FreqReadout.Host.Calibration;

/// <summary>
/// An ordinary least-squares line y = a + b x with the usual standard errors:
/// s = sqrt(SSE / (n - 2)), se(b) = s / sqrt(Sxx), se(a) = s sqrt(1/n + xbar^2 / Sxx), R^2 = 1 - SSE / Syy.
/// </summary>
/// <param name="Intercept">a.</param>
/// <param name="Slope">b.</param>
/// <param name="InterceptStandardError">se(a).</param>
/// <param name="SlopeStandardError">se(b).</param>
/// <param name="ResidualStandardDeviation">s.</param>
/// <param name="RSquared">Coefficient of determination (NaN when all y are equal).</param>
/// <param name="Count">n.</param>
public readonly record struct LineFit(double Intercept, double Slope, double InterceptStandardError, double SlopeStandardError, double ResidualStandardDeviation, double RSquared, int Count);
