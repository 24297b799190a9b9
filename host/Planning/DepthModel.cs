using System.Numerics;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Planning;

/// <summary>
/// The shift one small target makes as the coil passes straight over it, for <c>plan</c>'s depth answer. The physics is
/// <c>coil</c>'s and the simulator's (<see cref="CoilTargetCoupling"/>: the exact loop field, dL = mu0 Re(M) |H/I|^2;
/// <see cref="LcResonance.FractionalShift"/>: f' = f (1 + dL/L)^(-1/2)); the coil plane is <c>heightM</c> above the surface
/// and the target centre <c>depth</c> below it, on the sweep line.
/// <para>A gate does not see the instantaneous peak: it reads a weighted mean of the shift over the ground the coil covers
/// in the gate, w = speed x T. The reciprocal counter's mean is flat over the gate (frequency = whole periods / span); a
/// least-squares slope weighs the middle of the gate most, with the parabolic weights 6 u (1 - u) over u in [0, 1]
/// (its readings are parabolically weighted averages: Vernotte, Lenczner, Bourgeois and Rubiola, IEEE TUFFC 63(4):611, 2016,
/// from memory). Where the gate boundaries fall against the pass is chance: the largest reading of a pass is averaged
/// over that phase (a gate centred on the peak is the best case, a boundary on the peak the worst).</para>
/// </summary>
public sealed class DepthModel
{
    private const int GridPoints = 801;
    private readonly SearchCoil _coil;
    private readonly double _inductanceH;
    private readonly double _frequencyHz;
    private readonly Complex _polarizabilityM3;
    private readonly double _heightM;
    private readonly double _speedMPerS;

    /// <summary>A target of polarizability <paramref name="polarizabilityM3"/> under <paramref name="coil"/>.</summary>
    public DepthModel(SearchCoil coil, double inductanceH, double frequencyHz, Complex polarizabilityM3, double heightM, double speedMPerS)
    {
        _coil = coil;
        _inductanceH = inductanceH;
        _frequencyHz = frequencyHz;
        _polarizabilityM3 = polarizabilityM3;
        _heightM = heightM;
        _speedMPerS = speedMPerS;
    }

    /// <summary>Search shift with the coil <paramref name="alongM"/> from the point above the target, Hz.</summary>
    public double ShiftHz(double depthM, double alongM)
    {
        double dl = CoilTargetCoupling.InductanceChangeH(_coil, _polarizabilityM3, Math.Abs(alongM), _heightM + depthM);
        return _frequencyHz * LcResonance.FractionalShift(_inductanceH, dl);
    }

    /// <summary>The instantaneous peak shift of a pass (largest |shift| along the line, with its sign), Hz.</summary>
    public double PeakShiftHz(double depthM) => GateShiftHz(depthM, 0, PlanEstimators.Reciprocal);

    /// <summary>
    /// The largest |gate reading| of a pass (with its sign), Hz: the profile along the line weighted over the coil's travel
    /// in one gate (flat for the reciprocal, parabolic for the regressions); gates follow one another, and the figure is the
    /// largest reading of a pass averaged over where the gate boundaries fall against it (uniformly, one grid step apart).
    /// A gate of no travel gives the instantaneous peak.
    /// </summary>
    public double GateShiftHz(double depthM, double gateS, string estimator)
    {
        double reach = 3.0 * (_coil.MeanRadiusM + _heightM + depthM);
        double travel = _speedMPerS * gateS;
        double step = 2.0 * reach / (GridPoints - 1);
        double[] profile = new double[GridPoints];
        for (int i = 0; i < GridPoints; i++)
        {
            profile[i] = ShiftHz(depthM, -reach + (i * step));
        }

        int half = (int)Math.Floor(travel / (2.0 * step));
        int width = (2 * half) + 1;
        double[] reading = new double[GridPoints];
        for (int i = half; i < GridPoints - half; i++)
        {
            double sum = 0;
            double weights = 0;
            for (int k = -half; k <= half; k++)
            {
                double u = half == 0 ? 0.5 : (k + half + 0.5) / width;
                double w = estimator == PlanEstimators.Reciprocal ? 1.0 : 6.0 * u * (1.0 - u);
                sum += w * profile[i + k];
                weights += w;
            }

            reading[i] = sum / weights;
        }

        // Gates follow one another without gaps, so their centres are one gate apart; where they fall against the pass is
        // chance. For each phase of the gate boundaries take the largest |reading|, then average over the phases.
        double total = 0;
        for (int phase = 0; phase < width; phase++)
        {
            double best = 0;
            for (int i = half + phase; i < GridPoints - half; i += width)
            {
                if (Math.Abs(reading[i]) > Math.Abs(best))
                {
                    best = reading[i];
                }
            }

            total += best;
        }

        return total / width;
    }

    /// <summary>Length of the line over which |shift| is at least half its peak, m.</summary>
    public double HalfPeakWidthM(double depthM)
    {
        double reach = 3.0 * (_coil.MeanRadiusM + _heightM + depthM);
        double step = 2.0 * reach / (GridPoints - 1);
        double peak = Math.Abs(PeakShiftHz(depthM));
        int count = 0;
        for (int i = 0; i < GridPoints; i++)
        {
            if (Math.Abs(ShiftHz(depthM, -reach + (i * step))) >= peak / 2)
            {
                count++;
            }
        }

        return count * step;
    }

    /// <summary>
    /// The depth in [<paramref name="minDepthM"/>, <paramref name="maxDepthM"/>] where the largest |gate reading| equals
    /// <paramref name="thresholdHz"/>, by bisection (it falls monotonically with depth), to 0.1 mm. False when even the
    /// shallowest depth stays below the threshold; <paramref name="maxDepthM"/> with false when the deepest still reaches it.
    /// </summary>
    public bool TryFindDepth(double thresholdHz, double gateS, string estimator, double minDepthM, double maxDepthM, out double depthM)
    {
        depthM = double.NaN;
        if (Math.Abs(GateShiftHz(minDepthM, gateS, estimator)) < thresholdHz)
        {
            return false;
        }

        if (Math.Abs(GateShiftHz(maxDepthM, gateS, estimator)) >= thresholdHz)
        {
            depthM = maxDepthM;
            return false;
        }

        double lo = minDepthM, hi = maxDepthM;
        while (hi - lo > 1e-4)
        {
            double mid = 0.5 * (lo + hi);
            if (Math.Abs(GateShiftHz(mid, gateS, estimator)) >= thresholdHz)
            {
                lo = mid;
            }
            else
            {
                hi = mid;
            }
        }

        depthM = 0.5 * (lo + hi);
        return true;
    }
}
