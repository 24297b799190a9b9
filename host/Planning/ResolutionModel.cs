namespace FreqReadout.Host.Planning;

/// <summary>
/// Predicted 1-sigma noise of one gate's frequency (the standard deviation of gate frequencies of a steady signal) for each
/// estimator, from white timing noise. Every figure is of the counted signal before the prescaler, in Hz.
/// <para>Timing noise per timestamp: sigma_x^2 = jitter^2 + tick^2 / 12 (tick = 1 / clock; the quantisation taken as white,
/// which holds once the jitter is a tick or more: with less, the quantisation error depends on the frequency ratio and can
/// be larger or smaller; see the caveat in docs/references.md).</para>
/// <para>Gate: a time gate closes on the first timestamp at or after T from its opening one, so it spans
/// I = ceil(T r) intervals of the recorded rate r (edges or reads a second), at least one: span tau = I / r; n = I + 1
/// timestamps.</para>
/// <list type="bullet">
/// <item>Reciprocal (first and last timestamp): sigma_f = f sqrt(2) sigma_x / tau (Rubiola, Rev. Sci. Instrum. 76, 054703,
/// 2005, the Pi counter: Var(y) = 2 sigma_x^2 / tau^2).</item>
/// <item>Regression (least-squares slope over the n edges): Var(period) = 12 sigma_x^2 / (n (n^2 - 1)), so
/// sigma_f = f r sigma_x sqrt(12 / (n (n^2 - 1))), about sqrt(12) sigma_x f / (T^1.5 sqrt(r)) (Rubiola 2005, the Omega
/// counter; Danielson, Vernotte and Rubiola, arXiv:1604.01004, eq. 21; Johansson, IEEE FCS 2005).</item>
/// <item>Snapshot regression (count c_k against read time t_k, M = n reads at spacing 1 / R): the count error per read is
/// sigma_c^2 = 1/12 (whole counts) + f^2 (jitter^2 + tick^2 / 12) (the read's time against its latch); the slope of a
/// straight-line fit has Var = sigma_c^2 / sum (t_k - mean t)^2 = 12 sigma_c^2 R^2 / (M (M^2 - 1)), so
/// sigma_f = sigma_c R sqrt(12 / (M (M^2 - 1))), about 1 / (T sqrt(M)) from the whole counts alone
/// (hardware-notes/timestamp-methods.md). The counted frequency does not enter the quantisation part: counting the beat
/// note gains nothing there.</item>
/// </list>
/// A gate with a non-positive span or rate gives NaN.
/// </summary>
public static class ResolutionModel
{
    /// <summary>sqrt(jitter^2 + tick^2 / 12), s.</summary>
    public static double TimingSigmaS(double jitterS, double clockHz) => Math.Sqrt((jitterS * jitterS) + (1.0 / (12.0 * clockHz * clockHz)));

    /// <summary>Intervals a time gate of <paramref name="gateS"/> spans at <paramref name="rateHz"/> timestamps a second: ceil(T r), at least 1.</summary>
    public static long GateIntervals(double rateHz, double gateS) => Math.Max(1L, (long)Math.Ceiling((gateS * rateHz) - 1e-9));

    /// <summary>The gate's real length, s: <see cref="GateIntervals"/> / rate.</summary>
    public static double GateSpanS(double rateHz, double gateS) => GateIntervals(rateHz, gateS) / rateHz;

    /// <summary>Reciprocal counter: f sqrt(2) sigma_x / tau, Hz.</summary>
    /// <param name="countedHz">Frequency of the counted signal before the prescaler, Hz.</param>
    /// <param name="prescale">Input edges per recorded edge.</param>
    /// <param name="jitterS">Rms jitter per timestamp, s.</param>
    /// <param name="clockHz">Timer clock, Hz.</param>
    /// <param name="gateS">Gate time asked for, s.</param>
    public static double ReciprocalSigmaHz(double countedHz, int prescale, double jitterS, double clockHz, double gateS)
    {
        double rate = countedHz / prescale;
        if (!(rate > 0) || !(gateS > 0))
        {
            return double.NaN;
        }

        return countedHz * Math.Sqrt(2.0) * TimingSigmaS(jitterS, clockHz) / GateSpanS(rate, gateS);
    }

    /// <summary>Regression counter: f r sigma_x sqrt(12 / (n (n^2 - 1))), Hz (arguments as <see cref="ReciprocalSigmaHz"/>).</summary>
    public static double RegressionSigmaHz(double countedHz, int prescale, double jitterS, double clockHz, double gateS)
    {
        double rate = countedHz / prescale;
        if (!(rate > 0) || !(gateS > 0))
        {
            return double.NaN;
        }

        double n = GateIntervals(rate, gateS) + 1.0;
        return countedHz * rate * TimingSigmaS(jitterS, clockHz) * Math.Sqrt(12.0 / (n * ((n * n) - 1.0)));
    }

    /// <summary>Snapshot regression: sigma_c R sqrt(12 / (M (M^2 - 1))), Hz.</summary>
    /// <param name="countedHz">Frequency the pulse counter counts, Hz.</param>
    /// <param name="readRateHz">Reads a second.</param>
    /// <param name="readJitterS">Rms error of a read's time stamp against the instant its count was latched, s.</param>
    /// <param name="clockHz">Clock of the read time stamps, Hz.</param>
    /// <param name="gateS">Gate time asked for, s.</param>
    public static double SnapshotSigmaHz(double countedHz, double readRateHz, double readJitterS, double clockHz, double gateS)
    {
        if (!(readRateHz > 0) || !(gateS > 0))
        {
            return double.NaN;
        }

        double m = GateIntervals(readRateHz, gateS) + 1.0;
        double timing = TimingSigmaS(readJitterS, clockHz);
        double countVariance = (1.0 / 12.0) + (countedHz * countedHz * timing * timing);
        return Math.Sqrt(countVariance) * readRateHz * Math.Sqrt(12.0 / (m * ((m * m) - 1.0)));
    }

    /// <summary>The figure of <paramref name="estimator"/> (a <see cref="PlanEstimators"/> name) for this method and signal.</summary>
    public static double SigmaHz(string estimator, TimestampPreset method, double countedHz, int prescale, double gateS) => estimator switch
    {
        PlanEstimators.Reciprocal => ReciprocalSigmaHz(countedHz, prescale, method.JitterS, method.ClockHz, gateS),
        PlanEstimators.Regression => RegressionSigmaHz(countedHz, prescale, method.JitterS, method.ClockHz, gateS),
        PlanEstimators.SnapshotRegression => SnapshotSigmaHz(countedHz, method.ReadRateHz, method.JitterS, method.ClockHz, gateS),
        _ => throw new ArgumentException("unknown estimator " + estimator, nameof(estimator)),
    };
}
