using FreqReadout.Numerics;

namespace FreqReadout.Readout
{
    /// <summary>
    /// Decides an open target candidate afterwards, from the readings on both sides of it — the part
    /// of the readout that tells a coil pass from drift the causal tracker failed to follow.
    /// <para>
    /// Windows (times are gate ends; s = the candidate's first reading at or above the threshold, now =
    /// the newest reading): before B = [s - m - W, s - m) with m = <see cref="EdgeMarginSeconds"/> (a pass
    /// starts before it crosses the threshold) and W = fit_window_s; after A = (now - a, now] with
    /// a = max(<see cref="AfterSeconds"/>, release_s); middle M = [s - m, now - a]. Readings that belong to an
    /// earlier reported event are left out of B (for a pass this resolver found, also the second after its end: its tail
    /// below the release level still bends a fit; the owner marks them). sigma is the pipeline's noise sigma; k_t the threshold,
    /// k_r = threshold - hysteresis the release level, both in sigmas.
    /// </para>
    /// <para>
    /// (1) Pass: fit a quadratic Q_b to B alone and Q to B and A together (least squares,
    /// <see cref="QuadraticFit"/>). The shift has returned when every reading of A is within k_r sigma of Q
    /// and Q's curvature agrees with Q_b's: |c2 - c2_b| &lt;= 3 sigma sqrt(v_b) + 0.25 |c2_b| (v_b the variance
    /// factor of c2_b; drift curvature changes little over a few seconds, while bending a quadratic onto a
    /// shift that stayed takes a large change), and the mean of A lies within 3 sigma sqrt(1/n_A + v(t_A)) +
    /// |c2_b| d^3 / (3 tau_min) of Q_b extrapolated (v the prediction variance factor, d the distance from the
    /// middle of B, tau_min = <see cref="MinDriftSeconds"/>: the third-order term of a settling drift). Then the middle's residuals r = x - Q(t) give the event:
    /// start = first |r| &gt;= k_t sigma, end = last |r| &gt;= k_r sigma, peak = largest |r| (readings of an event already
    /// reported are skipped); none at k_t: no target (the owner may ask for more readings at k_t per pass: a probe, which
    /// no reading opened, asks for two).
    /// The pass test runs only while the candidate is younger than 3 lock_check_s (the owner decides): a shift
    /// that has not returned by then is no coil pass, and a quadratic bent through a long plateau would fake one.
    /// (2) Drift (only once the candidate is lock_check_s old; sigma here is the larger of the pipeline's and the rms
    /// noise of the drift window's own third differences, since the running noise was learnt before the candidate and
    /// a count's scatter changes as its frequency drifts): one quadratic fitted to the readings since the
    /// candidate opened (at most 2 lock_check_s back) leaves every residual below k_t sigma and a mean square
    /// below 2 sigma^2, and its curvature differs from the tracker's, or from none at all, by no more than a change of
    /// drift rate can bring (min(|c2 - a_T / 2|, |c2|) &lt;= |c1 - b_T| / (2 tau_min) + 3 sigma sqrt(v); b_T, a_T the
    /// tracker's rate and acceleration: a new settling of time constant tau bends by its rate over 2 tau, while the rising
    /// or falling edge of a pass bends far more than its slope over a minute; a straight new ramp is always plausible,
    /// whatever bend the tracker had wrongly learnt): a
    /// smooth change of drift rate, not a pass; and its slope differs from the tracker's by more than 3 sigma
    /// of the fitted slope (a level shift that stays, a step, keeps the old rate and stays a target). The window slides with time, so lock is recovered even when a
    /// pass came while it was lost. Before drift is declared, the readings before the drift window are searched
    /// for that pass: (3) the pass test of (1) with the drift window as the after side (a slow pass whose tail
    /// outlasted the pass test, the tracker's forecast having wandered meanwhile); (4) a pass across a change of
    /// drift rate: the baseline is the old drift going on with a new rate added from a kink time t_k,
    /// c0 + c1 u + c2 u^2 + db max(0, t - t_k), fitted to B and the drift window together with t_k the best of a
    /// 0.05 s grid over the middle (<see cref="KinkFit"/>); a peak within 0.3 s of t_k and no larger than
    /// |db| 0.05 s + k_t sigma is taken for the kink's own timing error (a kink placed dt off leaves db dt; both sides place
    /// it to within the grid), not a pass (a larger one is a pass, perhaps one that pulled the fitted kink onto itself;
    /// the tracker then restarts on the kink fit's level and rate at now, with the drift window's bend); for the same reason the readings within 0.3 s of t_k
    /// do not count towards a pass's mixed signs. A pass with at least two readings of the middle
    /// at k_t sigma from that baseline is reported as in (1) (end Resolved); otherwise drift. In every case the
    /// middle may hold more than one pass (a lock loss can last through several): excursions separated by more than
    /// 0.5 s below k_r sigma are separate passes, up to <see cref="ExcursionVerdict.MaxPasses"/>, each its own event.
    /// (5) A chain: when drift would be declared again within <see cref="ChainSeconds"/> of the start c of the last
    /// drift window (the owner passes c), the tracker has most likely learnt part of a pass as drift since that lock
    /// recovery (it starts on a fit of a few seconds and follows a pass's rising flank, then loses lock on the falling
    /// one). One quadratic is fitted to the readings since c, robustly: of the fits that leave out no quarter of the
    /// span, one quarter or two neighbouring quarters, the one with the most readings within 3 sigma' seeds three rounds
    /// of refitting to the readings within 3 sigma' of the previous fit (sigma' the larger of sigma and the span's own
    /// third-difference noise). It explains the span when at least 60 % of the readings stay within 3 sigma', their
    /// mean square is below 2 sigma'^2, and the newest a s are each within k_t sigma' with a mean within 2 sigma' (the
    /// drift goes on as one curve: no new kink). Then the residuals of [c + m, now - a] give the passes as in (1) with
    /// at least two readings at k_t sigma', and the tracker is re-anchored on that longer fit; otherwise drift.
    /// (6) A crowded drift: when the plain drift test fails on a candidate too old for the pass test (passes keep coming
    /// while lock is lost, so no drift window is ever clear of one), the readings since the candidate opened, at most
    /// <see cref="ChainSeconds"/> back, get the robust quadratic of (5); when it explains them and is a plausible drift as
    /// in (2) (a step keeps the old rate and stays a target), its residuals give the passes with at least two readings at
    /// k_t sigma' (none with mixed signs and none starting within m of the span's start: a quadratic bent across a kink
    /// leaves those, and the candidate then waits for (4)), and the tracker is re-anchored on that fit; with no pass in it,
    /// drift.
    /// Otherwise the candidate stays pending. Cost: O(n) in the readings held (at most history_gates),
    /// run at most every <see cref="CheckIntervalSeconds"/> while a candidate is open; nothing allocates.
    /// </para>
    /// </summary>
    internal sealed class ExcursionResolver
    {
        /// <summary>How long before its threshold crossing a pass may already have started, s.</summary>
        public const double EdgeMarginSeconds = 1.0;

        /// <summary>Least length of the window after the candidate, s.</summary>
        public const double AfterSeconds = 1.0;

        /// <summary>Least spacing of two decisions while a candidate is open, s.</summary>
        public const double CheckIntervalSeconds = 0.2;

        /// <summary>Shortest time constant of thermal drift assumed when a quadratic is extrapolated, s.</summary>
        public const double MinDriftSeconds = 30.0;

        private const double AgreementSigmas = 3.0;
        private const int MinBeforeReadings = 6;
        private const int MinAfterReadings = 3;

        // Readings at k_t sigma that a pass found by (3) or (4) needs: one reading beyond the threshold from a baseline
        // bridged across a gap (or a kink) is not evidence enough.
        private const int LateMinReadings = 2;

        // Step of the kink times tried by (4), s.
        private const double KinkStepSeconds = 0.05;

        // Newest readings WindowNoise reads at most (the drift window holds 50 readings of 0.1 s gates).
        private const int WindowNoiseReadings = 67;

        // Two excursions of the middle further apart than this (below the release level in between) are two passes, s
        // (the gap at which events are merged, EventMerger).
        private const double SegmentGapSeconds = 0.5;

        // A peak this close to the kink found by (4) is taken for the error of the kink's time, not a pass, s: where the
        // drift rate changes by db, a kink placed dt off leaves a residual of db dt.
        private const double KinkGuardSeconds = 0.3;

        /// <summary>Longest span since the last lock recovery's drift window that test (5) asks one quadratic to explain, s.</summary>
        public const double ChainSeconds = 15.0;

        // (5): trim rounds, the trim in sigmas, the least share of the readings it must keep, the seed fits tried, and
        // the largest mean residual of the newest readings, in sigmas.
        private const int ChainTrimRounds = 2;
        private const double ChainTrimSigmas = 3.0;
        private const double ChainInlierShare = 0.6;
        private const double ChainEndSigmas = 2.0;
        private const int ChainSeeds = 8;

        private readonly QuadraticFit before = new QuadraticFit();
        private readonly QuadraticFit sides = new QuadraticFit();
        private readonly QuadraticFit all = new QuadraticFit();
        private readonly KinkFit kink = new KinkFit();
        private readonly QuadraticFit chain = new QuadraticFit();
        private readonly QuadraticFit chainNext = new QuadraticFit();
        private readonly QuadraticFit[] quarters = new QuadraticFit[4];
        private readonly QuadraticFit[] seeds = new QuadraticFit[ChainSeeds];
        private readonly int[] seedKept = new int[ChainSeeds];
        private readonly bool[] seedUsable = new bool[ChainSeeds];
        private bool open;
        private double segmentStart;
        private double segmentEnd;
        private int segmentBeyond;
        private double largestPositive;
        private double largestNegative;
        private double segmentPeak;
        private double segmentPeakSeconds;
        private double segmentPeakBaseline;
        private double beforeCenterSeconds;
        private double driftFromSeconds;

        /// <summary>Creates a resolver; every fit it uses is made here, once.</summary>
        public ExcursionResolver()
        {
            for (int k = 0; k < quarters.Length; k++)
            {
                quarters[k] = new QuadraticFit();
            }

            for (int c = 0; c < seeds.Length; c++)
            {
                seeds[c] = new QuadraticFit();
            }
        }

        /// <summary>Fits a quadratic to the non-excluded readings with from &lt;= t &lt;= to, origin at originSeconds; false when it is not determined.</summary>
        public bool FitRecent(ReadingHistory history, double fromSeconds, double toSeconds, double originSeconds, double sigmaHz, ExcursionVerdict into)
        {
            all.Clear(originSeconds);
            for (int i = FirstAtOrAfter(history, fromSeconds); i < history.Count; i++)
            {
                double t = history.TimeAt(i);
                if (t >= fromSeconds && t <= toSeconds && !history.IsExcluded(i))
                {
                    all.Add(t, history.ValueAt(i));
                }
            }

            if (all.Count < MinBeforeReadings || !all.TrySolve())
            {
                return false;
            }

            Anchor(all, sigmaHz, into);
            return true;
        }

        /// <summary>Decides the candidate that opened at <paramref name="startSeconds"/> (method in the class summary).</summary>
        public void Resolve(
            ReadingHistory history,
            double startSeconds,
            double nowSeconds,
            double sigmaHz,
            double thresholdSigma,
            double releaseSigma,
            double releaseSeconds,
            double fitWindowSeconds,
            bool allowDrift,
            bool allowPass,
            double driftWindowSeconds,
            double trackerSlopeHzPerSecond,
            double trackerAccelerationHzPerSecond2,
            double chainFromSeconds,
            int passMinReadings,
            ExcursionVerdict into)
        {
            into.Kind = ExcursionVerdict.Pending;
            beforeCenterSeconds = startSeconds - EdgeMarginSeconds - (fitWindowSeconds / 2.0);
            double afterSeconds = ScalarMath.Max(AfterSeconds, releaseSeconds);
            double middleFrom = startSeconds - EdgeMarginSeconds;
            double beforeFrom = middleFrom - fitWindowSeconds;
            double afterFrom = nowSeconds - afterSeconds;
            if (afterFrom <= startSeconds || !(sigmaHz > 0))
            {
                return;
            }

            // The drift test looks at the readings since the candidate opened, at most driftWindowSeconds back:
            // a change of drift rate (a kink) lies before them, and a pass that came while lock was lost
            // leaves the window again, so lock is still recovered.
            double driftFrom = ScalarMath.Max(startSeconds, nowSeconds - driftWindowSeconds);
            driftFromSeconds = driftFrom;
            before.Clear(nowSeconds);
            sides.Clear(nowSeconds);
            all.Clear(nowSeconds);
            int afterCount = 0;
            for (int i = FirstAtOrAfter(history, beforeFrom); i < history.Count; i++)
            {
                double t = history.TimeAt(i);
                double x = history.ValueAt(i);
                bool excluded = history.IsExcluded(i);
                if (t >= driftFrom && !excluded)
                {
                    all.Add(t, x);
                }

                if (t < middleFrom)
                {
                    if (!excluded)
                    {
                        before.Add(t, x);
                        sides.Add(t, x);
                    }
                }
                else if (t > afterFrom)
                {
                    sides.Add(t, x);
                    afterCount++;
                }
            }

            // The readings before the candidate may have left the history (a lock loss longer than it holds): then only
            // the drift test runs, and lock is still recovered.
            bool twoSided = before.Count >= MinBeforeReadings && afterCount >= MinAfterReadings && before.TrySolve() && sides.TrySolve();
            if (twoSided && allowPass && SidesAgree(history, afterFrom, sigmaHz, releaseSigma))
            {
                FillPass(history, middleFrom, afterFrom, sigmaHz, thresholdSigma, releaseSigma, sides, sides, double.MaxValue, null, passMinReadings, into);
                return;
            }

            // The drift window is judged with its own noise when that is larger: the running noise was learnt before the
            // candidate opened, and the scatter of a count changes with the frequency (quantisation), which drifts.
            double driftSigma = allowDrift ? ScalarMath.Max(sigmaHz, WindowNoise(history, driftFrom)) : sigmaHz;
            if (allowDrift && all.Count >= MinBeforeReadings && all.TrySolve() && PlausibleDrift(all, driftSigma, trackerSlopeHzPerSecond, trackerAccelerationHzPerSecond2) && Smooth(history, driftFromSeconds, driftSigma, thresholdSigma))
            {
                // (3) A slow pass whose tail outlasted the pass test: the drift window itself is the after side.
                if (twoSided && driftFrom > middleFrom && FillSides(history, beforeFrom, middleFrom, driftFrom) >= MinAfterReadings && sides.TrySolve() && SidesAgree(history, driftFrom, sigmaHz, releaseSigma))
                {
                    FillPass(history, middleFrom, driftFrom, sigmaHz, thresholdSigma, releaseSigma, sides, sides, double.MaxValue, null, LateMinReadings, into);
                    if (into.Kind == ExcursionVerdict.Pass)
                    {
                        return;
                    }
                }

                // (4) A pass across a change of drift rate: the old drift goes on and a new rate adds to it from a kink
                // (KinkFit, fitted to the readings before the candidate and the drift window; the kink's time is the
                // one that fits them best).
                if (twoSided && driftFrom > middleFrom && FillKink(history, beforeFrom, middleFrom, driftFrom, nowSeconds) && kink.TrySolve(middleFrom, driftFrom, KinkStepSeconds))
                {
                    FillPass(history, middleFrom, driftFrom, sigmaHz, thresholdSigma, releaseSigma, all, all, double.MaxValue, kink, LateMinReadings, into);
                    if (into.Kind == ExcursionVerdict.Pass && DropPassesNear(kink.KinkSeconds, (ScalarMath.Abs(kink.RateChange) * KinkStepSeconds) + (thresholdSigma * sigmaHz), into))
                    {
                        // The tracker restarts on the kink fit's level and rate, which both sides tell, rather than on
                        // the drift window's alone, which may hold the pass's tail (its bend and the bend's wide
                        // uncertainty stay the drift window's).
                        into.LevelHz = kink.Evaluate(nowSeconds);
                        into.SlopeHzPerSecond = kink.SlopeAt(nowSeconds);
                        return;
                    }
                }

                // (5) A second loss of lock soon after the first: one smooth drift since the earlier kink, with a pass the
                // tracker partly learnt as drift in between.
                if (chainFromSeconds < middleFrom && nowSeconds - chainFromSeconds <= ChainSeconds)
                {
                    double chainSigma = ScalarMath.Max(sigmaHz, WindowNoise(history, chainFromSeconds));
                    if (FillChain(history, chainFromSeconds, nowSeconds, chainSigma, thresholdSigma))
                    {
                        FillPass(history, chainFromSeconds + EdgeMarginSeconds, nowSeconds - afterSeconds, chainSigma, thresholdSigma, releaseSigma, chain, chain, double.MaxValue, null, LateMinReadings, into);
                        if (into.Kind == ExcursionVerdict.Pass)
                        {
                            return;
                        }
                    }
                }

                into.Kind = ExcursionVerdict.Drift;
                into.StartSeconds = driftFrom;
                Anchor(all, sigmaHz, into);
            }
            else if (allowDrift && !allowPass)
            {
                // (6) A crowded drift: passes keep coming while lock is lost, so no drift window is ever clear of them.
                double crowdFrom = ScalarMath.Max(startSeconds, nowSeconds - ChainSeconds);
                double crowdSigma = ScalarMath.Max(sigmaHz, WindowNoise(history, crowdFrom));
                if (FillChain(history, crowdFrom, nowSeconds, crowdSigma, thresholdSigma) && PlausibleDrift(chain, crowdSigma, trackerSlopeHzPerSecond, trackerAccelerationHzPerSecond2))
                {
                    FillPass(history, crowdFrom, nowSeconds - afterSeconds, crowdSigma, thresholdSigma, releaseSigma, chain, chain, double.MaxValue, null, LateMinReadings, into);
                    if (into.Kind == ExcursionVerdict.Pass)
                    {
                        if (!PassesClear(into, crowdFrom + EdgeMarginSeconds))
                        {
                            into.Kind = ExcursionVerdict.Pending;
                        }

                        return;
                    }

                    into.Kind = ExcursionVerdict.Drift;
                    into.StartSeconds = crowdFrom;
                    Anchor(chain, crowdSigma, into);
                }
            }
        }

        // Test (5)'s robust quadratic (class summary) of the non-excluded readings since fromSeconds into `chain`; true when
        // it explains them. O(n) for each of the ChainSeeds seed fits and ChainTrimRounds rounds; nothing allocates.
        private bool FillChain(ReadingHistory history, double fromSeconds, double nowSeconds, double sigmaHz, double thresholdSigma)
        {
            // Seeds: the fits of all readings and of the readings outside two neighbouring quarters of the span (a pass
            // covers at most about half of it), made from the four quarters' sums; the one that keeps the most readings
            // within the trim wins.
            int first = FirstAtOrAfter(history, fromSeconds);
            double trim = ChainTrimSigmas * sigmaHz;
            double quarterSeconds = (nowSeconds - fromSeconds) / 4.0;
            for (int k = 0; k < 4; k++)
            {
                quarters[k].Clear(nowSeconds);
            }

            int total = 0;
            for (int i = first; i < history.Count; i++)
            {
                if (history.IsExcluded(i))
                {
                    continue;
                }

                double t = history.TimeAt(i);
                int q = (int)((t - fromSeconds) / quarterSeconds);
                quarters[q < 0 ? 0 : (q > 3 ? 3 : q)].Add(t, history.ValueAt(i));
                total++;
            }

            if (total < 2 * MinBeforeReadings)
            {
                return false;
            }

            // Seed c = 0: all quarters; 1-4: all but quarter c - 1; 5-7: all but quarters c - 5 and c - 4.
            for (int c = 0; c < ChainSeeds; c++)
            {
                QuadraticFit seed = seeds[c];
                seed.Clear(nowSeconds);
                for (int k = 0; k < 4; k++)
                {
                    bool left = (c >= 1 && c <= 4 && k == c - 1) || (c >= 5 && (k == c - 5 || k == c - 4));
                    if (!left)
                    {
                        seed.Merge(quarters[k]);
                    }
                }

                seedKept[c] = 0;
                seedUsable[c] = seed.Count >= MinBeforeReadings && seed.TrySolve();
            }

            for (int i = first; i < history.Count; i++)
            {
                if (history.IsExcluded(i))
                {
                    continue;
                }

                double t = history.TimeAt(i);
                double x = history.ValueAt(i);
                for (int c = 0; c < ChainSeeds; c++)
                {
                    if (seedUsable[c] && ScalarMath.Abs(x - seeds[c].Evaluate(t)) < trim)
                    {
                        seedKept[c]++;
                    }
                }
            }

            QuadraticFit best = null;
            int bestKept = 0;
            for (int c = 0; c < ChainSeeds; c++)
            {
                if (seedKept[c] > bestKept)
                {
                    best = seeds[c];
                    bestKept = seedKept[c];
                }
            }

            if (best == null)
            {
                return false;
            }

            QuadraticFit previous = best;
            for (int round = 0; round < ChainTrimRounds; round++)
            {
                QuadraticFit next = round % 2 == 0 ? chain : chainNext;
                next.Clear(nowSeconds);
                for (int i = first; i < history.Count; i++)
                {
                    double t = history.TimeAt(i);
                    if (!history.IsExcluded(i) && ScalarMath.Abs(history.ValueAt(i) - previous.Evaluate(t)) < trim)
                    {
                        next.Add(t, history.ValueAt(i));
                    }
                }

                if (next.Count < MinBeforeReadings || !next.TrySolve())
                {
                    return false;
                }

                previous = next;
            }

            if (previous != chain)
            {
                chain.Clear(nowSeconds);
                chain.Merge(previous);
                chain.TrySolve();
            }

            double sumSquares = 0;
            int inliers = 0;
            double endSum = 0;
            int endCount = 0;
            double limit = thresholdSigma * sigmaHz;
            for (int i = first; i < history.Count; i++)
            {
                if (history.IsExcluded(i))
                {
                    continue;
                }

                double t = history.TimeAt(i);
                double r = history.ValueAt(i) - chain.Evaluate(t);
                if (t > nowSeconds - AfterSeconds)
                {
                    endSum += r;
                    endCount++;
                }

                if (t > nowSeconds - AfterSeconds && ScalarMath.Abs(r) >= limit)
                {
                    return false;
                }

                if (ScalarMath.Abs(r) < trim)
                {
                    sumSquares += r * r;
                    inliers++;
                }
            }

            return endCount > 0 && ScalarMath.Abs(endSum) <= ChainEndSigmas * sigmaHz * endCount && inliers >= ChainInlierShare * total && sumSquares < 2.0 * sigmaHz * sigmaHz * inliers;
        }

        // Noise of the readings from a time on: sqrt(mean d^2 / 20) over the third differences d = x_k - 3 x_(k-1) +
        // 3 x_(k-2) - x_(k-3) of consecutive non-excluded readings (they cancel a quadratic drift; for white noise
        // Var d = 20 sigma^2); an rms, as the mean-square test it serves; 0 with fewer than MinBeforeReadings of them.
        // Only the newest WindowNoiseReadings readings are read (the device's decision gate stays short).
        private static double WindowNoise(ReadingHistory history, double fromSeconds)
        {
            int run = 0;
            int n = 0;
            double sum = 0;
            double x1 = 0;
            double x2 = 0;
            double x3 = 0;
            int first = FirstAtOrAfter(history, fromSeconds);
            int newest = history.Count - WindowNoiseReadings;
            for (int i = first > newest ? first : newest; i < history.Count; i++)
            {
                if (history.IsExcluded(i))
                {
                    run = 0;
                    continue;
                }

                double x = history.ValueAt(i);
                if (run >= 3)
                {
                    double d = x - (3.0 * x1) + (3.0 * x2) - x3;
                    sum += d * d;
                    n++;
                }

                x3 = x2;
                x2 = x1;
                x1 = x;
                if (run < 3)
                {
                    run++;
                }
            }

            return n >= MinBeforeReadings ? ScalarMath.Sqrt(sum / (20.0 * n)) : 0.0;
        }

        // Refits the two-sided quadratic to the non-excluded readings of [beforeFrom, middleFrom) and all readings after
        // afterFrom; returns how many came from after afterFrom.
        private int FillSides(ReadingHistory history, double beforeFrom, double middleFrom, double afterFrom)
        {
            sides.Clear(history.TimeAt(history.Count - 1));
            int afterCount = 0;
            for (int i = FirstAtOrAfter(history, beforeFrom); i < history.Count; i++)
            {
                double t = history.TimeAt(i);
                if (t < middleFrom)
                {
                    if (!history.IsExcluded(i))
                    {
                        sides.Add(t, history.ValueAt(i));
                    }
                }
                else if (t > afterFrom)
                {
                    sides.Add(t, history.ValueAt(i));
                    afterCount++;
                }
            }

            return afterCount;
        }

        // Index of the oldest reading at or after a time, found from the newest end (readings are in time order).
        private static int FirstAtOrAfter(ReadingHistory history, double timeSeconds)
        {
            int i = history.Count;
            while (i > 0 && history.TimeAt(i - 1) >= timeSeconds)
            {
                i--;
            }

            return i;
        }

        private static void Anchor(QuadraticFit fit, double sigmaHz, ExcursionVerdict into)
        {
            into.LevelHz = fit.Value;
            into.SlopeHzPerSecond = fit.Slope;
            into.AccelerationHzPerSecond2 = 2.0 * fit.HalfCurvature;
            into.AccelerationSigmaHzPerSecond2 = 2.0 * sigmaHz * ScalarMath.Sqrt(fit.CurvatureVarianceFactor);
            into.LevelSigmaHz = sigmaHz * ScalarMath.Sqrt(fit.ValueVarianceFactor);
            into.SlopeSigmaHzPerSecond = sigmaHz * ScalarMath.Sqrt(fit.SlopeVarianceFactor);
        }

        private bool SidesAgree(ReadingHistory history, double afterFrom, double sigmaHz, double releaseSigma)
        {
            double curvatureTolerance = (AgreementSigmas * sigmaHz * ScalarMath.Sqrt(before.CurvatureVarianceFactor)) + (0.25 * ScalarMath.Abs(before.HalfCurvature));
            if (ScalarMath.Abs(sides.HalfCurvature - before.HalfCurvature) > curvatureTolerance)
            {
                return false;
            }

            double limit = releaseSigma * sigmaHz;
            double sumResidual = 0;
            double sumTime = 0;
            int n = 0;
            for (int i = history.Count - 1; i >= 0; i--)
            {
                double t = history.TimeAt(i);
                if (t <= afterFrom)
                {
                    break;
                }

                if (ScalarMath.Abs(history.ValueAt(i) - sides.Evaluate(t)) >= limit)
                {
                    return false;
                }

                sumResidual += history.ValueAt(i) - before.Evaluate(t);
                sumTime += t;
                n++;
            }

            if (n == 0)
            {
                return false;
            }

            // The after window must also continue what the readings before the candidate predict: within
            // 4 sigma of the extrapolation's own uncertainty plus what drift curvature can change over the
            // distance (third-order term of a settling with a time constant of at least MinDriftSeconds).
            double meanTime = sumTime / n;
            double distance = meanTime - beforeCenterSeconds;
            double spread = sigmaHz * ScalarMath.Sqrt((1.0 / n) + before.PredictionVarianceFactor(meanTime));
            double allowance = ScalarMath.Abs(before.HalfCurvature) * distance * distance * distance / (3.0 * MinDriftSeconds);
            return ScalarMath.Abs(sumResidual / n) <= (AgreementSigmas * spread) + allowance;
        }

        // A change of drift rate bends the curve no more than a new settling with the shortest time constant assumed:
        // |c2 - a_T / 2| <= |c1 - b_T| / (2 tau_min), plus 3 sigma of the fit's own c2 (b_T, a_T the tracker's rate and
        // acceleration). A pass's flank seen for a few seconds bends far more than its slope change over a minute.
        // And the drift rate must have changed: a shift that stays level (a step: metal left near the coil)
        // keeps the tracker's slope and is a target, not lost lock (3 sigma of the fitted slope).
        private static bool PlausibleDrift(QuadraticFit fit, double sigmaHz, double trackerSlopeHzPerSecond, double trackerAccelerationHzPerSecond2)
        {
            double slopeChange = ScalarMath.Abs(fit.Slope - trackerSlopeHzPerSecond);
            // Against the tracked bend, or against none at all: a new straight ramp is always a plausible drift, and the
            // tracked bend may itself be what went wrong.
            double curvatureChange = ScalarMath.Min(ScalarMath.Abs(fit.HalfCurvature - (0.5 * trackerAccelerationHzPerSecond2)), ScalarMath.Abs(fit.HalfCurvature));
            double allowed = (slopeChange / (2.0 * MinDriftSeconds)) + (3.0 * sigmaHz * ScalarMath.Sqrt(fit.CurvatureVarianceFactor));
            return curvatureChange <= allowed && slopeChange > 3.0 * sigmaHz * ScalarMath.Sqrt(fit.SlopeVarianceFactor);
        }

        private bool Smooth(ReadingHistory history, double beforeFrom, double sigmaHz, double thresholdSigma)
        {
            double limit = thresholdSigma * sigmaHz;
            double sumSquares = 0;
            int n = 0;
            for (int i = FirstAtOrAfter(history, beforeFrom); i < history.Count; i++)
            {
                double t = history.TimeAt(i);
                if (history.IsExcluded(i))
                {
                    continue;
                }

                double r = history.ValueAt(i) - all.Evaluate(t);
                if (ScalarMath.Abs(r) >= limit)
                {
                    return false;
                }

                sumSquares += r * r;
                n++;
            }

            return n > 0 && sumSquares / n < 2.0 * sigmaHz * sigmaHz;
        }

        // Fills the kink fit: non-excluded readings of [beforeFrom, middleFrom) early, non-excluded readings from
        // driftFrom late; false when either side has too few.
        private bool FillKink(ReadingHistory history, double beforeFrom, double middleFrom, double driftFrom, double nowSeconds)
        {
            kink.Clear(nowSeconds);
            int early = 0;
            int late = 0;
            for (int i = FirstAtOrAfter(history, beforeFrom); i < history.Count; i++)
            {
                if (history.IsExcluded(i))
                {
                    continue;
                }

                double t = history.TimeAt(i);
                if (t < middleFrom)
                {
                    kink.AddEarly(t, history.ValueAt(i));
                    early++;
                }
                else if (t >= driftFrom)
                {
                    kink.AddLate(t, history.ValueAt(i));
                    late++;
                }
            }

            return early >= MinBeforeReadings && late >= MinAfterReadings;
        }

        // Residuals of the middle readings from a baseline that is `early` before switchSeconds and `late` from then on;
        // the tracker is re-anchored on `late`.
        private void FillPass(ReadingHistory history, double middleFrom, double afterFrom, double sigmaHz, double thresholdSigma, double releaseSigma, QuadraticFit early, QuadraticFit late, double switchSeconds, KinkFit kinkBaseline, int minReadings, ExcursionVerdict into)
        {
            Anchor(late, sigmaHz, into);
            into.PassCount = 0;
            double threshold = thresholdSigma * sigmaHz;
            double release = releaseSigma * sigmaHz;
            open = false;
            for (int i = FirstAtOrAfter(history, middleFrom); i < history.Count; i++)
            {
                double t = history.TimeAt(i);
                if (t > afterFrom || history.IsExcluded(i))
                {
                    continue;
                }

                double baseline = kinkBaseline != null ? kinkBaseline.Evaluate(t) : (t < switchSeconds ? early.Evaluate(t) : late.Evaluate(t));
                double r = history.ValueAt(i) - baseline;
                double size = ScalarMath.Abs(r);
                if (open && size < release && t - segmentEnd > SegmentGapSeconds)
                {
                    CloseSegment(minReadings, into);
                }

                if (!open)
                {
                    if (size < threshold)
                    {
                        continue;
                    }

                    open = true;
                    segmentStart = t;
                    segmentEnd = t;
                    segmentBeyond = 0;
                    largestPositive = 0;
                    largestNegative = 0;
                    segmentPeak = 0;
                }

                if (size >= threshold)
                {
                    segmentBeyond++;

                    // Near a kink the residual's sign is the kink's own error (a kink placed dt off leaves db dt), not the pass's.
                    bool nearKink = kinkBaseline != null && ScalarMath.Abs(t - kinkBaseline.KinkSeconds) <= KinkGuardSeconds;
                    if (!nearKink && r > 0)
                    {
                        largestPositive = ScalarMath.Max(largestPositive, r);
                    }
                    else if (!nearKink)
                    {
                        largestNegative = ScalarMath.Max(largestNegative, -r);
                    }
                }

                if (size >= release)
                {
                    segmentEnd = t;
                }

                if (size > ScalarMath.Abs(segmentPeak))
                {
                    segmentPeak = r;
                    segmentPeakSeconds = t;
                    segmentPeakBaseline = baseline;
                }
            }

            if (open)
            {
                CloseSegment(minReadings, into);
            }

            if (into.PassCount == 0)
            {
                into.Kind = ExcursionVerdict.NoTarget;
                return;
            }

            into.Kind = ExcursionVerdict.Pass;
        }

        // True when no pass of the verdict has readings of both signs at the threshold, and none starts before a time (a
        // pass at the very start of a fitted span is not bounded by baseline before it: more likely a bend the fit missed).
        private static bool PassesClear(ExcursionVerdict verdict, double earliestStartSeconds)
        {
            for (int k = 0; k < verdict.PassCount; k++)
            {
                if (verdict.PassMixedSign[k] || verdict.PassStartSeconds[k] < earliestStartSeconds)
                {
                    return false;
                }
            }

            return true;
        }

        // Drops the passes whose peak lies within KinkGuardSeconds of the kink and is no larger than the kink's timing error
        // can leave (timingErrorHz); true when any pass is left.
        private static bool DropPassesNear(double kinkSeconds, double timingErrorHz, ExcursionVerdict into)
        {
            int kept = 0;
            for (int k = 0; k < into.PassCount; k++)
            {
                if (ScalarMath.Abs(into.PassPeakSeconds[k] - kinkSeconds) <= KinkGuardSeconds && ScalarMath.Abs(into.PassPeakCountedHz[k]) <= timingErrorHz)
                {
                    continue;
                }

                into.PassStartSeconds[kept] = into.PassStartSeconds[k];
                into.PassEndSeconds[kept] = into.PassEndSeconds[k];
                into.PassPeakSeconds[kept] = into.PassPeakSeconds[k];
                into.PassPeakCountedHz[kept] = into.PassPeakCountedHz[k];
                into.PassPeakBaselineHz[kept] = into.PassPeakBaselineHz[k];
                into.PassMixedSign[kept] = into.PassMixedSign[k];
                kept++;
            }

            into.PassCount = kept;
            return kept > 0;
        }

        // One excursion of the middle ends: kept as a pass when it has minReadings beyond the threshold (and there is
        // room). Mixed signs: a reading of each sign beyond the threshold; from a baseline bridged across a gap or a kink
        // (minReadings > 1) the smaller side must also reach half the larger, since such a baseline leaves small
        // excursions of either sign of its own.
        private void CloseSegment(int minReadings, ExcursionVerdict into)
        {
            open = false;
            if (segmentBeyond < minReadings || into.PassCount >= ExcursionVerdict.MaxPasses)
            {
                return;
            }

            int k = into.PassCount;
            into.PassStartSeconds[k] = segmentStart;
            into.PassEndSeconds[k] = segmentEnd;
            into.PassPeakSeconds[k] = segmentPeakSeconds;
            into.PassPeakCountedHz[k] = segmentPeak;
            into.PassPeakBaselineHz[k] = segmentPeakBaseline;
            bool both = largestPositive > 0 && largestNegative > 0;
            into.PassMixedSign[k] = both && (minReadings <= 1 || ScalarMath.Min(largestPositive, largestNegative) >= 0.5 * ScalarMath.Max(largestPositive, largestNegative));
            into.PassCount = k + 1;
        }
    }
}
