namespace FreqReadout.Host.Calibration;

/// <summary>
/// One calibration point: the mean counted frequency of the target-free readings between two
/// temperature samples, against the first of them.
/// </summary>
/// <param name="TemperatureC">The temperature sample, deg C.</param>
/// <param name="FrequencyHz">Mean counted frequency of the target-free readings until the next sample, Hz.</param>
/// <param name="TimeSeconds">Time of the sample, s.</param>
/// <param name="Readings">Readings averaged.</param>
public readonly record struct TempcoPoint(double TemperatureC, double FrequencyHz, double TimeSeconds, int Readings);
