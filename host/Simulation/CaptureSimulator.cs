using System.Numerics;
using System.Runtime.CompilerServices;
using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// Generates a capture from a <see cref="SceneModel"/>, streaming rows to an <see cref="ICaptureWriter"/> (nothing is held in
/// memory: an hour at 100 kHz is 360 M edges), and returns the truth.
/// <para>Edges: time is integrated period by period in true-clock ticks as a long integer plus a double fraction (no
/// precision loss over hours). The counted frequency is the intended frequency (targets, drift) times the flicker-like noise,
/// evaluated every control step and linear in between (the targets' coupling from an <see cref="InductanceChangeTable"/> of
/// the coil position, which changes on the sweep's time scale, not the oscillator's); white FM is drawn per recorded edge as
/// the mean frequency offset over that interval (std sigma_abs / sqrt(T), sigma_abs = f ADEV(1 s), both oscillators in beat
/// mode). Each recorded tick is
/// floor(true time + jitter) in ticks, offset by a random timer start and wrapped to timer_bits. Rows go to the writer in
/// batches (<see cref="IEdgeBatchWriter"/> where the writer takes them). Per recorded edge nothing is allocated. The per-edge
/// and per-step methods are compiled fully optimised at once (AggressiveOptimization), so a short run, and the size and time
/// trial of <see cref="SimulationEstimate"/>, do not spend their first fraction of a second in unoptimised code.</para>
/// <para>Snapshots: the counted phase is integrated over each read interval (trapezoid on the linear frequency, plus white-FM
/// phase noise of variance sigma_abs^2 dt cycles^2); the count is its floor, read at a slightly irregular schedule, stamped
/// with the read jitter and quantised to the clock; the count wraps at count_bits.</para>
/// <para>The same scene and seed give the same rows.</para>
/// </summary>
public sealed class CaptureSimulator
{
    private const int MaxListed = 10000;

    /// <summary>Below this counted frequency (beat mode near zero beat) the oscillators are taken as locked: no edges, Hz.</summary>
    public const double MinCountedHz = 1.0;
    private readonly SceneModel _model;
    private readonly Scene _scene;

    public CaptureSimulator(SceneModel model)
    {
        _model = model;
        _scene = model.Scene;
        Metadata = BuildMetadata();
    }

    /// <summary>The capture metadata to open the writer with (clock_hz, kind, prescale, timer_bits, signal, beat_side, search_hz, ...).</summary>
    public CaptureMetadata Metadata { get; }

    /// <summary>The model simulated.</summary>
    public SceneModel Model => _model;

    /// <summary>
    /// Streams the capture to <paramref name="writer"/> (Complete is called at the end) and returns the truth.
    /// <paramref name="progress"/> receives the fraction of simulated time done, now and then.
    /// </summary>
    public SimulationTruth Run(ICaptureWriter writer, IProgress<double>? progress = null, CancellationToken cancellationToken = default) =>
        Run(writer, progress, cancellationToken, targetTruth: true);

    /// <summary>
    /// <see cref="Run(ICaptureWriter, IProgress{double}, CancellationToken)"/>; with <paramref name="targetTruth"/> false the
    /// truth has no per-target entries (their exact peak search is a fixed cost a timing trial must not count).
    /// </summary>
    internal SimulationTruth Run(ICaptureWriter writer, IProgress<double>? progress, CancellationToken cancellationToken, bool targetTruth)
    {
        var truth = BuildTruth(targetTruth);
        if (_scene.Hardware.Kind == CaptureKind.Snapshots)
        {
            RunSnapshots(writer, truth, progress, cancellationToken);
        }
        else
        {
            RunEdges(writer, truth, progress, cancellationToken);
        }

        var trailer = new List<KeyValuePair<string, string>>
        {
            new("simulated_rows", truth.Rows.ToString(System.Globalization.CultureInfo.InvariantCulture)),
        };
        writer.Complete(trailer);
        progress?.Report(1.0);
        return truth;
    }

    private CaptureMetadata BuildMetadata()
    {
        var h = _scene.Hardware;
        var m = new CaptureMetadata
        {
            ClockHz = h.ClockHz,
            Kind = h.Kind,
            Prescale = h.Kind == CaptureKind.Snapshots ? 1 : h.Prescale,
            TimerBits = h.TimerBits,
            CountBits = h.CountBits,
            Signal = _model.Signal,
            BeatSide = _model.BeatSide,
            SearchHz = Math.Round(_model.SearchNominalHz, 3),
            StartedUtc = _scene.StartedUtc,
            Note = string.IsNullOrWhiteSpace(_scene.Note) ? $"simulated scene {_scene.Name}" : $"simulated scene {_scene.Name}: {Sanitise(_scene.Note)}",
        };
        m.Extra.Add(new("simulated_seed", _scene.Seed.ToString(System.Globalization.CultureInfo.InvariantCulture)));
        if (h.TempEveryRows > 0)
        {
            m.ExtraColumns.Add("temp_c");
        }

        return m;
    }

    private static string Sanitise(string s) => s.Replace('\r', ' ').Replace('\n', ' ').Trim();

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void RunEdges(ICaptureWriter writer, SimulationTruth truth, IProgress<double>? progress, CancellationToken ct)
    {
        var h = _scene.Hardware;
        double duration = _model.DurationS;
        double trueClock = h.ClockHz * (1.0 + h.ClockErrorPpm * 1e-6);
        int prescale = h.Prescale;
        var bits = h.TimerBits;
        ulong mask = bits == 64 ? ulong.MaxValue : (1UL << bits) - 1;

        var rngSearch = new SimulationRandom(_scene.Seed, 1);
        var rngReference = new SimulationRandom(_scene.Seed, 2);
        var rngJitter = new SimulationRandom(_scene.Seed, 3);
        var rngFaults = new SimulationRandom(_scene.Seed, 4);
        var rngStart = new SimulationRandom(_scene.Seed, 5);

        ulong tickOffset = rngStart.NextUInt64() & (bits == 64 ? 0xFFFFFFFFUL : mask);
        var control = new ControlTrack(_model, rngSearch, rngReference);
        double jitterTicks = _model.JitterS * trueClock;
        double tempRes = h.TempResolutionC;
        int tempEveryRows = h.TempEveryRows;
        int rowsToTemperature = 0;
        var faults = _scene.Faults;
        var output = new EdgeRowBatch(writer);

        // Time of the current recorded edge in true-clock ticks: whole + fraction.
        double f0 = Math.Max(MinCountedHz, control.FrequencyAt(0.0));
        var clock = new EdgeClock { Frac = rngStart.NextDouble() * prescale / f0 * trueClock };
        Normalise(ref clock.Whole, ref clock.Frac);

        double nextGlitch = rngFaults.NextExponential(1.0 / faults.GlitchesPerS);
        double dropStart = rngFaults.NextExponential(1.0 / faults.DropoutsPerS);
        double dropEnd = dropStart + faults.DropoutS;
        bool dropListed = false;

        long lastRecorded = long.MinValue;
        long rows = 0;
        long clamps = 0;
        int progressCounter = 0;
        double nextProgress = 0.0;

        while (true)
        {
            double t = (clock.Whole + clock.Frac) / trueClock;
            if (t >= duration)
            {
                break;
            }

            // The control step holding t: the frequency now, at the step's end, and the end (Advance starts from it).
            control.Segment(t, out double f, out double fEnd, out double endS);

            // Dropout bookkeeping.
            while (t >= dropEnd)
            {
                dropStart = dropEnd + rngFaults.NextExponential(1.0 / faults.DropoutsPerS);
                dropEnd = dropStart + faults.DropoutS;
                dropListed = false;
            }

            bool dropped = t >= dropStart;
            if (dropped && !dropListed)
            {
                truth.DropoutCount++;
                if (truth.DropoutStartTimesS.Count < MaxListed)
                {
                    truth.DropoutStartTimesS.Add(dropStart);
                }

                dropListed = true;
            }

            if (!dropped)
            {
                Emit(clock.Whole, clock.Frac);
                if (t >= nextGlitch)
                {
                    double u = 0.05 + 0.2 * rngFaults.NextDouble();
                    double gFrac = clock.Frac + u * prescale / Math.Max(f, MinCountedHz) * trueClock;
                    long gWhole = clock.Whole;
                    Normalise(ref gWhole, ref gFrac);
                    Emit(gWhole, gFrac);
                    truth.GlitchCount++;
                    if (truth.GlitchTimesS.Count < MaxListed)
                    {
                        truth.GlitchTimesS.Add(t);
                    }
                }
            }

            while (t >= nextGlitch)
            {
                nextGlitch += rngFaults.NextExponential(1.0 / faults.GlitchesPerS);
            }

            // Cycles of the deterministic (linear-in-step) frequency until the next recorded edge: P, scaled so that the
            // interval's mean frequency carries the white-FM offset (std sigma_abs / sqrt(T)).
            double needed = prescale;
            double sigmaAbs = control.WhiteSigmaHzRootS;
            if (sigmaAbs > 0 && f >= MinCountedHz)
            {
                double delta = sigmaAbs / Math.Sqrt(prescale / f) * rngSearch.NextGaussian();
                needed = prescale / Math.Max(0.05, 1.0 + delta / f);
            }

            if (!Advance(control, clock, truth, needed, f, fEnd, endS, trueClock, duration))
            {
                break;
            }

            if (++progressCounter >= 65536)
            {
                progressCounter = 0;
                ct.ThrowIfCancellationRequested();
                if (progress is not null && t >= nextProgress)
                {
                    progress.Report(t / duration);
                    nextProgress = t + duration / 200.0;
                }
            }
        }

        output.Flush();
        truth.Rows = rows;
        truth.JitterClamps = clamps;
        truth.TimerWraps = bits == 64 ? 0 : (long)(((ulong)lastRecorded + tickOffset) >> bits);

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        void Emit(long w, double fr)
        {
            double jitter = jitterTicks > 0 ? jitterTicks * rngJitter.NextGaussian() : 0.0;
            long recorded = w + (long)Math.Floor(fr + jitter);
            if (recorded <= lastRecorded)
            {
                recorded = lastRecorded + 1;
                clamps++;
            }

            lastRecorded = recorded;
            double temperatureC = double.NaN;
            if (tempEveryRows > 0)
            {
                if (rowsToTemperature == 0)
                {
                    temperatureC = Quantise(_scene.Temperature.At(recorded / trueClock), tempRes);
                    rowsToTemperature = tempEveryRows;
                }

                rowsToTemperature--;
            }

            rows++;
            output.Add(((ulong)recorded + tickOffset) & mask, temperatureC);
        }
    }

    /// <summary>
    /// Moves the clock on by the given number of cycles, integrating the frequency exactly where it is linear within each
    /// control step (fa dt + k dt^2 / 2 = cycles), starting in the step the caller has already looked up (frequency
    /// <paramref name="fa"/> now, <paramref name="fb"/> at its end <paramref name="endS"/>). Steps where the beat is below
    /// MinCountedHz count as locked oscillators: time passes, no cycles. False when the capture's end is reached first.
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private static bool Advance(ControlTrack control, EdgeClock clock, SimulationTruth truth, double cycles, double fa, double fb, double endS, double trueClock, double duration)
    {
        bool first = true;
        while (true)
        {
            double tS = (clock.Whole + clock.Frac) / trueClock;
            if (!first)
            {
                if (tS >= duration)
                {
                    return false;
                }

                control.Segment(tS, out fa, out fb, out endS);
            }

            first = false;
            double spanTicks = (endS * trueClock - clock.Whole) - clock.Frac;
            if (!(spanTicks > 0))
            {
                spanTicks = 1e-6;
            }

            double spanS = spanTicks / trueClock;
            if (fa < MinCountedHz && fb < MinCountedHz)
            {
                if (!clock.Locked)
                {
                    clock.Locked = true;
                    truth.LockedCount++;
                    if (truth.LockedStartTimesS.Count < MaxListed)
                    {
                        truth.LockedStartTimesS.Add(tS);
                    }
                }

                clock.Frac += spanTicks;
                Normalise(ref clock.Whole, ref clock.Frac);
                continue;
            }

            clock.Locked = false;
            double available = 0.5 * (fa + fb) * spanS;
            if (available >= cycles)
            {
                double k = (fb - fa) / spanS;
                double disc = Math.Max(0.0, fa * fa + 2.0 * k * cycles);
                double dt = 2.0 * cycles / (fa + Math.Sqrt(disc));
                clock.Frac += Math.Min(dt * trueClock, spanTicks);
                Normalise(ref clock.Whole, ref clock.Frac);
                return true;
            }

            cycles -= available;
            clock.Frac += spanTicks;
            Normalise(ref clock.Whole, ref clock.Frac);
        }
    }

    [MethodImpl(MethodImplOptions.AggressiveOptimization)]
    private void RunSnapshots(ICaptureWriter writer, SimulationTruth truth, IProgress<double>? progress, CancellationToken ct)
    {
        var h = _scene.Hardware;
        double duration = _model.DurationS;
        double trueClock = h.ClockHz * (1.0 + h.ClockErrorPpm * 1e-6);
        ulong tickMask = h.TimerBits == 64 ? ulong.MaxValue : (1UL << h.TimerBits) - 1;
        ulong countMask = h.CountBits == 64 ? ulong.MaxValue : (1UL << h.CountBits) - 1;

        var rngSearch = new SimulationRandom(_scene.Seed, 1);
        var rngReference = new SimulationRandom(_scene.Seed, 2);
        var rngJitter = new SimulationRandom(_scene.Seed, 3);
        var rngFaults = new SimulationRandom(_scene.Seed, 4);
        var rngStart = new SimulationRandom(_scene.Seed, 5);
        ulong tickOffset = rngStart.NextUInt64() & (h.TimerBits == 64 ? 0xFFFFFFFFUL : tickMask);
        ulong countOffset = rngStart.NextUInt64() & (h.CountBits == 64 ? 0xFFFFUL : countMask);

        var control = new ControlTrack(_model, rngSearch, rngReference);
        double interval = h.SnapshotIntervalS;

        long cyclesWhole = 0;
        double cyclesFrac = rngStart.NextDouble();
        long glitchCounts = 0;
        double nextGlitch = rngFaults.NextExponential(1.0 / _scene.Faults.GlitchesPerS);
        double dropStart = rngFaults.NextExponential(1.0 / _scene.Faults.DropoutsPerS);
        double dropEnd = dropStart + _scene.Faults.DropoutS;
        bool dropListed = false;

        double tPrev = 0.0;
        long lastTick = long.MinValue;
        long rows = 0;
        long clamps = 0;
        double nextProgress = 0;
        for (long j = 0; ; j++)
        {
            double tRead = j * interval + (j == 0 ? 0.0 : (rngJitter.NextDouble() - 0.5) * 0.2 * interval);
            if (tRead >= duration)
            {
                break;
            }

            // Integrate the counted phase from tPrev to tRead, excluding dropout time.
            double cycles = 0;
            double a = tPrev;
            while (a < tRead)
            {
                double b = Math.Min(tRead, control.NextBoundaryAfter(a));
                double fa = control.FrequencyAt(a);
                double fb = control.FrequencyAt(b);
                double dt = b - a;
                double piece = 0.5 * (fa + fb) * dt;
                double sigma = control.WhiteSigmaHzRootS;
                if (sigma > 0)
                {
                    piece += sigma * Math.Sqrt(dt) * rngSearch.NextGaussian();
                }

                double lost = Overlap(a, b, dropStart, dropEnd);
                if (lost > 0)
                {
                    piece *= 1.0 - lost / dt;
                }

                cycles += piece;
                a = b;
            }

            while (tRead >= dropEnd)
            {
                dropStart = dropEnd + rngFaults.NextExponential(1.0 / _scene.Faults.DropoutsPerS);
                dropEnd = dropStart + _scene.Faults.DropoutS;
                dropListed = false;
            }

            if (tRead >= dropStart && !dropListed)
            {
                truth.DropoutCount++;
                if (truth.DropoutStartTimesS.Count < MaxListed)
                {
                    truth.DropoutStartTimesS.Add(dropStart);
                }

                dropListed = true;
            }

            while (tRead >= nextGlitch)
            {
                glitchCounts++;
                truth.GlitchCount++;
                if (truth.GlitchTimesS.Count < MaxListed)
                {
                    truth.GlitchTimesS.Add(nextGlitch);
                }

                nextGlitch += rngFaults.NextExponential(1.0 / _scene.Faults.GlitchesPerS);
            }

            cyclesFrac += Math.Max(0.0, cycles);
            double w = Math.Floor(cyclesFrac);
            cyclesWhole += (long)w;
            cyclesFrac -= w;

            double stamp = tRead + (h.ReadJitterS > 0 ? h.ReadJitterS * rngJitter.NextGaussian() : 0.0);
            long recorded = (long)Math.Floor(stamp * trueClock);
            if (recorded <= lastTick)
            {
                recorded = lastTick + 1;
                clamps++;
            }

            lastTick = recorded;
            ulong tick = ((ulong)recorded + tickOffset) & tickMask;
            ulong count = ((ulong)(cyclesWhole + glitchCounts) + countOffset) & countMask;
            double? temp = null;
            if (h.TempEveryRows > 0 && rows % h.TempEveryRows == 0)
            {
                temp = Quantise(_scene.Temperature.At(tRead), h.TempResolutionC);
            }

            rows++;
            writer.WriteRow(new CaptureRow(rows, tick, count, temp, null));
            tPrev = tRead;

            if ((j & 4095) == 0)
            {
                ct.ThrowIfCancellationRequested();
                if (progress is not null && tRead >= nextProgress)
                {
                    progress.Report(tRead / duration);
                    nextProgress = tRead + duration / 200.0;
                }
            }
        }

        truth.Rows = rows;
        truth.JitterClamps = clamps;
        truth.TimerWraps = h.TimerBits == 64 ? 0 : (long)(((ulong)lastTick + tickOffset) >> h.TimerBits);
    }

    private static double Overlap(double a, double b, double c, double d) => Math.Max(0.0, Math.Min(b, d) - Math.Max(a, c));

    private static double Quantise(double value, double resolution) =>
        resolution > 0 ? Math.Round(Math.Round(value / resolution) * resolution, 6) : Math.Round(value, 6);

    private static void Normalise(ref long whole, ref double frac)
    {
        double w = Math.Floor(frac);
        whole += (long)w;
        frac -= w;
    }

    private SimulationTruth BuildTruth(bool targetTruth)
    {
        var s = _scene;
        var m = _model;
        var truth = new SimulationTruth
        {
            Scene = s.Name,
            Note = s.Note,
            Seed = s.Seed,
            Kind = s.Hardware.Kind == CaptureKind.Snapshots ? "snapshots" : "edges",
            Signal = m.Signal == SignalKind.Beat ? "beat" : "search",
            BeatSide = m.BeatSide switch { BeatSide.Above => "above", BeatSide.Below => "below", _ => null },
            DurationS = m.DurationS,
            SearchNominalHz = m.SearchNominalHz,
            ReferenceNominalHz = m.Signal == SignalKind.Beat ? m.ReferenceNominalHz : null,
            BeatNominalHz = m.Signal == SignalKind.Beat ? Math.Abs(m.SearchNominalHz - m.ReferenceNominalHz) : null,
            InductanceWheelerUh = m.Coil.WheelerInductanceH * 1e6,
            InductanceThinLoopUh = m.Coil.ThinLoopInductanceH * 1e6,
            InductanceModel = s.Coil.InductanceModel == InductanceModel.ThinLoop ? "thin_loop" : "wheeler",
            CapacitanceNf = m.CapacitanceF * 1e9,
            TempcoPpmPerK = m.TempcoPpmPerK,
            TempStartC = s.Temperature.At(0),
            TempEndC = s.Temperature.At(m.DurationS),
            ClockHz = s.Hardware.ClockHz,
            ClockErrorPpm = s.Hardware.ClockErrorPpm,
            Prescale = s.Hardware.Kind == CaptureKind.Snapshots ? 1 : s.Hardware.Prescale,
            TimerBits = s.Hardware.TimerBits,
            JitterS = s.Hardware.Kind == CaptureKind.Snapshots ? s.Hardware.ReadJitterS : m.JitterS,
            WhiteFmAdev1s = s.Oscillator.WhiteFmAdev1s,
            FlickerAdev = s.Oscillator.FlickerAdev,
            DropoutS = s.Faults.DropoutS,
            MainsDeviationPpm = s.Mains is { DeviationPpm: > 0 } ? s.Mains.DeviationPpm : null,
            MainsHz = s.Mains is { DeviationPpm: > 0 } ? s.Mains.FrequencyHz : null,
            Parameters = s,
        };
        double tc = m.TempcoPpmPerK * 1e-6;
        truth.DriftSearchHz = m.SearchNominalHz * tc * (truth.TempEndC - truth.TempStartC);
        foreach (var p in m.Plan.Passes)
        {
            truth.PassTimesS.Add(new[] { p.StartTimeS, p.EndTimeS });
        }

        if (m.Signal == SignalKind.Beat)
        {
            double minBeat = double.PositiveInfinity;
            int n = 400;
            for (int i = 0; i <= n; i++)
            {
                minBeat = Math.Min(minBeat, m.CountedIntendedHz(m.DurationS * i / n));
            }

            if (minBeat < 50.0)
            {
                truth.Warnings.Add($"the beat falls to {minBeat:F1} Hz during the run: near zero beat the sign is ambiguous and real oscillators pull or lock");
            }
        }

        foreach (var t in m.Targets)
        {
            if (targetTruth)
            {
                truth.Targets.Add(TargetTruthFor(t, truth.Warnings));
            }
        }

        return truth;
    }

    private TargetTruth TargetTruthFor(TargetModel t, List<string> warnings)
    {
        var m = _model;
        var st = t.Target;
        double f = m.SearchNominalHz;
        double radii = t.ClosestDistanceInRadii(m.Plan.HeightM);
        var tt = new TargetTruth
        {
            Name = st.Name,
            Material = t.Material.Name,
            Shape = st.Shape == TargetShape.Pipe ? "pipe" : "sphere",
            ConductivitySPerM = t.Material.ConductivitySPerM,
            MuR = t.Material.RelativePermeability,
            RadiusM = st.RadiusM,
            LengthM = st.Shape == TargetShape.Pipe ? st.LengthM : null,
            DepthM = st.DepthM,
            PositionM = st.PositionM,
            OffsetM = st.OffsetM,
            MaterialClass = t.MaterialClass,
            SignRuleClass = t.SignRuleClass,
            PolarizabilityRe = t.Normalised.Real,
            PolarizabilityIm = t.Normalised.Imaginary,
            SkinDepthM = SpherePolarizability.SkinDepthM(f, t.Material.ConductivitySPerM, t.Material.RelativePermeability),
            CrossoverHz = double.IsNaN(t.CrossoverHz) ? null : t.CrossoverHz,
            AboveCrossover = double.IsNaN(t.CrossoverHz) ? null : f > t.CrossoverHz,
            ClosestDistanceRadii = radii,
        };
        tt.Explanation = Explain(t, f);
        if (radii < 10)
        {
            warnings.Add($"target {st.Name}: closest approach is {radii:F1} radii (the dipole model wants about 10), so its shift is approximate");
        }

        foreach (var p in m.Plan.Passes)
        {
            double closestT = p.TimeAt(st.PositionM);
            double bestT = closestT;
            double bestDl = 0;
            const int n = 2000;
            for (int i = 0; i <= n; i++)
            {
                double time = p.StartTimeS + (p.EndTimeS - p.StartTimeS) * i / n;
                double dl = t.InductanceChangeH(m.Coil, p.PositionAt(time), m.Plan.HeightM);
                if (Math.Abs(dl) > Math.Abs(bestDl))
                {
                    bestDl = dl;
                    bestT = time;
                }
            }

            double peak = f * LcResonance.FractionalShift(m.InductanceH, bestDl);
            double atClosest = f * LcResonance.FractionalShift(m.InductanceH, t.InductanceChangeH(m.Coil, p.PositionAt(closestT), m.Plan.HeightM));
            tt.Passes.Add(new PassTruth
            {
                Pass = p.Index,
                ClosestTimeS = closestT,
                PeakTimeS = bestT,
                PeakSearchShiftHz = peak,
                PeakCountedShiftHz = m.CountedShiftHz(peak),
                ClosestSearchShiftHz = atClosest,
            });
        }

        return tt;
    }

    /// <summary>Plain-language sign-rule note for one target at the operating frequency.</summary>
    public static string Explain(TargetModel t, double operatingHz)
    {
        if (!t.Material.IsFerrous)
        {
            return "non-ferrous conductor: eddy currents oppose the coil field, L falls, the search frequency rises";
        }

        double fx = t.CrossoverHz;
        if (operatingHz > fx)
        {
            return $"ferrous, but the operating frequency {operatingHz / 1e3:F1} kHz is above this part's crossover {fx / 1e3:F2} kHz: its eddy currents win, L falls, the frequency rises and the sign rule reads it as non-ferrous";
        }

        return $"ferrous, below its crossover {fx / 1e3:F1} kHz: the iron concentrates flux, L rises, the search frequency falls";
    }

    /// <summary>Time of the current recorded edge in true-clock ticks (whole + fraction: no precision loss over hours), and whether the oscillators are locked.</summary>
    private sealed class EdgeClock
    {
        public long Whole;
        public double Frac;
        public bool Locked;
    }

    /// <summary>
    /// The slow part of the counted frequency: intended frequency and flicker noise at control steps, linear in between.
    /// Steps are evaluated in order (the flicker processes advance once per step).
    /// </summary>
    private sealed class ControlTrack
    {
        private readonly SceneModel _model;
        private readonly InductanceChangeTable _coupling;
        private readonly FlickerNoise _searchFlicker;
        private readonly FlickerNoise? _referenceFlicker;
        private readonly double _step;
        private long _index = -1;
        private double _fa;
        private double _fb;
        private double _sigmaA;

        public ControlTrack(SceneModel model, SimulationRandom searchRandom, SimulationRandom referenceRandom)
        {
            _model = model;
            _coupling = new InductanceChangeTable(model);
            _step = model.Scene.Hardware.ControlStepS;
            _searchFlicker = new FlickerNoise(model.Scene.Oscillator.FlickerAdev, _step, searchRandom);
            if (model.Scene.Reference is not null)
            {
                _referenceFlicker = new FlickerNoise(model.Scene.Reference.FlickerAdev, _step, referenceRandom);
            }

            _fb = Counted(0.0, out _sigmaA);
            _index = -1;
        }

        /// <summary>White-FM level of the counted signal over the current step, Hz sqrt(s).</summary>
        public double WhiteSigmaHzRootS => _sigmaA;

        /// <summary>End of the control step holding t (same boundary rule as <see cref="Segment"/>), s: always later than t.</summary>
        public double NextBoundaryAfter(double timeS)
        {
            long i = (long)Math.Floor(timeS / _step);
            if ((i + 1) * _step - timeS <= 1e-12 * Math.Max(1.0, timeS))
            {
                i++;
            }

            return (i + 1) * _step;
        }

        /// <summary>
        /// The control step holding t (t never decreasing between calls): frequency at t, at the step's end, and the end time.
        /// A t within 1e-12 relative of a boundary belongs to the next step.
        /// </summary>
        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        public void Segment(double timeS, out double frequencyAtHz, out double endFrequencyHz, out double endS)
        {
            long i = (long)Math.Floor(timeS / _step);
            if ((i + 1) * _step - timeS <= 1e-12 * Math.Max(1.0, timeS))
            {
                i++;
            }

            while (_index < i)
            {
                _index++;
                _fa = _fb;
                _fb = Counted((_index + 1) * _step, out double sigma);
                _sigmaA = sigma;
            }

            endS = (_index + 1) * _step;
            double u = Math.Clamp(timeS / _step - _index, 0.0, 1.0);
            frequencyAtHz = _fa + (_fb - _fa) * u;
            endFrequencyHz = _fb;
        }

        /// <summary>Counted frequency at t (t never decreasing between calls; a boundary belongs to the next step), Hz.</summary>
        public double FrequencyAt(double timeS)
        {
            Segment(timeS, out double f, out _, out _);
            return f;
        }

        [MethodImpl(MethodImplOptions.AggressiveOptimization)]
        private double Counted(double timeS, out double sigmaAbs)
        {
            double inductanceChangeH = _model.Plan.TryGetPosition(timeS, out double positionM) ? _coupling.AtPositionH(positionM) : 0.0;
            double s = _model.SearchIntendedHz(timeS, inductanceChangeH) * (1.0 + _searchFlicker.Step());
            double ws = s * _model.Scene.Oscillator.WhiteFmAdev1s;
            if (_model.Scene.Reference is null)
            {
                sigmaAbs = ws;
                return s;
            }

            double r = _model.ReferenceIntendedHz(timeS) * (1.0 + _referenceFlicker!.Step());
            double wr = r * _model.Scene.Reference.WhiteFmAdev1s;
            sigmaAbs = Math.Sqrt(ws * ws + wr * wr);
            return Math.Abs(s - r);
        }
    }
}
