namespace FreqReadout.Host.Simulation;

/// <summary>LC resonance f = 1 / (2 pi sqrt(L C)) and its inverse.</summary>
public static class LcResonance
{
    /// <summary>f = 1 / (2 pi sqrt(L C)), Hz. L in H, C in F, both &gt; 0 (else throws).</summary>
    public static double FrequencyHz(double inductanceH, double capacitanceF)
    {
        Positive(inductanceH, nameof(inductanceH));
        Positive(capacitanceF, nameof(capacitanceF));
        return 1.0 / (2.0 * Math.PI * Math.Sqrt(inductanceH * capacitanceF));
    }

    /// <summary>C = 1 / ((2 pi f)^2 L), F. L in H and f in Hz, both &gt; 0 (else throws).</summary>
    public static double CapacitanceF(double inductanceH, double frequencyHz)
    {
        Positive(inductanceH, nameof(inductanceH));
        Positive(frequencyHz, nameof(frequencyHz));
        double w = 2.0 * Math.PI * frequencyHz;
        return 1.0 / (w * w * inductanceH);
    }

    /// <summary>
    /// Exact fractional frequency change for an inductance change: f'/f - 1 = (1 + dL/L)^(-1/2) - 1
    /// (capacitance fixed). dL = 0 gives 0; dL/L &lt;= -1 throws.
    /// </summary>
    public static double FractionalShift(double inductanceH, double deltaInductanceH)
    {
        Positive(inductanceH, nameof(inductanceH));
        double r = deltaInductanceH / inductanceH;
        if (!(r > -1.0))
        {
            throw new ArgumentOutOfRangeException(nameof(deltaInductanceH), deltaInductanceH, "dL/L must be > -1");
        }

        // (1+r)^(-1/2) - 1 written without cancellation for small r.
        double s = Math.Sqrt(1.0 + r);
        return -r / (s * (1.0 + s));
    }

    private static void Positive(double v, string name)
    {
        if (!(v > 0) || double.IsInfinity(v))
        {
            throw new ArgumentOutOfRangeException(name, v, "must be a finite number > 0");
        }
    }
}
