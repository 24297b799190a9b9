namespace FreqReadout.Host.Simulation;

/// <summary>
/// A multilayer circular search coil from its geometry. Lengths in metres. Inductance two ways, side by side:
/// Wheeler's multilayer formula and the thin N-turn loop with the winding taken as a round bundle of equal area.
/// </summary>
public sealed class SearchCoil
{
    /// <summary>Creates a coil; throws <see cref="ArgumentOutOfRangeException"/> naming the bad value and its range.</summary>
    /// <param name="turns">Number of turns, 1..100000.</param>
    /// <param name="meanDiameterM">Mean winding diameter, m (&gt; 0).</param>
    /// <param name="windingLengthM">Axial winding length b, m; 0 = derive from the wire (square bundle of N d^2).</param>
    /// <param name="windingDepthM">Radial winding depth c, m; 0 = derive from the wire.</param>
    /// <param name="wireDiameterM">Wire diameter, m (&gt; 0).</param>
    public SearchCoil(int turns, double meanDiameterM, double windingLengthM, double windingDepthM, double wireDiameterM)
    {
        if (turns < 1 || turns > 100000)
        {
            throw new ArgumentOutOfRangeException(nameof(turns), turns, "coil turns must be an integer 1..100000");
        }

        if (!(meanDiameterM > 0) || meanDiameterM > 10)
        {
            throw new ArgumentOutOfRangeException(nameof(meanDiameterM), meanDiameterM, "coil mean diameter must be > 0 and <= 10 m");
        }

        if (!(wireDiameterM > 0) || wireDiameterM >= meanDiameterM)
        {
            throw new ArgumentOutOfRangeException(nameof(wireDiameterM), wireDiameterM, "coil wire diameter must be > 0 and below the mean diameter");
        }

        if (!(windingLengthM >= 0) || !(windingDepthM >= 0) || windingDepthM >= meanDiameterM)
        {
            throw new ArgumentOutOfRangeException(nameof(windingLengthM), windingLengthM, "coil winding length and depth must be >= 0 (0 = from the wire) and the depth below the mean diameter");
        }

        Turns = turns;
        MeanDiameterM = meanDiameterM;
        WireDiameterM = wireDiameterM;
        double side = Math.Sqrt(turns) * wireDiameterM;
        WindingLengthM = windingLengthM > 0 ? windingLengthM : side;
        WindingDepthM = windingDepthM > 0 ? windingDepthM : side;
    }

    /// <summary>Number of turns N.</summary>
    public int Turns { get; }

    /// <summary>Mean diameter, m.</summary>
    public double MeanDiameterM { get; }

    /// <summary>Mean radius a (Wheeler) or R (thin loop), m.</summary>
    public double MeanRadiusM => MeanDiameterM / 2.0;

    /// <summary>Axial winding length b, m (given, or sqrt(N) d).</summary>
    public double WindingLengthM { get; }

    /// <summary>Radial winding depth c, m (given, or sqrt(N) d).</summary>
    public double WindingDepthM { get; }

    /// <summary>Wire diameter d, m.</summary>
    public double WireDiameterM { get; }

    /// <summary>Radius of the round bundle with the winding's cross-section area: sqrt(b c / pi), m.</summary>
    public double BundleRadiusM => Math.Sqrt(WindingLengthM * WindingDepthM / Math.PI);

    /// <summary>
    /// Wheeler multilayer formula (Proc. IRE 16(10):1398, 1928), SI form: L(uH) = 31.496 a^2 N^2 / (6a + 9b + 10c),
    /// a mean radius, b winding length, c winding depth in metres. Returns henries.
    /// </summary>
    public double WheelerInductanceH => WheelerH(MeanRadiusM, WindingLengthM, WindingDepthM, Turns);

    /// <summary>
    /// Thin N-turn loop (Maxwell 1865; Makarov et al. 2015 eq. 10.11) with the winding as a round bundle of equal area and
    /// uniform current: L = mu0 N^2 R (ln(8R/a) - 1.75). Returns henries.
    /// </summary>
    public double ThinLoopInductanceH => ThinLoopH(MeanRadiusM, BundleRadiusM, Turns, ThinLoopCurrent.Uniform);

    /// <summary>(thin loop - Wheeler) / Wheeler.</summary>
    public double InductanceRelativeDifference => (ThinLoopInductanceH - WheelerInductanceH) / WheelerInductanceH;

    /// <summary>Wheeler L(uH) = 31.496 a^2 N^2 / (6a + 9b + 10c) with metres, returned in henries. All lengths &gt;= 0, a &gt; 0.</summary>
    public static double WheelerH(double meanRadiusM, double windingLengthM, double windingDepthM, int turns)
    {
        double n = turns;
        double denominator = 6.0 * meanRadiusM + 9.0 * windingLengthM + 10.0 * windingDepthM;
        return 31.496e-6 * meanRadiusM * meanRadiusM * n * n / denominator;
    }

    /// <summary>
    /// Thin N-turn loop L = mu0 N^2 R (ln(8R/a) - 2 + Y/2), Y = 1/2 (uniform current) or 0 (skin effect), in henries.
    /// R loop radius, a wire (or bundle) radius, both in metres with a &lt; R.
    /// </summary>
    public static double ThinLoopH(double loopRadiusM, double wireRadiusM, int turns, ThinLoopCurrent current)
    {
        if (!(wireRadiusM > 0) || !(wireRadiusM < loopRadiusM))
        {
            throw new ArgumentOutOfRangeException(nameof(wireRadiusM), wireRadiusM, "wire radius must be > 0 and below the loop radius");
        }

        double y = current == ThinLoopCurrent.Uniform ? 0.5 : 0.0;
        double n = turns;
        return PhysicalConstants.Mu0HPerM * n * n * loopRadiusM * (Math.Log(8.0 * loopRadiusM / wireRadiusM) - 2.0 + y / 2.0);
    }
}
