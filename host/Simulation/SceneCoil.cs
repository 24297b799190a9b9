namespace FreqReadout.Host.Simulation;

/// <summary>Scene: the search coil's geometry (JSON object <c>coil</c>). Lengths in metres.</summary>
public sealed class SceneCoil
{
    /// <summary>Turns, 1..100000. Default 45.</summary>
    public int Turns { get; set; } = 45;

    /// <summary>Mean winding diameter, m. Default 0.18.</summary>
    public double MeanDiameterM { get; set; } = 0.18;

    /// <summary>Axial winding length, m; 0 = from the wire (sqrt(N) d). Default 0.</summary>
    public double WindingLengthM { get; set; }

    /// <summary>Radial winding depth, m; 0 = from the wire. Default 0.</summary>
    public double WindingDepthM { get; set; }

    /// <summary>Wire diameter, m. Default 0.0005.</summary>
    public double WireDiameterM { get; set; } = 0.0005;

    /// <summary>Formula that sets L. Default Wheeler.</summary>
    public InductanceModel InductanceModel { get; set; } = InductanceModel.Wheeler;

    /// <summary>Builds the physics object; throws <see cref="ArgumentOutOfRangeException"/> on bad geometry.</summary>
    public SearchCoil ToSearchCoil() => new(Turns, MeanDiameterM, WindingLengthM, WindingDepthM, WireDiameterM);
}
