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
    /// A gate of no travel gives the instantaneous peak. The shift is taken as 0 beyond three times the coil radius, height
    /// and depth from the target, and every gate that overlaps that stretch reads it, however long the gate: a gate that
    /// holds the whole pass reads its integral over the travel.
    /// </summary>
    public double GateShiftHz(double depthM, double gateS, string estimator)
    {
        double reach = 3.0 * (_coil.MeanRadiusM + _heightM + depthM);
        double travel = _speedMPerS * gateS;
        double step = 2.0 * reach / (GridPoints - 1);
        int half = (int)Math.Floor(travel / (2.0 * step));
        int width = (2 * half) + 1;
        bool flat = estimator == PlanEstimators.Reciprocal || half == 0;

        // Prefix sums of p_j, j p_j and j^2 p_j: the weights are constant or quadratic in the grid index j, so a gate's
        // weighted sum over the grid points it covers comes from three differences, whatever its length.
        double[] s0 = new double[GridPoints + 1];
        double[] s1 = new double[GridPoints + 1];
        double[] s2 = new double[GridPoints + 1];
        for (int j = 0; j < GridPoints; j++)
        {
            double p = ShiftHz(depthM, -reach + (j * step));
            s0[j + 1] = s0[j] + p;
            s1[j + 1] = s1[j] + (j * p);
            s2[j + 1] = s2[j] + ((double)j * j * p);
        }

        // The weights of one whole gate, 6 u (1 - u) at u = (k + half + 0.5) / width (a parabola's weights sum to width
        // only in the limit; summing them keeps short gates exact).
        double totalWeight = width;
        if (!flat)
        {
            totalWeight = 0;
            for (int k = 0; k < width; k++)
            {
                double u = (k + 0.5) / width;
                totalWeight += 6.0 * u * (1.0 - u);
            }
        }

        // Gate centres from -half to GridPoints - 1 + half: every gate that overlaps the stretch with a shift.
        int positions = GridPoints + (2 * half);
        double[] reading = new double[positions];
        for (int n = 0; n < positions; n++)
        {
            int centre = n - half;
            int from = Math.Max(0, centre - half);
            int to = Math.Min(GridPoints - 1, centre + half);
            double a0 = s0[to + 1] - s0[from];
            double sum;
            if (flat)
            {
                sum = a0;
            }
            else
            {
                // w_j = 6 (j - c) / W - 6 (j - c)^2 / W^2 with c = centre - half - 0.5 and W = width.
                double a1 = s1[to + 1] - s1[from];
                double a2 = s2[to + 1] - s2[from];
                double c = centre - half - 0.5;
                sum = (6.0 / width * (a1 - (c * a0))) - (6.0 / ((double)width * width) * (a2 - (2.0 * c * a1) + (c * c * a0)));
            }

            reading[n] = sum / totalWeight;
        }

        // Gates follow one another without gaps, so their centres are one gate apart; where they fall against the pass is
        // chance. For each phase of the gate boundaries take the largest |reading|, then average over the phases.
        double total = 0;
        for (int phase = 0; phase < width; phase++)
        {
            double best = 0;
            for (int n = phase; n < positions; n += width)
            {
                if (Math.Abs(reading[n]) > Math.Abs(best))
                {
                    best = reading[n];
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
