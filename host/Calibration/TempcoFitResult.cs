namespace FreqReadout.Host.Calibration;

/// <summary>A fitted search-oscillator tempco.</summary>
/// <param name="TempcoPpmPerK">Slope of the search frequency's relative change on temperature, ppm/K (the device setting tempco_ppm_per_k).</param>
/// <param name="StandardErrorPpmPerK">Its standard error (ordinary least squares; assumes independent residuals).</param>
/// <param name="ReferenceHz">Search frequency the ppm are relative to, Hz.</param>
/// <param name="MinTemperatureC">Lowest temperature in the fit.</param>
/// <param name="MaxTemperatureC">Highest temperature in the fit.</param>
/// <param name="Points">Temperature points fitted.</param>
/// <param name="Readings">Target-free readings behind them.</param>
/// <param name="RSquared">Coefficient of determination.</param>
/// <param name="ResidualPpm">Residual standard deviation, ppm.</param>
public readonly record struct TempcoFitResult(
    double TempcoPpmPerK,
    double StandardErrorPpmPerK,
    double ReferenceHz,
    double MinTemperatureC,
    double MaxTemperatureC,
    int Points,
    int Readings,
    double RSquared,
    double ResidualPpm);
