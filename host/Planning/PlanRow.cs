namespace FreqReadout.Host.Planning;

/// <summary>One row of <c>plan</c>'s resolution table: a method, an estimator and a gate. Property names become JSON keys.</summary>
public sealed class PlanRow
{
    /// <summary>Timestamp method name.</summary>
    public string Method { get; set; } = "";

    /// <summary>Estimator name (reciprocal, regression, snapshot-regression).</summary>
    public string Estimator { get; set; } = "";

    /// <summary>Counted signal: search or beat.</summary>
    public string Signal { get; set; } = "";

    /// <summary>Gate time asked for, s.</summary>
    public double GateS { get; set; }

    /// <summary>The gate's real length (whole intervals of the recorded rate), s.</summary>
    public double GateSpanS { get; set; }

    /// <summary>Predicted standard deviation of a gate's frequency, Hz (equal in search-oscillator Hz: a search shift moves the beat by as much).</summary>
    public double ResolutionHz { get; set; }

    /// <summary>The same against the search frequency, ppm.</summary>
    public double ResolutionPpm { get; set; }

    /// <summary>Readings a second (1 / gate span).</summary>
    public double UpdatesPerS { get; set; }

    /// <summary>Recorded edges (edge methods) or reads (pulse counter) a second the device must take.</summary>
    public double ServiceRatePerS { get; set; }

    /// <summary>IL operations a second that takes, with the gate closes.</summary>
    public double DeviceOpsPerS { get; set; }

    /// <summary>Share of 1 M op/s, percent.</summary>
    public double BudgetPctAtLowRate { get; set; }

    /// <summary>Share of 5 M op/s, percent.</summary>
    public double BudgetPctAtHighRate { get; set; }

    /// <summary>Verdict: ok, tight (over the budget at 1 M op/s), over (over it even at 5 M op/s or above the method's edge rate).</summary>
    public string Verdict { get; set; } = "ok";

    /// <summary>Why the verdict is not ok; empty when ok.</summary>
    public List<string> Warnings { get; set; } = new();
}
