namespace FreqReadout.Host.Bench;

/// <summary>One reciprocal gate of the plain ways: its end (s from the first row) and the counted frequency over it, Hz.</summary>
/// <param name="EndSeconds">Time of the gate's closing row, s from the capture's first row.</param>
/// <param name="FrequencyHz">Counted-signal frequency over the gate (before the prescaler), Hz.</param>
public readonly record struct PlainGate(double EndSeconds, double FrequencyHz);
