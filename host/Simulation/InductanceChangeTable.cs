using System.Runtime.CompilerServices;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// The targets' total inductance change as a function of the coil's position along the line, tabulated once so that the
/// simulator does not evaluate the exact coupling (every dipole point, two elliptic integrals each) at every control step.
/// <para>The coil height is fixed, so the coupling depends on time only through the coil position x(t): it changes on the
/// scale of the sweep (milliseconds to seconds), never within one oscillator cycle. Nodes lie every
/// <see cref="SpacingM"/> over the positions the sweep visits (two extra nodes beyond each end) and are evaluated exactly
/// (<see cref="SceneModel.InductanceChangeAtPositionH"/>) the first time a lookup needs them; between nodes the value is the
/// cubic through the four nearest nodes (Lagrange form). Its error is at most
/// (9/16) h^4 max|dL''''| / 24 (Abramowitz and Stegun 1964, eq. 25.2.13 with the remainder 25.2.14; from memory):
/// with the spacing h a 16th of the closest axial distance (coil height plus the shallowest target depth, or the coil radius
/// when that is smaller), which is the shortest length on which the loop field near a target changes, the error stays
/// below a part per million of the peak (6.7e-7 on the demo scene; the tests check 1e-5 of the peak against the exact
/// coupling).</para>
/// <para>A scene whose line is longer than <see cref="MaxNodes"/> nodes allow is not tabulated (<see cref="IsTabulated"/> is
/// false) and every lookup is exact.</para>
/// </summary>
public sealed class InductanceChangeTable
{
    /// <summary>Nodes per closest axial distance (coil height plus shallowest target depth, or coil radius if smaller).</summary>
    public const int NodesPerAxialDistance = 16;

    /// <summary>Largest table, nodes (16 MiB of doubles); a longer line is evaluated exactly.</summary>
    public const int MaxNodes = 1 << 21;

    private readonly SceneModel _model;
    private readonly double[]? _values;
    private readonly bool[]? _known;
    private readonly double _startM;
    private readonly double _inverseSpacing;

    /// <summary>Builds the (empty, lazily filled) table for the positions <paramref name="model"/>'s sweep visits.</summary>
    public InductanceChangeTable(SceneModel model)
    {
        _model = model;
        if (model.Targets.Count == 0)
        {
            SpacingM = double.PositiveInfinity;
            return;
        }

        double closest = model.Coil.MeanRadiusM;
        foreach (var t in model.Targets)
        {
            closest = Math.Min(closest, model.Plan.HeightM + t.Target.DepthM);
        }

        double low = double.PositiveInfinity;
        double high = double.NegativeInfinity;
        foreach (var p in model.Plan.Passes)
        {
            low = Math.Min(low, Math.Min(p.FromM, p.ToM));
            high = Math.Max(high, Math.Max(p.FromM, p.ToM));
        }

        double spacing = closest / NodesPerAxialDistance;
        double nodes = Math.Ceiling((high - low) / spacing) + 5;
        SpacingM = spacing;
        if (!(nodes <= MaxNodes))
        {
            return;
        }

        _startM = low - 2 * spacing;
        _inverseSpacing = 1.0 / spacing;
        _values = new double[(int)nodes];
        _known = new bool[(int)nodes];
    }

    /// <summary>Node spacing, m (infinite without targets).</summary>
    public double SpacingM { get; }

    /// <summary>False when the line is too long for a table (lookups are then exact) or there are no targets.</summary>
    public bool IsTabulated => _values is not null;

    /// <summary>Nodes evaluated so far (each one exact coupling of every target).</summary>
    public int NodesEvaluated { get; private set; }

    /// <summary>
    /// Total inductance change with the coil centre at <paramref name="positionM"/>, H: the cubic through the four nearest
    /// nodes; exact when not tabulated or outside the table; 0 without targets.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    public double AtPositionH(double positionM)
    {
        if (_values is null)
        {
            return _model.Targets.Count == 0 ? 0.0 : _model.InductanceChangeAtPositionH(positionM);
        }

        double u = (positionM - _startM) * _inverseSpacing;
        int i = (int)Math.Floor(u);
        if (!(i >= 1 && i + 2 < _values.Length))
        {
            return _model.InductanceChangeAtPositionH(positionM);
        }

        double s = u - i;
        double a = Node(i - 1);
        double b = Node(i);
        double c = Node(i + 1);
        double d = Node(i + 2);

        // Lagrange cubic on nodes -1, 0, 1, 2 at s in [0, 1).
        double sm1 = s - 1.0;
        double sm2 = s - 2.0;
        double sp1 = s + 1.0;
        return (-a * s * sm1 * sm2 / 6.0) + (b * sp1 * sm1 * sm2 / 2.0) - (c * sp1 * s * sm2 / 2.0) + (d * sp1 * s * sm1 / 6.0);
    }

    private double Node(int index)
    {
        if (!_known![index])
        {
            _values![index] = _model.InductanceChangeAtPositionH(_startM + index * SpacingM);
            _known[index] = true;
            NodesEvaluated++;
        }

        return _values![index];
    }
}
