namespace FreqReadout.Host.Planning;

/// <summary>What counting the beat note gains over counting the (divided) search oscillator, one method and estimator at the chosen gate.</summary>
public sealed class BeatGainRow
{
    /// <summary>Timestamp method name.</summary>
    public string Method { get; set; } = "";

    /// <summary>Estimator name.</summary>
    public string Estimator { get; set; } = "";

    /// <summary>Resolution counting the search oscillator through its prescaler, Hz.</summary>
    public double SearchResolutionHz { get; set; }

    /// <summary>Resolution counting the beat note through its prescaler, Hz (search-oscillator Hz).</summary>
    public double BeatResolutionHz { get; set; }

    /// <summary>Search resolution over beat resolution (above 1: the beat note is better).</summary>
    public double Gain { get; set; }
}
