using FreqReadout.Readout;

namespace FreqReadout.Host.Reports;

/// <summary>The readings of a replay kept for its plots: time, counted frequency, tracked baseline, shift and noise per gate (NaN where a gate had none).</summary>
public sealed class ReadingTrace
{
    private readonly List<double> _time = new();
    private readonly List<double> _frequency = new();
    private readonly List<double> _baseline = new();
    private readonly List<double> _shift = new();
    private readonly List<double> _noise = new();
    private readonly List<double> _targetFreeShift = new();

    /// <summary>Gate times, s.</summary>
    public IReadOnlyList<double> TimeSeconds => _time;

    /// <summary>Counted frequency, Hz.</summary>
    public IReadOnlyList<double> FrequencyHz => _frequency;

    /// <summary>Tracked baseline of the counted signal, Hz.</summary>
    public IReadOnlyList<double> BaselineHz => _baseline;

    /// <summary>Search-oscillator shift, Hz.</summary>
    public IReadOnlyList<double> ShiftHz => _shift;

    /// <summary>Noise (one sigma), Hz.</summary>
    public IReadOnlyList<double> NoiseHz => _noise;

    /// <summary>
    /// The shift of every target-free reading (a shift known, no target present), Hz: the residuals whose robust sigma is
    /// the replay's noise figure (<see cref="FreqReadout.Host.Replay.ReplayReport.NoiseHz"/>).
    /// </summary>
    public IReadOnlyList<double> TargetFreeShiftHz => _targetFreeShift;

    /// <summary>Keeps one reading.</summary>
    public void Add(Reading r)
    {
        _time.Add(r.TimeSeconds);
        _frequency.Add(r.HasFrequency ? r.FrequencyHz : double.NaN);
        _baseline.Add(r.HasShift ? r.BaselineHz : double.NaN);
        _shift.Add(r.HasShift ? r.ShiftHz : double.NaN);
        _noise.Add(r.HasShift ? r.NoiseHz : double.NaN);
        if (r.IsTargetFree)
        {
            _targetFreeShift.Add(r.ShiftHz);
        }
    }
}
