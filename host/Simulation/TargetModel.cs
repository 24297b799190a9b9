using System.Numerics;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// A scene target made ready for simulation: its material, its polarizability at the operating frequency and its dipole
/// points (one for a sphere, a row of touching spheres for a pipe). Coordinates: x along the line, y across, z up from the
/// surface (the target centre at z = -depth).
/// </summary>
public sealed class TargetModel
{
    private readonly double[] _x;
    private readonly double[] _y;

    public TargetModel(SceneTarget target, Material material, double operatingFrequencyHz)
    {
        Target = target;
        Material = material;
        Normalised = SpherePolarizability.Normalised(target.RadiusM, material.ConductivitySPerM, material.RelativePermeability, operatingFrequencyHz);
        PolarizabilityM3 = 2.0 * Math.PI * Math.Pow(target.RadiusM, 3) * Normalised;
        CrossoverHz = SpherePolarizability.CrossoverFrequencyHz(target.RadiusM, material.ConductivitySPerM, material.RelativePermeability);
        if (target.Shape == TargetShape.Pipe)
        {
            int n = Math.Max(1, (int)Math.Floor(target.LengthM!.Value / (2 * target.RadiusM)));
            _x = new double[n];
            _y = new double[n];
            double first = target.OffsetM - (n - 1) * target.RadiusM;
            for (int i = 0; i < n; i++)
            {
                _x[i] = target.PositionM;
                _y[i] = first + 2 * target.RadiusM * i;
            }
        }
        else
        {
            _x = new[] { target.PositionM };
            _y = new[] { target.OffsetM };
        }
    }

    /// <summary>The scene's description of the target.</summary>
    public SceneTarget Target { get; }

    /// <summary>Resolved material.</summary>
    public Material Material { get; }

    /// <summary>M / (2 pi a^3) at the operating frequency (per sphere).</summary>
    public Complex Normalised { get; }

    /// <summary>M per sphere, m^3.</summary>
    public Complex PolarizabilityM3 { get; }

    /// <summary>Ferrous crossover frequency of one sphere (Re M = 0), Hz; NaN when non-magnetic.</summary>
    public double CrossoverHz { get; }

    /// <summary>Number of dipole points.</summary>
    public int DipoleCount => _x.Length;

    /// <summary>"ferrous" or "non-ferrous": what the material is.</summary>
    public string MaterialClass => Material.IsFerrous ? "ferrous" : "non-ferrous";

    /// <summary>
    /// What the sign rule reports at the operating frequency: Re M &gt; 0 raises L and lowers f ("ferrous"), Re M &lt; 0 raises f
    /// ("non-ferrous"). Differs from <see cref="MaterialClass"/> for iron above its crossover.
    /// </summary>
    public string SignRuleClass => Normalised.Real > 0 ? "ferrous" : "non-ferrous";

    /// <summary>Inductance change (H) with the coil's centre at (x, 0) at height h above the surface; sum over the dipole points.</summary>
    public double InductanceChangeH(SearchCoil coil, double coilXM, double coilHeightM)
    {
        double axial = coilHeightM + Target.DepthM;
        double sum = 0;
        for (int i = 0; i < _x.Length; i++)
        {
            double dx = coilXM - _x[i];
            double dy = _y[i];
            double radial = Math.Sqrt(dx * dx + dy * dy);
            sum += CoilTargetCoupling.InductanceChangeH(coil, PolarizabilityM3, radial, axial);
        }

        return sum;
    }

    /// <summary>Closest centre distance from the coil plane's centre line at height h to the target, over the dipole points, in target radii (the dipole model wants about 10).</summary>
    public double ClosestDistanceInRadii(double coilHeightM) => (coilHeightM + Target.DepthM) / Target.RadiusM;
}
