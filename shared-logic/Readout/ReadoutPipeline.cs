using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Numerics;
using FreqReadout.Tracking;

namespace FreqReadout.Readout
{
    /// <summary>
    /// The readout that the device and the host both run: gate results in, one <see cref="Reading"/>
    /// per gate out, plus queued <see cref="DetectionEvent"/>s and <see cref="RebaselineNotice"/>s.
    /// <para>
    /// Per gate: (1) temperature compensation, x = f - tempco 1e-6 f_nom (T - T_0) s (s = +1 search or
    /// beat above, -1 beat below; T_0 the first temperature sample; off when tempco = 0);
    /// (2) settling: after start, a re-baseline request, an automatic re-baseline or the return of the
    /// signal, wait settling_s, then capture baseline_s of gates (<see cref="BaselineCapture"/>:
    /// resistant line, MAD noise, Hampel outlier rejection); readings say Settling meanwhile;
    /// (3) tracking: residual r = x - P(t) from the <see cref="DriftTracker"/> (Kalman level, rate and acceleration
    /// with adaptive jerk density), search shift = s r, z = |shift| / sigma with sigma = max(sqrt(noise^2 + V),
    /// forecast-miss noise), noise = max(third-difference noise, noise_floor_hz, the gate's predicted error), V the
    /// forecast variance at most (delay + 1) gates ahead; (4) detection (<see cref="TargetDetector"/>): threshold,
    /// hysteresis, minimum duration, sign rule; (5) target-free readings reach the tracker tracker_delay_gates late
    /// through a delay line, which is emptied when a target opens (the tracker also returns to its snapshot from
    /// 1.5 s before the target) and refilled only after as long past its end, so neither flank of a target is
    /// learnt; fed residuals are clipped to +-guard_sigma sigma; (6) an open candidate is decided from both sides
    /// (<see cref="ExcursionResolver"/>); an event lasting persistent_shift_s outside hold mode is reported and its
    /// level re-acquired as the baseline (reason Auto, with the shift it absorbed). Formulas: Readout/README.md.
    /// </para>
    /// <para>
    /// The tracker runs on offsets from the last captured baseline (and the capture on offsets from
    /// its first gate), so its sums work on small numbers rather than differences of ~1e5 Hz values
    /// (the device's double is IEEE double, done in software on ESP32; only System.Math is single precision).
    /// The tracker starts from the capture's fit with that fit's uncertainty. Nothing here allocates after the
    /// constructor, and no struct is made or copied (results are caller-owned objects filled in place);
    /// Process, the setters and the TryTake methods are safe for a device loop. Per gate the work is
    /// O(log noise_window_gates); the gate that completes a capture adds O(baseline_max_gates) expected.
    /// </para>
    /// </summary>
    public sealed class ReadoutPipeline
    {
        private const int QueueCapacity = 16;
        private const int MinCaptureGates = 5;
        private const double TimeEpsilonSeconds = 1e-6;

        private const int MaxRecaptures = 3;
        private const int MinDisturbanceGates = 10;
        private const double DisturbedNoiseRatio = 1.8;
        private const double CurvedNoiseRatio = 0.7;
        private const int MinForecastSamples = 20;

        // A run of target-free forecast errors that leans to one side (ForecastRunMonitor: the mean of 5 beyond
        // LeanSigma of its own scatter) is not fed to the tracker: it is a weak pass below the threshold, or drift the
        // tracker does not follow, which the detector and the two-sided check handle. At most MaxHeldSeconds in a row (the
        // longest pass) are held back; then the readings are fed and learnt from as usual, so drift the run turns out to
        // be, or a small level shift that stays, is followed in the end.
        private const double LeanSigma = 4.0;
        private const double MaxHeldSeconds = 3.0;

        // A pass rises below the threshold before it is seen: when a candidate opens, the tracker returns to its
        // state from EdgeRewindSeconds before the candidate's first reading (snapshots after every fed reading,
        // SnapshotCount at most), and after an event as long is skipped, so neither flank of a slow pass is learnt.
        private const double EdgeRewindSeconds = 1.5;
        private const int SnapshotCount = 32;

        // 1 / sqrt 20: a third difference of white noise has variance 20 sigma^2.
        private const double ThirdDifferenceScale = 0.22360679774997896;

        private const int PhaseSettling = 0;
        private const int PhaseCapturing = 1;
        private const int PhaseTracking = 2;

        private readonly ReadoutSettings settings;
        private readonly double sideSign;
        private readonly DriftTracker tracker;
        private readonly DriftTracker[] snapshots;
        private readonly BaselineCapture capture;
        private readonly MedianWindow noiseWindow;
        private readonly MedianWindow forecastWindow;
        private readonly ForecastRunMonitor runMonitor;
        private readonly TargetDetector detector;
        private readonly DetectionEventQueue events;
        private readonly EventMerger merger;
        private readonly RebaselineNoticeQueue notices;
        private readonly double[] delayTimes;
        private readonly double[] delayValues;
        private readonly double[] delaySpans;
        private readonly bool[] delayValid;
        private readonly double[] delayForecasts;
        private readonly double[] delayVariances;
        private readonly double[] delayNoises;
        private readonly bool[] delayRegular;
        private readonly int delayGates;

        private readonly BaselineEstimate estimate;
        private readonly ReadingHistory history;
        private readonly ExcursionResolver resolver;
        private readonly ExcursionVerdict verdict;
        private readonly QuadraticFit curveFit;
        private double lastCheckSeconds;

        // A probe: when the fed readings begin to lean (ForecastRunMonitor, LeanSigma), the tracker goes back to before the
        // run and is held, and the resolver is asked whether a pass stands out from both sides (a wide weak pass the tracker
        // would learn as drift, which the threshold alone would miss); at most ProbeSeconds, then the tracker catches up.
        // Only a pass of a clear class is reported, with at least ProbeMinReadings readings at the threshold.
        private const int ProbeMinReadings = 2;
        private const double ProbeSeconds = 3.0;

        // The readings of a pass the resolver reports stay out of later baselines this long after its end, s: its tail below
        // the release level still bends a fit (a pass of 100 sigma is 1 sigma at 1 % of its peak). Not after a released
        // event: marking readings still to come hid the rest of a wide weak pass that dipped and came back.
        private const double TailMarginSeconds = 1.0;

        private bool probing;
        private bool probeRequested;
        private double probeRequestSeconds;
        private double probeStartSeconds;
        private long lockRecoveries;

        // Start of the drift window of the last lock recovery (the kink lies before it), for the resolver's chain test;
        // double.MaxValue when there is none since the last baseline.
        private double chainFromSeconds = double.MaxValue;
        private int recaptures;
        private bool disturbed;
        private bool hasBest;
        private double bestRatio;
        private double bestLevelHz;
        private double bestSlopeHzPerSecond;
        private double bestNoiseHz;
        private double bestTimeSeconds;
        private int bestGates;
        private int bestOutliers;
        private double disturbanceSign;

        private int delayHead;
        private int delayCount;
        private int blankRemaining;
        private int snapshotHead;
        private int snapshotCount;
        private int phase;
        private bool started;
        private bool noSignal;
        private double phaseStartSeconds;
        private double captureStartSeconds;
        private double captureMaxErrorHz;
        private RebaselineReason pendingReason;
        private double requestedSeconds;
        private bool hasOld;
        private double oldLevelHz;
        private double originHz;
        private double oldSlopeHzPerSecond;
        private double oldTimeSeconds;
        private bool everBaselined;
        private double runningNoiseHz;
        private double forecastNoiseHz;
        private bool manualRequested;
        private bool hold;
        private bool hasTemperature;
        private double temperatureC;
        private bool hasReferenceTemperature;
        private double referenceTemperatureC;
        private double lastTimeSeconds;
        private double lastSpanSeconds;
        private int fedRun;
        private double heldSeconds;
        private double fedTimeSeconds;
        private double fed1;
        private double fed2;
        private double fed3;
        private ReadoutState state;
        private bool hasFirstBaseline;
        private double firstBaselineHz;

        /// <summary>Creates a pipeline; the settings are copied.</summary>
        /// <exception cref="System.ArgumentException">The settings are invalid (message from <see cref="ReadoutSettings.TryValidate"/>).</exception>
        public ReadoutPipeline(ReadoutSettings settings)
        {
            if (settings == null)
            {
                throw new System.ArgumentNullException("settings");
            }

            string error;
            if (!settings.TryValidate(out error))
            {
                throw new System.ArgumentException(error);
            }

            this.settings = settings.Clone();
            sideSign = SignRule.SearchSignPerCounted(settings.Signal, settings.BeatSide);
            tracker = new DriftTracker(settings.TrackerMemorySeconds);
            snapshots = new DriftTracker[SnapshotCount];
            for (int i = 0; i < SnapshotCount; i++)
            {
                snapshots[i] = new DriftTracker(settings.TrackerMemorySeconds);
            }

            capture = new BaselineCapture(settings.BaselineMaxGates);
            noiseWindow = new MedianWindow(settings.NoiseWindowGates);
            forecastWindow = new MedianWindow(settings.NoiseWindowGates);
            runMonitor = new ForecastRunMonitor(settings.NoiseWindowGates);
            detector = new TargetDetector(new DetectorConfiguration(settings.ThresholdSigma, settings.HysteresisSigma, settings.MinDurationSeconds, settings.ReleaseSeconds, settings.UnclearBandSigma, settings.Polarity));
            events = new DetectionEventQueue(QueueCapacity);
            merger = new EventMerger(events);
            notices = new RebaselineNoticeQueue(QueueCapacity);
            delayGates = settings.TrackerDelayGates;
            delayTimes = new double[delayGates + 1];
            delayValues = new double[delayGates + 1];
            delaySpans = new double[delayGates + 1];
            delayValid = new bool[delayGates + 1];
            delayForecasts = new double[delayGates + 1];
            delayVariances = new double[delayGates + 1];
            delayNoises = new double[delayGates + 1];
            delayRegular = new bool[delayGates + 1];
            estimate = new BaselineEstimate();
            history = new ReadingHistory(settings.HistoryGates);
            resolver = new ExcursionResolver();
            verdict = new ExcursionVerdict();
            curveFit = new QuadraticFit();
            state = ReadoutState.Settling;
        }

        /// <summary>A copy of the settings in use.</summary>
        public ReadoutSettings Settings
        {
            get { return settings.Clone(); }
        }

        /// <summary>State at the last reading.</summary>
        public ReadoutState State
        {
            get { return state; }
        }

        /// <summary>True while a baseline is tracked.</summary>
        public bool HasBaseline
        {
            get { return phase == PhaseTracking && !noSignal; }
        }

        /// <summary>Tracked baseline of the counted signal at the last reading, Hz (0 without a baseline).</summary>
        public double BaselineHz
        {
            get { return HasBaseline ? originHz + tracker.Predict(lastTimeSeconds) : 0.0; }
        }

        /// <summary>Running robust noise (before floors), Hz.</summary>
        public double NoiseHz
        {
            get { return runningNoiseHz; }
        }

        /// <summary>True once the first baseline was captured.</summary>
        public bool HasFirstBaseline
        {
            get { return hasFirstBaseline; }
        }

        /// <summary>The first captured baseline of the counted signal, Hz.</summary>
        public double FirstBaselineHz
        {
            get { return firstBaselineHz; }
        }

        /// <summary>Candidates decided afterwards to be drift the tracker had failed to follow (lock recovered by re-anchoring, no event).</summary>
        public long LockRecoveries
        {
            get { return lockRecoveries; }
        }

        /// <summary>Hold mode is on.</summary>
        public bool HoldActive
        {
            get { return hold; }
        }

        /// <summary>Events dropped because nobody took them from the queue (16 deep).</summary>
        public int DroppedEvents
        {
            get { return events.Dropped; }
        }

        /// <summary>Re-baseline notices dropped because nobody took them from the queue (16 deep).</summary>
        public int DroppedNotices
        {
            get { return notices.Dropped; }
        }

        /// <summary>
        /// A re-baseline after the first baseline (reason Auto, Manual or SignalRestored) that has begun but whose
        /// settling and capture have not completed yet (so no <see cref="RebaselineNotice"/> was queued for it):
        /// at the end of a replay it tells that the run ended inside one.
        /// </summary>
        /// <param name="reason">Why it began (undefined when false is returned).</param>
        /// <param name="requestedSeconds">When it began, s (undefined when false is returned).</param>
        /// <returns>True while such a re-baseline is under way.</returns>
        public bool TryGetPendingRebaseline(out RebaselineReason reason, out double requestedSeconds)
        {
            reason = pendingReason;
            requestedSeconds = this.requestedSeconds;
            return started && !noSignal && phase != PhaseTracking && pendingReason != RebaselineReason.Initial;
        }

        /// <summary>Asks for a manual re-baseline; it starts at the next gate (an open event is closed and reported).</summary>
        public void RequestRebaseline()
        {
            manualRequested = true;
        }

        /// <summary>
        /// Hold mode on or off. While on, automatic re-baselining is suspended (a still target stays an
        /// event); the tracker still follows target-free readings. Turning it off restarts the
        /// persistence clock of an open event.
        /// </summary>
        public void SetHold(bool on)
        {
            if (hold && !on)
            {
                detector.RestartPersistence(lastTimeSeconds);
            }

            hold = on;
        }

        /// <summary>A new temperature sample, deg C (used from the next gate; the first sample is the reference T_0). Non-finite values are ignored.</summary>
        public void SetTemperature(double celsius)
        {
            if (!ScalarMath.IsFinite(celsius))
            {
                return;
            }

            temperatureC = celsius;
            hasTemperature = true;
            if (!hasReferenceTemperature)
            {
                referenceTemperatureC = celsius;
                hasReferenceTemperature = true;
            }
        }

        /// <summary>
        /// Takes the oldest finished event into a caller-owned object (unchanged when false is returned). A pass is
        /// queued 0.5 s after it ended, once no pass of its sign continues it.
        /// </summary>
        public bool TryTakeEvent(DetectionEvent into)
        {
            return events.TryDequeue(into);
        }

        /// <summary>Takes the oldest re-baseline notice (the first baseline has reason Initial) into a caller-owned object (unchanged when false is returned).</summary>
        public bool TryTakeRebaseline(RebaselineNotice into)
        {
            return notices.TryDequeue(into);
        }

        /// <summary>
        /// End of a replay: closes an open event at its last reading above the release level (End = EndOfRun)
        /// into a caller-owned object (unchanged when false is returned). An unconfirmed candidate is dropped. A
        /// finished pass still held for merging is queued first: take the queued events, then this one.
        /// </summary>
        public bool TryCloseOpenEvent(DetectionEvent into)
        {
            merger.Flush();
            return detector.ForceClose(EventEnd.EndOfRun, into);
        }

        /// <summary>
        /// Consumes one gate result and fills its reading (both objects are the caller's; the gate is only read).
        /// </summary>
        /// <param name="gate">The gate's estimate.</param>
        /// <param name="reading">Caller-owned; always filled.</param>
        /// <returns>True when the reading carries a shift (a baseline is tracked); false while settling or without signal.</returns>
        public bool Process(GateResult gate, Reading reading)
        {
            double t = gate.EndSeconds;
            double span = gate.SpanSeconds;
            if (!gate.HasFrequency || gate.State == GateState.NoSignal)
            {
                EnterNoSignal();
                lastTimeSeconds = t;
                state = ReadoutState.NoSignal;
                reading.Set(ReadoutState.NoSignal, t, span, false, 0, false, 0, 0, false, 0, 0, 0, 0, 0, false, hold, false, TargetClass.None, false);
                return false;
            }

            if (!started)
            {
                started = true;
                BeginRebaseline(RebaselineReason.Initial, gate.StartSeconds);
            }
            else if (noSignal)
            {
                noSignal = false;
                BeginRebaseline(RebaselineReason.SignalRestored, gate.StartSeconds);
            }

            if (manualRequested)
            {
                manualRequested = false;
                if (phase == PhaseTracking && detector.ForceClose(EventEnd.Rebaseline, merger.NextSlot()))
                {
                    merger.Commit();
                }

                BeginRebaseline(RebaselineReason.Manual, gate.StartSeconds);
            }

            lastTimeSeconds = t;
            if (span > 0)
            {
                lastSpanSeconds = span;
            }

            double frequency = gate.FrequencyHz;
            double correction = TemperatureCorrectionHz(frequency);
            double x = frequency - correction;
            bool belowFloor = settings.Signal == SignalKind.Beat && frequency < settings.BeatFloorHz;

            if (phase == PhaseSettling && gate.StartSeconds - phaseStartSeconds + TimeEpsilonSeconds >= settings.SettlingSeconds)
            {
                phase = PhaseCapturing;
                capture.Clear();
                captureStartSeconds = gate.StartSeconds;
                captureMaxErrorHz = 0;
            }

            if (phase == PhaseCapturing)
            {
                capture.Add(t, x);
                captureMaxErrorHz = ScalarMath.Max(captureMaxErrorHz, gate.ErrorHz);
                if ((t - captureStartSeconds + TimeEpsilonSeconds >= settings.BaselineSeconds && capture.Count >= MinCaptureGates) || capture.IsFull)
                {
                    CompleteCapture();
                }

                SettlingReading(t, span, frequency, correction, belowFloor, reading);
                return false;
            }

            if (phase == PhaseSettling)
            {
                SettlingReading(t, span, frequency, correction, belowFloor, reading);
                return false;
            }

            double relative = x - originHz;
            double predictedRelative = tracker.Predict(t);
            double forecastVariance = tracker.PredictVariance(t);
            double shift = sideSign * (relative - predictedRelative);
            double noise = Sigma(gate.ErrorHz);
            double sigma = DetectionSigma(noise, t);
            double forecast = predictedRelative;
            double ppmReference = PpmReferenceHz(originHz + predictedRelative);
            history.Add(t, relative);
            bool ended = detector.Step(t, span, shift, sigma, ppmReference, belowFloor, merger.NextSlot());
            bool anchored = false;
            if (ended)
            {
                merger.Commit();
                history.Exclude(detector.StartSeconds - ExcursionResolver.EdgeMarginSeconds, t);
                blankRemaining = BlankGates(span);
            }

            // A probe (see ProbeSeconds) starts when the fed readings begin to lean, and ends when the resolver has decided
            // it, after ProbeSeconds, or when a candidate opens.
            if (detector.EventOpen || hold || ended)
            {
                probing = false;
                probeRequested = false;
            }
            else if (!probing && probeRequested && blankRemaining == 0)
            {
                probing = true;
                probeRequested = false;
                probeStartSeconds = probeRequestSeconds;
                Rewind(probeStartSeconds - EdgeRewindSeconds);
                InvalidateDelayLine();
                lastCheckSeconds = t;
            }

            bool endProbe = probing && t - probeStartSeconds > ProbeSeconds;
            bool checkDue = t - lastCheckSeconds + TimeEpsilonSeconds >= ExcursionResolver.CheckIntervalSeconds;
            bool candidateDue = !detector.JustStarted && detector.TargetPresent && !hold && checkDue;
            if (detector.JustStarted)
            {
                Rewind(detector.StartSeconds - EdgeRewindSeconds);
                InvalidateDelayLine();
                lastCheckSeconds = t;
            }
            else if (candidateDue || (probing && !endProbe && checkDue))
            {
                lastCheckSeconds = t;
                bool decided = Decide(candidateDue ? detector.StartSeconds : probeStartSeconds, candidateDue, t, Sigma(0), belowFloor);
                if (candidateDue)
                {
                    anchored = decided;
                }
                else
                {
                    endProbe = decided;
                }
            }

            if (endProbe)
            {
                EndProbe(t);
            }

            if (detector.EventOpen && !hold && t - detector.PersistSinceSeconds + TimeEpsilonSeconds >= settings.PersistentShiftSeconds)
            {
                if (!AbsorbPersistentShift(t, Sigma(0)))
                {
                    SettlingReading(t, span, frequency, correction, belowFloor, reading);
                    return false;
                }

                anchored = true;
            }

            if (anchored)
            {
                predictedRelative = tracker.Predict(t);
                shift = sideSign * (relative - predictedRelative);
                sigma = DetectionSigma(noise, t);
            }

            double predicted = originHz + predictedRelative;
            bool present = detector.TargetPresent;
            merger.Tick(t, present, detector.StartSeconds);
            bool valid = !present && !ended && !anchored && !probing && blankRemaining == 0;
            if (!present && !ended && blankRemaining > 0)
            {
                blankRemaining--;
            }

            PushDelayLine(t, span, relative, valid, forecast, forecastVariance, noise);

            TargetClass live = TargetClass.None;
            if (present)
            {
                double peak = detector.PeakShiftHz;
                live = SignRule.Classify(peak, ScalarMath.Abs(peak) / sigma, settings.ThresholdSigma, settings.UnclearBandSigma, settings.Polarity, belowFloor);
            }

            state = hold ? ReadoutState.Hold : (present ? ReadoutState.Target : ReadoutState.Tracking);
            bool hasPpm = ppmReference > 0;
            reading.Set(
                state,
                t,
                span,
                true,
                frequency,
                true,
                predicted,
                shift,
                hasPpm,
                hasPpm ? shift / ppmReference * 1e6 : 0.0,
                ScalarMath.Abs(shift) / sigma,
                sigma,
                tracker.PredictSlope(t),
                correction,
                present,
                hold,
                belowFloor,
                live,
                disturbed);
            return true;
        }

        // An open candidate (candidate true) or a probe (false) decided from both sides of it (ExcursionResolver): a pass
        // is reported with its two-sided peak; for a candidate, drift and false starts re-anchor the tracker; true when
        // decided (for a candidate: the tracker was re-anchored).
        private bool Decide(double startSeconds, bool candidate, double t, double sigma, bool belowFloorNow)
        {
            double releaseSigma = settings.ThresholdSigma - settings.HysteresisSigma;
            double age = t - startSeconds + TimeEpsilonSeconds;
            bool allowDrift = candidate && age >= settings.LockCheckSeconds;
            bool allowPass = age < 3.0 * settings.LockCheckSeconds;
            if (!allowPass && !allowDrift)
            {
                return false;
            }

            resolver.Resolve(history, startSeconds, t, sigma, settings.ThresholdSigma, releaseSigma, settings.ReleaseSeconds, settings.FitWindowSeconds, allowDrift, allowPass, 2.0 * settings.LockCheckSeconds, tracker.PredictSlope(t), tracker.AccelerationHzPerSecond2, chainFromSeconds, candidate ? 1 : ProbeMinReadings, verdict);
            if (verdict.Kind == ExcursionVerdict.Pending)
            {
                return false;
            }

            if (verdict.Kind == ExcursionVerdict.Pass)
            {
                bool floorSeen = detector.BelowFloorSeen || belowFloorNow;
                for (int k = 0; k < verdict.PassCount; k++)
                {
                    double peakShift = sideSign * verdict.PassPeakCountedHz[k];
                    double peakSigma = ScalarMath.Abs(peakShift) / sigma;
                    double ppmReference = PpmReferenceHz(originHz + verdict.PassPeakBaselineHz[k]);
                    bool hasPpm = ppmReference > 0;
                    TargetClass cls = SignRule.Classify(peakShift, peakSigma, settings.ThresholdSigma, settings.UnclearBandSigma, settings.Polarity, floorSeen || verdict.PassMixedSign[k]);
                    if (!candidate && cls == TargetClass.Unclear)
                    {
                        // A probe reports only a pass whose class is clear: it looked below the threshold to begin with.
                        continue;
                    }

                    merger.NextSlot().Set(
                        verdict.PassStartSeconds[k],
                        verdict.PassEndSeconds[k],
                        verdict.PassPeakSeconds[k],
                        peakShift,
                        hasPpm,
                        hasPpm ? peakShift / ppmReference * 1e6 : 0.0,
                        peakSigma,
                        sigma,
                        cls,
                        floorSeen,
                        verdict.PassMixedSign[k],
                        EventEnd.Resolved);
                    merger.Commit();
                    history.Exclude(verdict.PassStartSeconds[k] - ExcursionResolver.EdgeMarginSeconds, verdict.PassEndSeconds[k] + TailMarginSeconds);
                }
            }
            else if (verdict.Kind == ExcursionVerdict.Drift)
            {
                // The drift rate changed before the window the new drift was fitted to: the readings before it
                // follow the old drift and no longer serve as the before-side of a later candidate.
                lockRecoveries++;
                chainFromSeconds = verdict.StartSeconds;
                if (history.Count > 0)
                {
                    history.Exclude(history.TimeAt(0), verdict.StartSeconds - TimeEpsilonSeconds);
                }
            }

            if (!candidate)
            {
                // A probe: the tracker, held since the probe began, goes on from where it was.
                return true;
            }

            detector.Discard();
            Reanchor(t);
            return true;
        }

        // An event that outlasted persistent_shift_s: reported (end AutoRebaseline), then its level becomes the
        // baseline, re-acquired from the last fit_window_s of readings held (no blind settling). False when
        // too few readings are held for that; the caller then re-baselines by settling and capture.
        private bool AbsorbPersistentShift(double t, double sigma)
        {
            double eventStart = detector.StartSeconds;
            if (detector.ForceClose(EventEnd.AutoRebaseline, merger.NextSlot()))
            {
                merger.Commit();
            }

            double from = t - settings.FitWindowSeconds;
            history.Exclude(eventStart - ExcursionResolver.EdgeMarginSeconds, from);
            if (!resolver.FitRecent(history, from, t, t, sigma, verdict))
            {
                detector.Discard();
                BeginRebaseline(RebaselineReason.Auto, t);
                return false;
            }

            double absorbed = sideSign * (verdict.LevelHz - tracker.Predict(t));
            double ppmReference = PpmReferenceHz(originHz + verdict.LevelHz);
            bool hasPpm = ppmReference > 0;
            bool hint = disturbanceSign != 0 && absorbed != 0 && (absorbed > 0) != (disturbanceSign > 0);
            notices.NextSlot().Set(
                RebaselineReason.Auto,
                t,
                t,
                originHz + verdict.LevelHz,
                sigma,
                true,
                absorbed,
                hasPpm,
                hasPpm ? absorbed / ppmReference * 1e6 : 0.0,
                0,
                0,
                false,
                0,
                hint);
            notices.Commit();
            detector.Discard();
            Reanchor(t);
            return true;
        }

        // The tracker restarts on the fit; its acceleration only when the fit determines it (3 sigma), since a
        // noisy acceleration integrates into a slope error of a tau_a.
        private void Reanchor(double t)
        {
            tracker.Reset(verdict.LevelHz, verdict.SlopeHzPerSecond, verdict.AccelerationHzPerSecond2, t, verdict.LevelSigmaHz, verdict.SlopeSigmaHzPerSecond, verdict.AccelerationSigmaHzPerSecond2, Sigma(0), lastSpanSeconds);
            ClearDelayLine();
            blankRemaining = 0;
        }

        private void SettlingReading(double t, double span, double frequency, double correction, bool belowFloor, Reading reading)
        {
            state = ReadoutState.Settling;
            reading.Set(ReadoutState.Settling, t, span, true, frequency, false, 0, 0, false, 0, 0, 0, 0, correction, false, hold, belowFloor, TargetClass.None, disturbed);
        }

        // The tracker's forecast variance at t, but no further ahead than the delay line's horizon ((delay + 1) gates):
        // across a held target the forecast is judged afterwards from both sides (ExcursionResolver), and a sigma
        // that grew with the gap would end a long pass in the middle.
        private double DetectionVariance(double t)
        {
            double horizon = HorizonEndSeconds(lastSpanSeconds);
            return tracker.PredictVariance(t < horizon ? t : horizon);
        }

        // The latest time a regular forecast reaches: (delay + 1) gates after the tracker's last reading.
        private double HorizonEndSeconds(double span)
        {
            return tracker.TimeSeconds + ((delayGates + 1) * span);
        }

        // Detection sigma: the larger of what the tracker expects of its forecast (sqrt(noise^2 + V)) and what its
        // forecasts of target-free readings really missed by (1.4826 median |x - forecast| over the noise window,
        // once it holds MinForecastSamples): noise that wanders between gates is not white, and the third
        // differences do not see all of it.
        private double DetectionSigma(double noise, double t)
        {
            double expected = ScalarMath.Sqrt((noise * noise) + DetectionVariance(t));
            return forecastWindow.Count >= MinForecastSamples ? ScalarMath.Max(expected, forecastNoiseHz) : expected;
        }

        private double Sigma(double gateErrorHz)
        {
            return ScalarMath.Max(ScalarMath.Max(runningNoiseHz, settings.NoiseFloorHz), gateErrorHz);
        }

        private double PpmReferenceHz(double baselineCountedHz)
        {
            if (settings.Signal == SignalKind.Search)
            {
                return baselineCountedHz > 0 ? baselineCountedHz : 0.0;
            }

            return settings.SearchHz;
        }

        private double TemperatureCorrectionHz(double countedHz)
        {
            if (settings.TempcoPpmPerK == 0 || !hasTemperature)
            {
                return 0.0;
            }

            double nominal = settings.SearchHz > 0 ? settings.SearchHz : countedHz;
            return sideSign * settings.TempcoPpmPerK * 1e-6 * nominal * (temperatureC - referenceTemperatureC);
        }

        private void EnterNoSignal()
        {
            if (noSignal)
            {
                return;
            }

            merger.Flush();
            if (phase == PhaseTracking)
            {
                if (detector.ForceClose(EventEnd.NoSignal, merger.NextSlot()))
                {
                    merger.Commit();
                }

                SnapshotTracker();
            }

            detector.Discard();
            phase = PhaseSettling;
            capture.Clear();
            history.Clear();
            noSignal = started;
        }

        private void SnapshotTracker()
        {
            hasOld = true;
            oldLevelHz = originHz + tracker.LevelHz;
            oldSlopeHzPerSecond = tracker.SlopeHzPerSecond;
            oldTimeSeconds = tracker.TimeSeconds;
        }

        private void BeginRebaseline(RebaselineReason reason, double timeSeconds)
        {
            merger.Flush();
            if (phase == PhaseTracking)
            {
                SnapshotTracker();
            }

            pendingReason = everBaselined ? reason : RebaselineReason.Initial;
            requestedSeconds = timeSeconds;
            recaptures = 0;
            hasBest = false;
            history.Clear();
            chainFromSeconds = double.MaxValue;
            probing = false;
            probeRequested = false;
            phase = PhaseSettling;
            phaseStartSeconds = timeSeconds;
            capture.Clear();
            detector.Discard();
            ClearDelayLine();
            blankRemaining = 0;
        }

        private void CompleteCapture()
        {
            capture.TryEstimate(settings.OutlierSigma, estimate);
            double differenceNoise = capture.DifferenceNoiseHz();
            double curvedNoise = capture.FitQuadratic(settings.OutlierSigma, curveFit);
            bool curved = curvedNoise >= 0 && curvedNoise < CurvedNoiseRatio * estimate.NoiseHz;
            double levelHz = curved ? capture.OriginHz + curveFit.Value : estimate.LevelHz;
            double slope = curved ? curveFit.Slope : estimate.SlopeHzPerSecond;
            double acceleration = curved ? 2.0 * curveFit.HalfCurvature : 0.0;
            double noise = curved ? curvedNoise : estimate.NoiseHz;
            double time = estimate.TimeSeconds;
            int gates = estimate.Gates;
            int outliers = estimate.Outliers;
            bool keptDisturbed = false;
            if (estimate.Gates >= MinDisturbanceGates && differenceNoise > 0 && noise > DisturbedNoiseRatio * differenceNoise)
            {
                // A step or a run of outliers inside the capture: metal moved near the coil, or the coil moved.
                double ratio = noise / differenceNoise;
                double step = capture.StepHz(slope);
                disturbanceSign = step > 0 ? sideSign : (step < 0 ? -sideSign : 0.0);
                if (!hasBest || ratio < bestRatio)
                {
                    hasBest = true;
                    bestRatio = ratio;
                    bestLevelHz = levelHz;
                    bestSlopeHzPerSecond = slope;
                    bestNoiseHz = differenceNoise;
                    bestTimeSeconds = time;
                    bestGates = gates;
                    bestOutliers = outliers;
                }

                disturbed = true;
                if (recaptures < MaxRecaptures)
                {
                    recaptures++;
                    capture.Clear();
                    captureStartSeconds = lastTimeSeconds;
                    captureMaxErrorHz = 0;
                    return;
                }

                keptDisturbed = true;
                levelHz = bestLevelHz + (bestSlopeHzPerSecond * (time - bestTimeSeconds));
                slope = bestSlopeHzPerSecond;
                acceleration = 0.0;
                noise = bestNoiseHz;
                gates = bestGates;
                outliers = bestOutliers;
            }
            else
            {
                disturbed = false;
                disturbanceSign = 0.0;
            }

            noiseWindow.Clear();
            forecastWindow.Clear();
            runMonitor.Clear();
            fedRun = 0;
            capture.CopyAbsoluteThirdDifferences(noiseWindow, ThirdDifferenceScale);
            runningNoiseHz = noiseWindow.Count >= MinCaptureGates ? RobustStatistics.MadToSigma * noiseWindow.Median() : noise;

            double sigma = ScalarMath.Max(ScalarMath.Max(noise, settings.NoiseFloorHz), captureMaxErrorHz);
            double ppmReference = PpmReferenceHz(levelHz);
            bool hasPpm = ppmReference > 0;
            double shift = 0;
            if (hasOld)
            {
                double oldPrediction = oldLevelHz + (oldSlopeHzPerSecond * (time - oldTimeSeconds));
                shift = sideSign * (levelHz - oldPrediction);
            }

            notices.NextSlot().Set(
                pendingReason,
                requestedSeconds,
                time,
                levelHz,
                sigma,
                hasOld,
                shift,
                hasPpm && hasOld,
                hasPpm && hasOld ? shift / ppmReference * 1e6 : 0.0,
                gates,
                outliers,
                keptDisturbed,
                recaptures,
                false);
            notices.Commit();

            // The tracker starts from the capture's fit with the uncertainty of a fit of that many gates over that
            // span (line: level 2 sigma / sqrt n at its end, slope sigma sqrt(12 / n) / T); the acceleration, when
            // the capture did not determine it, with a prior of |slope| / MinDriftSeconds (thermal settling).
            double captureSeconds = capture.Count > 1 ? capture.TimeSecondsAt(capture.Count - 1) - capture.TimeSecondsAt(0) : 0.0;
            double n = gates > 1 ? gates : 1;
            double fitNoise = ScalarMath.Max(noise, sigma);
            double levelSigma = 2.0 * fitNoise / ScalarMath.Sqrt(n);
            double slopeSigma = captureSeconds > 0 ? fitNoise * ScalarMath.Sqrt(12.0 / n) / captureSeconds : fitNoise;
            double accelerationSigma = curved
                ? 2.0 * fitNoise * ScalarMath.Sqrt(curveFit.CurvatureVarianceFactor)
                : (ScalarMath.Abs(slope) + slopeSigma) / ExcursionResolver.MinDriftSeconds;
            originHz = levelHz;
            double trackerNoise = ScalarMath.Max(runningNoiseHz, settings.NoiseFloorHz);
            detector.Discard();
            ClearDelayLine();
            if (keptDisturbed || capture.Count < MinCaptureGates)
            {
                tracker.Reset(0.0, slope, acceleration, time, levelSigma, slopeSigma, accelerationSigma, trackerNoise, lastSpanSeconds);
            }
            else
            {
                StartTrackerOnCapture(time, slope, acceleration, levelSigma, slopeSigma, accelerationSigma, captureSeconds, trackerNoise);
            }

            blankRemaining = 0;
            phase = PhaseTracking;
            everBaselined = true;
            recaptures = 0;
            hasBest = false;
            history.Clear();
            if (!keptDisturbed)
            {
                for (int i = 0; i < capture.Count; i++)
                {
                    history.Add(capture.TimeSecondsAt(i), capture.ValueHzAt(i) - originHz);
                }
            }

            if (!hasFirstBaseline)
            {
                hasFirstBaseline = true;
                firstBaselineHz = levelHz;
            }
        }

        // The tracker runs over the capture's own readings, from the capture fit at one gate before the first of them
        // with a prior widened by what the fit cannot tell apart (a line's slope is the mean rate over the capture,
        // not the rate at its end: the acceleration prior times half the capture), so that at the capture's end its
        // rate and acceleration, and their covariances, are those of the readings rather than of a straight line.
        // One pass over at most the capture's capacity, once per baseline.
        private void StartTrackerOnCapture(double time, double slope, double acceleration, double levelSigma, double slopeSigma, double accelerationSigma, double captureSeconds, double noise)
        {
            double t0 = capture.TimeSecondsAt(0);
            double span = capture.Count > 1 ? (capture.TimeSecondsAt(capture.Count - 1) - t0) / (capture.Count - 1) : lastSpanSeconds;
            double start = t0 - (span > 0 ? span : TimeEpsilonSeconds);
            double dt = start - time;
            double startLevel = (slope * dt) + (0.5 * acceleration * dt * dt);
            double startSlope = slope + (acceleration * dt);
            double halfSpanAcceleration = accelerationSigma * 0.5 * captureSeconds;
            double levelPrior = (2.0 * levelSigma) + (halfSpanAcceleration * 0.25 * captureSeconds) + (2.0 * noise);
            double slopePrior = slopeSigma + halfSpanAcceleration;
            tracker.Reset(startLevel, startSlope, acceleration, start, levelPrior, slopePrior, accelerationSigma, noise, span > 0 ? span : lastSpanSeconds);
            for (int i = 0; i < capture.Count; i++)
            {
                double t = capture.TimeSecondsAt(i);
                double x = capture.ValueHzAt(i) - originHz;
                UpdateTrackerGuarded(t, x, noise);
                TakeSnapshot();
            }
        }

        private int BlankGates(double span)
        {
            int gates = span > 0 ? (int)((EdgeRewindSeconds / span) + 0.5) : 0;
            return gates > delayGates ? gates : delayGates;
        }

        // Returns the tracker to the newest snapshot taken at or before a time (the oldest one held if none is that old).
        private void Rewind(double timeSeconds)
        {
            if (snapshotCount == 0)
            {
                return;
            }

            int k = 0;
            int slot = (snapshotHead + snapshotCount - 1) % SnapshotCount;
            while (k < snapshotCount - 1 && snapshots[slot].TimeSeconds > timeSeconds)
            {
                slot = slot == 0 ? SnapshotCount - 1 : slot - 1;
                k++;
            }

            if (snapshots[slot].TimeSeconds < tracker.TimeSeconds)
            {
                tracker.CopyFrom(snapshots[slot]);
            }

            snapshotCount -= k;
        }

        private void TakeSnapshot()
        {
            int slot = (snapshotHead + snapshotCount) % SnapshotCount;
            if (snapshotCount == SnapshotCount)
            {
                snapshotHead = (snapshotHead + 1) % SnapshotCount;
            }
            else
            {
                snapshotCount++;
            }

            snapshots[slot].CopyFrom(tracker);
        }

        private void ClearDelayLine()
        {
            runMonitor.ClearRun();
            heldSeconds = 0.0;
            snapshotCount = 0;
            delayHead = 0;
            delayCount = 0;
        }

        // Ends a probe: the tracker, held since the probe began, catches up on the readings held since then that no event
        // claimed (a pass found is excluded from the history), without learning from them; the delay line holds none of them.
        private void EndProbe(double t)
        {
            probing = false;
            double noise = ScalarMath.Max(runningNoiseHz, settings.NoiseFloorHz);
            for (int i = 0; i < history.Count; i++)
            {
                double ti = history.TimeAt(i);
                if (ti <= tracker.TimeSeconds || ti > t || history.IsExcluded(i))
                {
                    continue;
                }

                UpdateTrackerGuarded(ti, history.ValueAt(i), noise);
            }

            InvalidateDelayLine();
        }

        // One Kalman update of the tracker with a reading x (relative to originHz) whose residual from the forecast is
        // clipped to +-guard_sigma of its expected scatter, sqrt(noise^2 + V).
        private void UpdateTrackerGuarded(double t, double x, double noise)
        {
            double predicted = tracker.Predict(t);
            double limit = settings.GuardSigma * ScalarMath.Sqrt((noise * noise) + tracker.PredictVariance(t));
            tracker.Update(t, predicted + ScalarMath.Clamp(x - predicted, -limit, limit), noise);
        }

        private void InvalidateDelayLine()
        {
            for (int i = 0; i < delayValid.Length; i++)
            {
                delayValid[i] = false;
            }
        }

        private void PushDelayLine(double t, double span, double x, bool valid, double forecast, double forecastVariance, double noise)
        {
            // A forecast across a gap (a held target) is not a sample of the regular forecast error.
            bool regular = t <= HorizonEndSeconds(span) + (0.5 * span);
            if (delayGates == 0)
            {
                if (valid)
                {
                    Feed(t, span, x, forecast, forecastVariance, noise, regular);
                }

                return;
            }

            int slot = (delayHead + delayCount) % delayTimes.Length;
            delayTimes[slot] = t;
            delayValues[slot] = x;
            delaySpans[slot] = span;
            delayValid[slot] = valid;
            delayForecasts[slot] = forecast;
            delayVariances[slot] = forecastVariance;
            delayNoises[slot] = noise;
            delayRegular[slot] = regular;
            delayCount++;
            if (delayCount > delayGates)
            {
                int head = delayHead;
                delayHead = (delayHead + 1) % delayTimes.Length;
                delayCount--;
                if (delayValid[head])
                {
                    Feed(delayTimes[head], delaySpans[head], delayValues[head], delayForecasts[head], delayVariances[head], delayNoises[head], delayRegular[head]);
                }
            }
        }

        // x is relative to originHz, as the tracker's level is; forecast and forecastVariance are what the tracker
        // predicted for this reading when it arrived, noise the measurement sigma then.
        private void Feed(double t, double span, double x, double forecast, double forecastVariance, double noise, bool regular)
        {
            if (regular)
            {
                runMonitor.Add(t, span, x - forecast);
            }

            // A leaning run (see LeanSigma) is held back from the tracker: while held, it neither moves nor teaches it.
            bool leans = runMonitor.Leans(LeanSigma, MinForecastSamples);
            if (leans && heldSeconds == 0.0 && !probing)
            {
                // A run starts to lean: ask for a probe from the run's first reading on.
                probeRequested = true;
                probeRequestSeconds = t - ((ForecastRunMonitor.Readings - 1) * span);
            }

            heldSeconds = leans ? heldSeconds + span : 0.0;
            if (leans && heldSeconds <= MaxHeldSeconds + TimeEpsilonSeconds)
            {
                TakeSnapshot();
                AddNoiseSample(t, span, x);
                return;
            }

            tracker.Learn(x - forecast, forecastVariance + (noise * noise), noise, span);
            if (regular)
            {
                forecastWindow.Add(ScalarMath.Abs(x - forecast));
                forecastNoiseHz = RobustStatistics.MadToSigma * forecastWindow.Median();
            }
            UpdateTrackerGuarded(t, x, noise);
            TakeSnapshot();
            AddNoiseSample(t, span, x);
        }

        // Running measurement noise from third differences of consecutive fed readings: d = x_k - 3 x_(k-1) +
        // 3 x_(k-2) - x_(k-3) cancels any quadratic drift and has variance 20 sigma^2 for white noise, so
        // sigma = 1.4826 median |d| / sqrt 20 (d's over the last noise_window_gates). A gap restarts the run.
        private void AddNoiseSample(double t, double span, double x)
        {
            if (fedRun > 0 && !(t - fedTimeSeconds <= 1.5 * span))
            {
                fedRun = 0;
            }

            if (fedRun >= 3)
            {
                double d = x - (3.0 * fed1) + (3.0 * fed2) - fed3;
                noiseWindow.Add(ScalarMath.Abs(d) * ThirdDifferenceScale);
                runningNoiseHz = RobustStatistics.MadToSigma * noiseWindow.Median();
            }

            fed3 = fed2;
            fed2 = fed1;
            fed1 = x;
            fedTimeSeconds = t;
            if (fedRun < 3)
            {
                fedRun++;
            }
        }
    }
}
