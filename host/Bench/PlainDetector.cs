using FreqReadout.Detection;

namespace FreqReadout.Host.Bench;

/// <summary>
/// The two plain ways of the tracking-quality bench, on 0.1 s reciprocal gates (<see cref="PlainReciprocalGates"/>):
/// <list type="number">
/// <item>fixed baseline B = mean of the gates ending in the first 3 s;</item>
/// <item>moving baseline B_i = mean of the gates j &lt; i ending at or after t_i - 10 s (fewer at the start);</item>
/// </list>
/// both with noise sigma = sample standard deviation (n - 1) of the gates ending in the first 3 s. Gates ending after 3 s
/// are judged: shift_i = s (f_i - B) with s = -1 for beat side below, else +1 (the search oscillator's shift); a gate is over
/// when |shift_i| &gt; 6 sigma; consecutive over-gates form an event (start and end are gate end times); events closer than
/// 0.5 s (next start - previous end &lt; 0.5 s) are merged; the peak is the largest |shift| and the class its sign
/// (up = non-ferrous, down = ferrous; no unclear band). An event still over at the last gate ends there.
/// </summary>
public static class PlainDetector
{
    /// <summary>Length of the noise (and fixed baseline) stretch at the start, s.</summary>
    public const double NoiseSeconds = 3.0;

    /// <summary>Length of the moving baseline's window, s.</summary>
    public const double MovingWindowSeconds = 10.0;

    /// <summary>Threshold on |shift| in noise sigmas.</summary>
    public const double ThresholdSigma = 6.0;

    /// <summary>Events whose gap is shorter than this are merged, s.</summary>
    public const double MergeSeconds = 0.5;

    /// <summary>
    /// Runs one plain way over <paramref name="gates"/>.
    /// </summary>
    /// <param name="gates">Gates in time order.</param>
    /// <param name="baseline">Fixed or moving.</param>
    /// <param name="searchSignPerCounted">+1, or -1 for beat side below (a beat rise is a search fall).</param>
    /// <param name="searchHz">Nominal search frequency for ppm; 0 when unknown (no ppm).</param>
    /// <returns>The noise and the events; no events when fewer than 2 gates end in the first 3 s.</returns>
    public static PlainDetectionResult Detect(IReadOnlyList<PlainGate> gates, PlainBaseline baseline, double searchSignPerCounted, double searchHz)
    {
        int first = 0;
        double sum = 0;
        while (first < gates.Count && gates[first].EndSeconds <= NoiseSeconds)
        {
            sum += gates[first].FrequencyHz;
            first++;
        }

        if (first < 2)
        {
            return new PlainDetectionResult(double.NaN, Array.Empty<DetectionEvent>());
        }

        double fixedBaseline = sum / first;
        double squares = 0;
        for (int i = 0; i < first; i++)
        {
            double d = gates[i].FrequencyHz - fixedBaseline;
            squares += d * d;
        }

        double sigma = Math.Sqrt(squares / (first - 1));
        double threshold = ThresholdSigma * sigma;

        // Moving window [lo, i) over gates ending at or after t_i - 10 s; sums of f - f_0 keep the additions small.
        double offset = gates[0].FrequencyHz;
        double windowSum = 0;
        int lo = 0;
        for (int j = 0; j < first; j++)
        {
            windowSum += gates[j].FrequencyHz - offset;
        }

        var raw = new List<Run>();
        Run? current = null;
        for (int i = first; i < gates.Count; i++)
        {
            double t = gates[i].EndSeconds;
            double b = fixedBaseline;
            if (baseline == PlainBaseline.Moving)
            {
                while (lo < i && gates[lo].EndSeconds < t - MovingWindowSeconds)
                {
                    windowSum -= gates[lo].FrequencyHz - offset;
                    lo++;
                }

                b = lo < i ? offset + (windowSum / (i - lo)) : gates[i - 1].FrequencyHz;
            }

            double shift = searchSignPerCounted * (gates[i].FrequencyHz - b);
            if (Math.Abs(shift) > threshold)
            {
                if (current == null)
                {
                    current = new Run { StartSeconds = t };
                    raw.Add(current);
                }

                current.Add(t, shift);
            }
            else
            {
                current = null;
            }

            if (baseline == PlainBaseline.Moving)
            {
                windowSum += gates[i].FrequencyHz - offset;
            }
        }

        double lastTime = gates[^1].EndSeconds;
        var merged = new List<Run>();
        foreach (Run r in raw)
        {
            if (merged.Count > 0 && r.StartSeconds - merged[^1].EndSeconds < MergeSeconds)
            {
                merged[^1].Merge(r);
            }
            else
            {
                merged.Add(r);
            }
        }

        var events = new List<DetectionEvent>(merged.Count);
        foreach (Run r in merged)
        {
            var e = new DetectionEvent();
            bool hasPpm = searchHz > 0;
            e.Set(
                r.StartSeconds,
                r.EndSeconds,
                r.PeakSeconds,
                r.PeakShiftHz,
                hasPpm,
                hasPpm ? r.PeakShiftHz / searchHz * 1e6 : 0.0,
                sigma > 0 ? Math.Abs(r.PeakShiftHz) / sigma : double.PositiveInfinity,
                sigma,
                r.PeakShiftHz > 0 ? TargetClass.NonFerrous : TargetClass.Ferrous,
                false,
                r.HasRise && r.HasFall,
                r.EndSeconds >= lastTime ? EventEnd.EndOfRun : EventEnd.Released);
            events.Add(e);
        }

        return new PlainDetectionResult(sigma, events);
    }

    private sealed class Run
    {
        public double StartSeconds { get; init; }

        public double EndSeconds { get; private set; }

        public double PeakSeconds { get; private set; }

        public double PeakShiftHz { get; private set; }

        public bool HasRise { get; private set; }

        public bool HasFall { get; private set; }

        public void Add(double timeSeconds, double shiftHz)
        {
            EndSeconds = timeSeconds;
            HasRise |= shiftHz > 0;
            HasFall |= shiftHz < 0;
            if (Math.Abs(shiftHz) > Math.Abs(PeakShiftHz))
            {
                PeakShiftHz = shiftHz;
                PeakSeconds = timeSeconds;
            }
        }

        public void Merge(Run later)
        {
            EndSeconds = later.EndSeconds;
            HasRise |= later.HasRise;
            HasFall |= later.HasFall;
            if (Math.Abs(later.PeakShiftHz) > Math.Abs(PeakShiftHz))
            {
                PeakShiftHz = later.PeakShiftHz;
                PeakSeconds = later.PeakSeconds;
            }
        }
    }
}
