using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Planning;

/// <summary>
/// Builds <c>plan</c>'s report: the resolution table (<see cref="ResolutionModel"/>), the device's share of its operation
/// budget (<see cref="DeviceCosts"/>), the beat note against the search oscillator, and the depth answer
/// (<see cref="DepthModel"/>).
/// <para>Pulse-counter snapshots count the signal after its prescaler, in whole counts: with a prescaler p every count is p
/// input edges, so the figure is p x the snapshot figure at f / p (a prescaler costs the snapshots resolution).</para>
/// <para>Depth: the noise is the predicted standard deviation of a gate's frequency at the chosen gate; the target counts as
/// seen where the largest |gate reading| of a pass reaches threshold_sigma x that noise, which is what the readout's
/// detector asks of a reading (threshold_sigma x its tracked noise, whose robust estimate of the target-free residuals
/// follows the gate noise). Its other conditions (a reading above the release level for min_duration_s) are met by that
/// gate at the default settings (min_duration_s = one 0.1 s gate, release level threshold - hysteresis). The shallowest
/// depth modelled is 1.5 target radii, the deepest <see cref="MaxDepthM"/>.</para>
/// </summary>
public static class PlanBuilder
{
    /// <summary>Deepest target depth modelled, m.</summary>
    public const double MaxDepthM = 5.0;

    /// <summary>Below this beat note the readout flags near zero beat (its default beat_floor_hz), Hz.</summary>
    public static double NearZeroBeatHz => new FreqReadout.Readout.ReadoutSettings().BeatFloorHz;

    /// <summary>Points on the shift-against-depth curve.</summary>
    public const int CurvePoints = 40;

    /// <summary>Predicted gate noise of the counted signal, Hz, with the snapshot prescaler rule above.</summary>
    public static double SigmaHz(string estimator, TimestampPreset method, double countedHz, int prescale, double gateS) =>
        method.Input == CaptureKind.Snapshots
            ? prescale * ResolutionModel.SigmaHz(estimator, method, countedHz / prescale, 1, gateS)
            : ResolutionModel.SigmaHz(estimator, method, countedHz, prescale, gateS);

    /// <summary>Builds the report.</summary>
    public static PlanReport Build(PlanInputs inputs)
    {
        bool beat = inputs.Signal == "beat";
        double counted = beat ? inputs.BeatHz : inputs.SearchHz;
        int prescale = beat ? inputs.BeatPrescale : inputs.SearchPrescale;
        var report = new PlanReport
        {
            Signal = inputs.Signal,
            SearchHz = inputs.SearchHz,
            BeatHz = inputs.BeatHz,
            SearchPrescale = inputs.SearchPrescale,
            BeatPrescale = inputs.BeatPrescale,
            GateS = inputs.GateS,
            Methods = inputs.Methods.ToList(),
        };
        foreach (TimestampPreset method in inputs.Methods)
        {
            foreach (string estimator in method.Estimators)
            {
                foreach (double gate in inputs.GatesS)
                {
                    report.Rows.Add(Row(method, estimator, inputs.Signal, counted, prescale, gate, inputs.SearchHz));
                }
            }
        }

        foreach (TimestampPreset method in inputs.Methods)
        {
            foreach (string estimator in method.Estimators)
            {
                double search = SigmaHz(estimator, method, inputs.SearchHz, inputs.SearchPrescale, inputs.GateS);
                double beatSigma = SigmaHz(estimator, method, inputs.BeatHz, inputs.BeatPrescale, inputs.GateS);
                report.BeatGains.Add(new BeatGainRow
                {
                    Method = method.Name,
                    Estimator = estimator,
                    SearchResolutionHz = search,
                    BeatResolutionHz = beatSigma,
                    Gain = search / beatSigma,
                });
            }
        }

        if (inputs.BeatHz < NearZeroBeatHz)
        {
            report.Warnings.Add(string.Create(CultureInfo.InvariantCulture,
                $"a beat note of {inputs.BeatHz:G4} Hz is below {NearZeroBeatHz:G3} Hz (the readout's default beat_floor_hz): near zero beat the oscillators pull or lock together and the sign of a shift is unclear"));
        }

        if (prescale > 1 && inputs.Methods.Any(m => m.Input == CaptureKind.Snapshots))
        {
            report.Warnings.Add("a prescaler before the pulse counter makes every count a whole divided edge: the reads lose resolution by the division; count the undivided signal where the counter's edge rate allows");
        }

        if (inputs.Methods.Any(m => m.JitterS == 0))
        {
            report.Warnings.Add("a method with jitter 0 has the timer's quantisation alone, which is not white: the real scatter depends on the ratio of signal to clock and may differ from its figure");
        }

        if (inputs.Target is { } t)
        {
            report.Depth = Depth(inputs, t, counted, prescale);
        }

        return report;
    }

    private static PlanRow Row(TimestampPreset method, string estimator, string signal, double counted, int prescale, double gate, double searchHz)
    {
        var ci = CultureInfo.InvariantCulture;
        bool snapshots = method.Input == CaptureKind.Snapshots;
        double recorded = counted / prescale;
        double serviceRate = snapshots ? method.ReadRateHz : recorded;
        double span = ResolutionModel.GateSpanS(serviceRate, gate);
        double sigma = SigmaHz(estimator, method, counted, prescale, gate);
        double ops = snapshots
            ? (serviceRate * DeviceCosts.SnapshotReadOps) + (DeviceCosts.SnapshotGateCloseOps / span)
            : (serviceRate * DeviceCosts.EdgeReadOps) + (DeviceCosts.EdgeGateCloseOps / span);
        var row = new PlanRow
        {
            Method = method.Name,
            Estimator = estimator,
            Signal = signal,
            GateS = gate,
            GateSpanS = span,
            ResolutionHz = sigma,
            ResolutionPpm = sigma / searchHz * 1e6,
            UpdatesPerS = 1.0 / span,
            ServiceRatePerS = serviceRate,
            DeviceOpsPerS = ops,
            BudgetPctAtLowRate = ops / DeviceCosts.LowOpsPerSecond * 100,
            BudgetPctAtHighRate = ops / DeviceCosts.HighOpsPerSecond * 100,
        };
        bool over = false, tight = false;
        if (recorded > method.MaxEdgeRateHz)
        {
            over = true;
            double need = Math.Pow(2, Math.Ceiling(Math.Log2(counted / method.MaxEdgeRateHz)));
            row.Warnings.Add(string.Create(ci, $"{recorded:G4} edges/s into a method that takes at most {method.MaxEdgeRateHz:G4}/s: divide by {need:0} or more"));
        }

        if (row.BudgetPctAtHighRate > 100)
        {
            over = true;
            row.Warnings.Add(string.Create(ci, $"needs {row.BudgetPctAtHighRate:0} % of the device even at 5 M op/s: cannot keep up"));
        }
        else if (row.BudgetPctAtLowRate > 100)
        {
            tight = true;
            row.Warnings.Add(string.Create(ci, $"needs {row.BudgetPctAtLowRate:0} % of the device at 1 M op/s: keeps up only on a fast board"));
        }

        if (span > gate * 1.5)
        {
            row.Warnings.Add(string.Create(ci, $"the gate spans whole intervals: {span:G3} s, not {gate:G3} s"));
        }

        row.Verdict = over ? "over" : tight ? "tight" : "ok";
        return row;
    }

    private static PlanDepthReport Depth(PlanInputs inputs, PlanTarget t, double counted, int prescale)
    {
        var polarizability = SpherePolarizability.PolarizabilityM3(t.RadiusM, t.Material.ConductivitySPerM, t.Material.RelativePermeability, inputs.SearchHz);
        var model = new DepthModel(t.Coil, t.InductanceH, inputs.SearchHz, polarizability, t.HeightM, t.SpeedMPerS);
        double minDepth = 1.5 * t.RadiusM;
        var depth = new PlanDepthReport
        {
            Material = t.Material.Name,
            RadiusM = t.RadiusM,
            HeightM = t.HeightM,
            CoilDiameterM = t.Coil.MeanDiameterM,
            SpeedMPerS = t.SpeedMPerS,
            ThresholdSigma = t.ThresholdSigma,
            GateS = inputs.GateS,
            SignRuleClass = polarizability.Real > 0 ? "ferrous" : "non-ferrous",
        };
        double deepest = 0;
        foreach (TimestampPreset method in inputs.Methods)
        {
            foreach (string estimator in method.Estimators)
            {
                double noise = SigmaHz(estimator, method, counted, prescale, inputs.GateS);
                double threshold = t.ThresholdSigma * noise;
                bool found = model.TryFindDepth(threshold, inputs.GateS, estimator, minDepth, MaxDepthM, out double d);
                var row = new DepthRow { Method = method.Name, Estimator = estimator, NoiseHz = noise, ThresholdHz = threshold };
                if (found || !double.IsNaN(d))
                {
                    row.DepthM = d;
                    row.BeyondRange = !found;
                    row.PassS = model.HalfPeakWidthM(d) / t.SpeedMPerS;
                    row.Smeared = inputs.GateS > row.PassS / 2;
                    deepest = Math.Max(deepest, d);
                }

                depth.Rows.Add(row);
            }
        }

        double top = Math.Min(MaxDepthM, Math.Max(2 * deepest, 2 * t.Coil.MeanDiameterM));
        for (int i = 0; i < CurvePoints; i++)
        {
            double d = minDepth + ((top - minDepth) * i / (CurvePoints - 1));
            depth.Curve.Add(new DepthPoint
            {
                DepthM = d,
                PeakShiftHz = Math.Abs(model.PeakShiftHz(d)),
                GateShiftHz = Math.Abs(model.GateShiftHz(d, inputs.GateS, PlanEstimators.Reciprocal)),
            });
        }

        return depth;
    }
}
