using FreqReadout.Counting;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// A validated scene turned into physics: coil inductance, tuning, tempcos, targets' polarizabilities, the sweep plan, and
/// the deterministic ("intended") frequencies as functions of time, without noise.
/// </summary>
public sealed class SceneModel
{
    public SceneModel(Scene scene, string sourceName = "scene")
    {
        scene.Validate(sourceName);
        Scene = scene;
        Coil = scene.Coil.ToSearchCoil();
        InductanceH = scene.Coil.InductanceModel == InductanceModel.ThinLoop ? Coil.ThinLoopInductanceH : Coil.WheelerInductanceH;
        var o = scene.Oscillator;
        if (o.FrequencyOrDefaultHz() is double frequencyHz)
        {
            SearchNominalHz = frequencyHz;
            CapacitanceF = LcResonance.CapacitanceF(InductanceH, SearchNominalHz);
        }
        else
        {
            CapacitanceF = o.TuningCapacitanceNf!.Value * 1e-9;
            SearchNominalHz = LcResonance.FrequencyHz(InductanceH, CapacitanceF);
        }

        if (!(SearchNominalHz > 100 && SearchNominalHz <= 20e6))
        {
            throw new SceneException($"{sourceName}: oscillator.tuning_capacitance_nf gives {SearchNominalHz:G6} Hz with this coil; the frequency must be in (100, 2e7] Hz");
        }

        CapacitorPpmPerK = o.CapacitorPpmPerK ?? (o.Capacitor == CapacitorDielectric.Custom ? 0.0 : Tempco.NominalCapacitorPpmPerK(o.Capacitor));
        TempcoPpmPerK = o.TempcoPpmPerK ?? Tempco.FrequencyPpmPerK(o.CoilPpmPerK, CapacitorPpmPerK);

        if (scene.Reference is not null)
        {
            Signal = SignalKind.Beat;
            ReferenceNominalHz = scene.Reference.FrequencyHz;
            BeatSide = SearchNominalHz > ReferenceNominalHz ? BeatSide.Above : BeatSide.Below;
            if (Math.Abs(SearchNominalHz - ReferenceNominalHz) < 1.0)
            {
                throw new SceneException($"{sourceName}: reference.frequency_hz is within 1 Hz of the search frequency {SearchNominalHz:F1} Hz: the beat would be near zero, where the sign is ambiguous and oscillators lock; tune at least 1 Hz apart");
            }
        }
        else
        {
            Signal = SignalKind.Search;
            BeatSide = BeatSide.None;
            ReferenceNominalHz = double.NaN;
        }

        var targets = new List<TargetModel>();
        foreach (var t in scene.Targets)
        {
            Scene.TryResolveMaterial(t, out Material material, out _);
            targets.Add(new TargetModel(t, material, SearchNominalHz));
        }

        Targets = targets;
        Plan = new SweepPlan(scene.Sweep);
        JitterS = scene.Hardware.JitterS ?? DefaultJitterS(scene.Hardware.TimestampMethod);
        CheckCountable(sourceName);
    }

    /// <summary>Points at which <see cref="CheckCountable"/> samples the counted frequency over the capture.</summary>
    private const int CountableSamples = 2000;

    /// <summary>
    /// Refuses a scene whose capture would be read at an aliased frequency: a recorded-edge period (or a snapshot
    /// read interval) longer than the timer's wrap, or more counts between two snapshot reads than the pulse
    /// counter holds. Such a capture looks normal and reads a steady, wrong frequency; the margin of 10 % covers
    /// the noise and jitter around the intended frequency, sampled at <see cref="CountableSamples"/> points.
    /// </summary>
    private void CheckCountable(string sourceName)
    {
        var h = Scene.Hardware;
        double lowest = double.PositiveInfinity;
        double highest = 0;
        double duration = DurationS;
        for (int i = 0; i <= CountableSamples; i++)
        {
            double f = CountedIntendedHz(duration * i / CountableSamples);
            lowest = Math.Min(lowest, f);
            highest = Math.Max(highest, f);
        }

        const double margin = 1.1;
        string what = Signal == SignalKind.Beat ? "beat note" : "search oscillator";
        string F(double v) => v.ToString(v >= 1e15 ? "G6" : "0.######", System.Globalization.CultureInfo.InvariantCulture);
        double timerWrap = Math.Pow(2, h.TimerBits);
        if (h.Kind == FreqReadout.Host.Captures.CaptureKind.Edges)
        {
            double period = h.ClockHz * h.Prescale / lowest;
            if (h.TimerBits < 64 && period * margin >= timerWrap)
            {
                throw new SceneException($"{sourceName}: hardware.timer_bits = {h.TimerBits} cannot time this signal: the {what} at {F(lowest)} Hz gives recorded edges {F(period)} ticks apart (hardware.clock_hz {F(h.ClockHz)}, prescale {h.Prescale}), {(period >= timerWrap ? "more than" : "within 10 % of")} the timer's wrap of {F(timerWrap)} ticks, so the capture would read a steady, wrong (aliased) frequency; use a wider timer, a slower clock or a smaller prescale");
            }

            return;
        }

        double readTicks = h.SnapshotIntervalS * h.ClockHz;
        if (h.TimerBits < 64 && readTicks * margin >= timerWrap)
        {
            throw new SceneException($"{sourceName}: hardware.timer_bits = {h.TimerBits} cannot time the snapshot reads: hardware.snapshot_interval_s {F(h.SnapshotIntervalS)} s is {F(readTicks)} ticks of hardware.clock_hz {F(h.ClockHz)}, {(readTicks >= timerWrap ? "more than" : "within 10 % of")} the timer's wrap of {F(timerWrap)} ticks, so the read times would alias; use a wider timer, a slower clock or shorter read intervals");
        }

        double countsPerRead = highest * h.SnapshotIntervalS;
        double countWrap = Math.Pow(2, h.CountBits);
        if (h.CountBits < 64 && countsPerRead * margin >= countWrap)
        {
            throw new SceneException($"{sourceName}: hardware.count_bits = {h.CountBits} cannot count this signal: the {what} at {F(highest)} Hz gives {F(countsPerRead)} counts per read (hardware.snapshot_interval_s {F(h.SnapshotIntervalS)} s), {(countsPerRead >= countWrap ? "more than" : "within 10 % of")} the counter's wrap of {F(countWrap)}, so whole wraps would go unseen and the capture would read low; read more often or use a wider counter");
        }
    }

    /// <summary>The scene.</summary>
    public Scene Scene { get; }

    /// <summary>The coil.</summary>
    public SearchCoil Coil { get; }

    /// <summary>The coil inductance used (scene's model), H.</summary>
    public double InductanceH { get; }

    /// <summary>Tuning capacitance, F.</summary>
    public double CapacitanceF { get; }

    /// <summary>Search oscillator frequency at its nominal temperature with no target, Hz.</summary>
    public double SearchNominalHz { get; }

    /// <summary>Capacitor tempco used, ppm/K.</summary>
    public double CapacitorPpmPerK { get; }

    /// <summary>Search oscillator frequency tempco, ppm/K.</summary>
    public double TempcoPpmPerK { get; }

    /// <summary>Search or beat.</summary>
    public SignalKind Signal { get; }

    /// <summary>Beat side from the tuning (None in search mode).</summary>
    public BeatSide BeatSide { get; }

    /// <summary>Nominal reference frequency, Hz (NaN in search mode).</summary>
    public double ReferenceNominalHz { get; }

    /// <summary>Targets.</summary>
    public IReadOnlyList<TargetModel> Targets { get; }

    /// <summary>Sweep timeline.</summary>
    public SweepPlan Plan { get; }

    /// <summary>Rms timestamp jitter used, s.</summary>
    public double JitterS { get; }

    /// <summary>Capture length: the scene's duration_s or the sweep plan's, s.</summary>
    public double DurationS => Scene.DurationS ?? Plan.PlannedDurationS;

    /// <summary>Default rms jitter of a timestamp method, s: input and level capture 0, pin events 50 us.</summary>
    public static double DefaultJitterS(TimestampMethod method) => method == TimestampMethod.PinEvent ? 50e-6 : 0.0;

    /// <summary>Total inductance change from all targets at time t (0 while the coil is lifted), H.</summary>
    public double InductanceChangeAtH(double timeS)
    {
        if (!Plan.TryGetPosition(timeS, out double x))
        {
            return 0.0;
        }

        return InductanceChangeAtPositionH(x);
    }

    /// <summary>Total inductance change from all targets with the coil centre at <paramref name="positionM"/> on the line (at the sweep height), H: the exact coupling of every dipole point.</summary>
    public double InductanceChangeAtPositionH(double positionM)
    {
        double sum = 0;
        for (int i = 0; i < Targets.Count; i++)
        {
            sum += Targets[i].InductanceChangeH(Coil, positionM, Plan.HeightM);
        }

        return sum;
    }

    /// <summary>Drift-free search frequency with the targets' effect at time t: f0 ((1 + dL/L)^(-1/2)), Hz.</summary>
    public double SearchWithoutDriftHz(double timeS) => SearchNominalHz * (1.0 + LcResonance.FractionalShift(InductanceH, InductanceChangeAtH(timeS)));

    /// <summary>
    /// Intended search frequency at time t (targets, temperature drift and mains pickup, no noise):
    /// f0 (1 + tc (T - T0)) (1 + dL/L)^(-1/2) (1 + m sin(2 pi f_mains t + phase)), Hz (m = 0 without <c>mains</c>).
    /// </summary>
    public double SearchIntendedHz(double timeS) => SearchIntendedHz(timeS, InductanceChangeAtH(timeS));

    /// <summary>
    /// <see cref="SearchIntendedHz(double)"/> with the targets' inductance change at t given (exact, or from an
    /// <see cref="InductanceChangeTable"/>): f0 (1 + tc (T - T0)) (1 + dL/L)^(-1/2) (1 + m sin(2 pi f_mains t + phase)), Hz.
    /// </summary>
    public double SearchIntendedHz(double timeS, double inductanceChangeH)
    {
        double drift = 1.0 + TempcoPpmPerK * 1e-6 * (Scene.Temperature.At(timeS) - Scene.Oscillator.NominalTemperatureC);
        double mains = Scene.Mains is null ? 1.0 : 1.0 + Scene.Mains.FractionAt(timeS);
        return drift * mains * (SearchNominalHz * (1.0 + LcResonance.FractionalShift(InductanceH, inductanceChangeH)));
    }

    /// <summary>Intended reference frequency at time t (its own drift, no noise), Hz; NaN in search mode.</summary>
    public double ReferenceIntendedHz(double timeS)
    {
        var r = Scene.Reference;
        if (r is null)
        {
            return double.NaN;
        }

        return r.FrequencyHz * (1.0 + r.TempcoPpmPerK * 1e-6 * (r.Temperature.At(timeS) - r.NominalTemperatureC));
    }

    /// <summary>Intended counted-signal frequency (search, or |search - reference| in beat mode), before the prescaler, Hz.</summary>
    public double CountedIntendedHz(double timeS)
    {
        double s = SearchIntendedHz(timeS);
        return Signal == SignalKind.Beat ? Math.Abs(s - ReferenceIntendedHz(timeS)) : s;
    }

    /// <summary>Converts a search-oscillator shift to the counted signal's shift: negated when the search is tuned below the reference.</summary>
    public double CountedShiftHz(double searchShiftHz) => BeatSide == BeatSide.Below ? -searchShiftHz : searchShiftHz;
}
