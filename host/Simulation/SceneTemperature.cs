namespace FreqReadout.Host.Simulation;

/// <summary>Scene: a temperature profile (JSON object <c>temperature</c>), evaluated by <see cref="At"/>.</summary>
public sealed class SceneTemperature
{
    /// <summary>Profile shape. Default constant.</summary>
    public TemperatureProfileKind Kind { get; set; } = TemperatureProfileKind.Constant;

    /// <summary>Temperature at t = 0 (and the constant value), deg C. Default 20.</summary>
    public double StartC { get; set; } = 20.0;

    /// <summary>Settling: the ambient temperature approached, deg C. Default 20.</summary>
    public double AmbientC { get; set; } = 20.0;

    /// <summary>Settling: time constant, s (&gt; 0). Default 300.</summary>
    public double TimeConstantS { get; set; } = 300.0;

    /// <summary>Steps and ramps: the points, in increasing time.</summary>
    public List<TemperaturePoint> Points { get; set; } = new();

    /// <summary>
    /// Temperature at time t (s), deg C. Constant: start_c. Settling: ambient + (start - ambient) exp(-t/tau). Steps: the value
    /// of the last point with time &lt;= t (start_c before the first). Ramps: linear between neighbouring points, start_c
    /// at t = 0 to the first point, the last value after the last point. An empty point list gives start_c.
    /// </summary>
    public double At(double timeS)
    {
        switch (Kind)
        {
            case TemperatureProfileKind.Settling:
                return AmbientC + (StartC - AmbientC) * Math.Exp(-timeS / TimeConstantS);
            case TemperatureProfileKind.Steps:
            {
                double value = StartC;
                foreach (var p in Points)
                {
                    if (p.TimeS <= timeS)
                    {
                        value = p.TempC;
                    }
                    else
                    {
                        break;
                    }
                }

                return value;
            }

            case TemperatureProfileKind.Ramps:
            {
                double t0 = 0.0;
                double v0 = StartC;
                foreach (var p in Points)
                {
                    if (timeS < p.TimeS)
                    {
                        double span = p.TimeS - t0;
                        return span <= 0 ? p.TempC : v0 + (p.TempC - v0) * (timeS - t0) / span;
                    }

                    t0 = p.TimeS;
                    v0 = p.TempC;
                }

                return v0;
            }

            default:
                return StartC;
        }
    }
}
