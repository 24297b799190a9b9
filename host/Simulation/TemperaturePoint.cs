namespace FreqReadout.Host.Simulation;

/// <summary>A point of a step or ramp temperature profile.</summary>
public sealed class TemperaturePoint
{
    /// <summary>Time from the capture start, s (&gt;= 0, increasing).</summary>
    public double TimeS { get; set; }

    /// <summary>Temperature, deg C.</summary>
    public double TempC { get; set; }
}
