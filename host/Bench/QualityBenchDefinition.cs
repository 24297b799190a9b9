namespace FreqReadout.Host.Bench;

/// <summary>
/// The numbers that define the tracking-quality bench (host/Bench/README.md says the same in words). Changing any of them
/// changes the bench: do it before a tuning round, never to make a result look better.
/// </summary>
public static class QualityBenchDefinition
{
    /// <summary>Master seed of the tuning set (<c>--seeds tune</c>): tune on these scenes.</summary>
    public const long TuneMasterSeed = 1;

    /// <summary>
    /// Master seed of the report set (<c>--seeds report</c>, the default): drawn afresh from the operating system's random
    /// source (2026-12-03) when the design with the crowded-drift test, the tail kept out of baselines, the longer event
    /// hold and the tighter kink guard was frozen, with the bench at 400 targets a kind and the scrambled master seed, and
    /// run once. Each earlier set had been run for an earlier design (the one before, 3423372634867959010, for the design
    /// with probes, and was looked at). This is the tenth; tuning used master seeds 1-20 (1-10 before the seed scramble).
    /// Report only on this set, once the design is frozen; if it has been looked at while tuning, draw a fresh one (any
    /// 63-bit number) before reporting and say so.
    /// </summary>
    public const long ReportMasterSeed = 7_104_172_049_718_267_850;

    /// <summary>Rest before the first pass (the readout's and the plain ways' baselines), s; the first leg starts up to <see cref="FirstLegJitterSeconds"/> later.</summary>
    public const double LeadInSeconds = 10.0;

    /// <summary>The first leg starts uniformly within this long after the lead-in, s.</summary>
    public const double FirstLegJitterSeconds = 2.0;

    /// <summary>Gap between one leg's end and the next leg's start (coil lifted), uniform, s.</summary>
    public const double MinGapSeconds = 3.0;

    /// <summary>Upper end of the gap, s.</summary>
    public const double MaxGapSeconds = 8.0;

    /// <summary>Rest after the last leg, s.</summary>
    public const double TailSeconds = 3.0;

    /// <summary>Shortest pass (full width at half peak), s.</summary>
    public const double MinPassSeconds = 0.2;

    /// <summary>Longest pass, s.</summary>
    public const double MaxPassSeconds = 3.0;

    /// <summary>Smallest truth peak in gate-noise units.</summary>
    public const double MinPeakNoise = 8.0;

    /// <summary>Largest truth peak in gate-noise units.</summary>
    public const double MaxPeakNoise = 40.0;

    /// <summary>Targets lie this far apart along the line (each leg sees only its own), m.</summary>
    public const double TargetSpacingM = 20.0;

    /// <summary>Coil plane above the surface, in coil radii.</summary>
    public const double CoilHeightRadii = 0.2;

    /// <summary>The usual coil diameter, m.</summary>
    public const double StandardCoilDiameterM = 0.18;

    /// <summary>Smallest coil diameter, m.</summary>
    public const double MinCoilDiameterM = 0.01;

    /// <summary>The coil shrinks in steps of this factor until a ferrous part can reach the largest peak.</summary>
    public const double CoilShrinkFactor = 0.9;

    /// <summary>Depth (of the part's centre, in coil radii) at which a ferrous part must reach the largest peak under the chosen coil.</summary>
    public const double FerrousReachDepthRadii = 0.3;

    /// <summary>Share of the targets that must read non-ferrous which are carbon steel above its crossover (the rest copper, aluminium or brass).</summary>
    public const double SteelAboveCrossoverShare = 1.0 / 3.0;


    /// <summary>Smallest drift rate (settling: initial rate), ppm/s.</summary>
    public const double MinRatePpmPerS = 0.1;

    /// <summary>Largest drift rate, ppm/s.</summary>
    public const double MaxRatePpmPerS = 15.0;

    /// <summary>Shortest settling time constant, s.</summary>
    public const double MinTauSeconds = 30.0;

    /// <summary>Longest settling time constant, s.</summary>
    public const double MaxTauSeconds = 300.0;

    /// <summary>Temperature change of a settling transient or a ramp, K (the tempco follows from the drawn rate).</summary>
    public const double TemperatureSwingK = 20.0;

    /// <summary>An onset starts no earlier than this, s (after the baselines).</summary>
    public const double EarliestOnsetSeconds = 10.0;

    /// <summary>An onset starts no later than this before the scene's end, s.</summary>
    public const double OnsetBeforeEndSeconds = 20.0;

    /// <summary>Smallest mains deviation in gate-noise units.</summary>
    public const double MinMainsNoise = 1.0;

    /// <summary>Largest mains deviation in gate-noise units.</summary>
    public const double MaxMainsNoise = 30.0;

    /// <summary>The mains frequency is 50 or 60 Hz plus a grid offset uniform within +-this, Hz.</summary>
    public const double MainsOffsetHz = 0.1;

    /// <summary>A pass's span for matching is its leg widened by one gate on each side, s.</summary>
    public const double MatchWideningSeconds = 0.1;

    /// <summary>An event's span starts one gate before its first reading, s.</summary>
    public const double EventGateSeconds = 0.1;
}
