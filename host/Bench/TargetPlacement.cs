using FreqReadout.Host.Simulation;

namespace FreqReadout.Host.Bench;

/// <summary>
/// Where a bench target goes so that its truth peak shift lands on a drawn value, and how long its pass is. The physics is
/// the simulator's own (<see cref="TargetModel"/>: Wait's sphere polarizability, the exact loop field, dL = mu0 Re(M) |H/I|^2,
/// f' = f (1 + dL/L)^(-1/2)); nothing here is fitted.
/// <para>Placement: a sphere on the line (offset 0) under the scene's coil (mean radius R) at the scene's height. Its radius is
/// drawn log-uniform in [max(1 mm, 0.03 R), 0.5 R], narrowed by the class it must show: a part that must read ferrous is
/// carbon steel below <see cref="FerrousRadiusFraction"/> of the radius whose crossover is the operating frequency, carbon
/// steel that must read non-ferrous is above <see cref="AboveCrossoverRadiusFraction"/> of it (r_x from the estimate
/// f_x = 1.641 mu_r / (pi mu0 sigma r^2), docs/references.md); a draw whose class by the exact polarizability is not the one
/// wanted is drawn again. The depth that gives the wanted peak |shift| (the largest over the coil's positions along the line)
/// is found by bisection on log depth (the peak falls monotonically with depth); a draw whose depth falls outside
/// [max(1.5 r, <see cref="MinDepthRadii"/> R), <see cref="MaxDepthRadii"/> R] is drawn again (up to <see cref="MaxDraws"/>
/// times).</para>
/// <para>Pass: the coil's positions where the target's |shift| is at least half its peak span the half-peak width; the coil's
/// speed is that width over the drawn pass width (so the pass's full width at half peak lasts the drawn time), and the leg
/// runs between the positions where |shift| falls to <see cref="LegEndFraction"/> of the peak.</para>
/// </summary>
public static class TargetPlacement
{
    /// <summary>A part that must read ferrous has a radius below this fraction of the crossover radius.</summary>
    public const double FerrousRadiusFraction = 0.85;

    /// <summary>Carbon steel that must read non-ferrous has a radius above this multiple of the crossover radius.</summary>
    public const double AboveCrossoverRadiusFraction = 1.2;

    /// <summary>Shallowest depth of the centre accepted, in coil radii.</summary>
    public const double MinDepthRadii = 0.1;

    /// <summary>Deepest depth of the centre accepted, in coil radii.</summary>
    public const double MaxDepthRadii = 3.0;

    /// <summary>A leg ends where the target's |shift| has fallen to this fraction of its peak.</summary>
    public const double LegEndFraction = 0.005;

    /// <summary>Radius draws tried before giving up.</summary>
    public const int MaxDraws = 400;

    private const int SearchGridPoints = 300;
    private const int ProfileGridPoints = 2000;

    /// <summary>
    /// Places one target of <paramref name="material"/> that must show <paramref name="signRuleClass"/> so that its peak
    /// |search shift| is <paramref name="peakShiftHz"/> under the coil of <paramref name="model"/> at <paramref name="heightM"/>.
    /// </summary>
    /// <exception cref="InvalidOperationException">No radius in range gives a depth in range (the message says which peak).</exception>
    public static TargetPlacementResult Place(SceneModel model, string material, string signRuleClass, double peakShiftHz, double heightM, SimulationRandom random)
    {
        return TryPlace(model, material, signRuleClass, peakShiftHz, heightM, random, out TargetPlacementResult? result, out string? why)
            ? result!
            : throw new InvalidOperationException(why);
    }

    /// <summary>As <see cref="Place"/>, but false with the reason instead of an exception.</summary>
    public static bool TryPlace(SceneModel model, string material, string signRuleClass, double peakShiftHz, double heightM, SimulationRandom random, out TargetPlacementResult? result, out string? why)
    {
        result = null;
        why = null;
        if (!MaterialPresets.TryGet(material, null, out Material m))
        {
            throw new ArgumentException("unknown material " + material, nameof(material));
        }

        double coilRadius = model.Coil.MeanRadiusM;
        double lower = Math.Max(0.001, 0.03 * coilRadius);
        double upper = 0.5 * coilRadius;
        if (m.IsFerrous)
        {
            double crossoverRadius = Math.Sqrt(1.641 * m.RelativePermeability / (Math.PI * PhysicalConstants.Mu0HPerM * m.ConductivitySPerM * model.SearchNominalHz));
            if (signRuleClass == "ferrous")
            {
                upper = Math.Min(upper, FerrousRadiusFraction * crossoverRadius);
            }
            else
            {
                lower = Math.Max(lower, AboveCrossoverRadiusFraction * crossoverRadius);
            }
        }

        if (!(upper > lower))
        {
            why = FormattableString.Invariant(
                $"no {material} sphere reads {signRuleClass} at {model.SearchNominalHz:G6} Hz within {Math.Max(0.001, 0.03 * coilRadius) * 1e3:0.##}-{0.5 * coilRadius * 1e3:0.##} mm (a coil of {2 * coilRadius * 1e3:0} mm)");
            return false;
        }

        double logMin = Math.Log(lower);
        double logMax = Math.Log(upper);
        double maxDepth = MaxDepthRadii * coilRadius;
        for (int draw = 0; draw < MaxDraws; draw++)
        {
            double radius = Math.Exp(logMin + ((logMax - logMin) * random.NextDouble()));
            var probe = new TargetModel(new SceneTarget { Material = material, RadiusM = radius }, m, model.SearchNominalHz);
            if (probe.SignRuleClass != signRuleClass)
            {
                continue;
            }

            double minDepth = Math.Max(1.5 * radius, MinDepthRadii * coilRadius);
            if (!(maxDepth > minDepth)
                || Peak(model, m, radius, minDepth, heightM, SearchGridPoints).PeakHz < peakShiftHz
                || Peak(model, m, radius, maxDepth, heightM, SearchGridPoints).PeakHz > peakShiftHz)
            {
                continue;
            }

            double lo = Math.Log(minDepth);
            double hi = Math.Log(maxDepth);
            for (int i = 0; i < 40; i++)
            {
                double mid = 0.5 * (lo + hi);
                if (Peak(model, m, radius, Math.Exp(mid), heightM, SearchGridPoints).PeakHz > peakShiftHz)
                {
                    lo = mid;
                }
                else
                {
                    hi = mid;
                }
            }

            double depth = Math.Exp(0.5 * (lo + hi));
            Profile p = Peak(model, m, radius, depth, heightM, ProfileGridPoints);
            result = new TargetPlacementResult(material, radius, depth, p.PeakHz, p.HalfPeakM, p.LegEndM);
            return true;
        }

        why = (FormattableString.Invariant(
            $"no {material} sphere of {lower * 1e3:0.##}-{upper * 1e3:0.##} mm reading {signRuleClass} at a depth of up to {maxDepth:0.000} m gives a peak shift of {peakShiftHz:G4} Hz at {model.SearchNominalHz:G6} Hz under a coil of {2 * coilRadius * 1e3:0} mm"));
        return false;
    }

    /// <summary>The target's |search shift| profile along the line: its peak (Hz), and the half-peak and leg-end offsets (m).</summary>
    private static Profile Peak(SceneModel model, Material material, double radiusM, double depthM, double heightM, int gridPoints)
    {
        var target = new SceneTarget { Name = "probe", Material = material.Name, RadiusM = radiusM, DepthM = depthM, PositionM = 0 };
        var tm = new TargetModel(target, material, model.SearchNominalHz);
        double axial = heightM + depthM;
        double span = model.Coil.MeanRadiusM + (5.0 * axial);
        double step = span / gridPoints;
        var shift = new double[gridPoints + 1];
        double peak = 0;
        for (int i = 0; i <= gridPoints; i++)
        {
            double dl = tm.InductanceChangeH(model.Coil, i * step, heightM);
            shift[i] = Math.Abs(model.SearchNominalHz * LcResonance.FractionalShift(model.InductanceH, dl));
            peak = Math.Max(peak, shift[i]);
        }

        int half = 0;
        int end = gridPoints;
        for (int i = gridPoints; i >= 0; i--)
        {
            if (shift[i] >= 0.5 * peak)
            {
                half = i;
                break;
            }
        }

        for (int i = gridPoints; i >= 0; i--)
        {
            if (shift[i] >= LegEndFraction * peak)
            {
                end = Math.Min(gridPoints, i + 1);
                break;
            }
        }

        return new Profile(peak, Math.Max(step, half * step), end * step);
    }

    private readonly record struct Profile(double PeakHz, double HalfPeakM, double LegEndM);
}
