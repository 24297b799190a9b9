namespace FreqReadout.Host.Planning;

/// <summary>How deep one method and estimator sees the target: where the largest gate reading of a pass equals the threshold.</summary>
public sealed class DepthRow
{
    /// <summary>Timestamp method name.</summary>
    public string Method { get; set; } = "";

    /// <summary>Estimator name.</summary>
    public string Estimator { get; set; } = "";

    /// <summary>Predicted standard deviation of a gate's frequency at the chosen gate, Hz.</summary>
    public double NoiseHz { get; set; }

    /// <summary>threshold_sigma x noise, Hz.</summary>
    public double ThresholdHz { get; set; }

    /// <summary>Depth of the target centre below the surface where the largest |gate reading| of a pass reaches the threshold, m; null when not even at the shallowest depth modelled.</summary>
    public double? DepthM { get; set; }

    /// <summary>True when the target is still seen at the deepest depth modelled (DepthM is then that depth).</summary>
    public bool BeyondRange { get; set; }

    /// <summary>Half-peak length of a pass at that depth over the sweep speed, s; null without a depth.</summary>
    public double? PassS { get; set; }

    /// <summary>True when the gate is longer than half the pass: the peak is smeared.</summary>
    public bool Smeared { get; set; }
}
