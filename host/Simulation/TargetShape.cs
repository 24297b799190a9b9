namespace FreqReadout.Host.Simulation;

/// <summary>Shape of a scene target.</summary>
public enum TargetShape
{
    /// <summary>A solid sphere of radius <c>radius_m</c> (Wait 1951 polarizability).</summary>
    Sphere,

    /// <summary>
    /// A straight pipe or bar across the sweep line (along the lateral axis, centred on <c>offset_m</c>), of outer radius
    /// <c>radius_m</c> and length <c>length_m</c>, approximated as a row of touching spheres of that radius whose dipole
    /// responses add (mutual coupling neglected; a pipe wall thicker than the skin depth responds much like a solid bar).
    /// </summary>
    Pipe,
}
