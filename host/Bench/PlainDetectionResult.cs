using FreqReadout.Detection;

namespace FreqReadout.Host.Bench;

/// <summary>What one plain way found in a capture.</summary>
/// <param name="NoiseHz">Sample standard deviation of the gates of the first 3 s (counted signal), Hz; NaN with fewer than 2 such gates.</param>
/// <param name="Events">The events, in time order (shifts of the search oscillator, as the readout reports them).</param>
public sealed record PlainDetectionResult(double NoiseHz, IReadOnlyList<DetectionEvent> Events);
