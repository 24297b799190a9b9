namespace FreqReadout.Host.Bench;

/// <summary>The two plain ways the bench compares the readout with.</summary>
public enum PlainBaseline
{
    /// <summary>A fixed baseline: the mean of the gates of the first 3 s.</summary>
    Fixed,

    /// <summary>A moving baseline: the mean of the gates of the previous 10 s.</summary>
    Moving,
}
