namespace FreqReadout.Detection
{
    /// <summary>
    /// The sign rule and the beat-side conversion (README.md, "The sign rule and its limit"): a non-ferrous conductor
    /// lowers L so the search frequency rises; a ferrous object raises L so it falls (at low
    /// frequency; above the part's crossover it reads non-ferrous). A heuristic, hence the unclear band
    /// and the polarity setting.
    /// </summary>
    public static class SignRule
    {
        /// <summary>
        /// Search-oscillator shift per counted shift: +1 for the search signal and for beat side above
        /// (beat = f_search - f_ref), -1 for beat side below (beat = f_ref - f_search).
        /// </summary>
        public static double SearchSignPerCounted(FreqReadout.Counting.SignalKind signal, FreqReadout.Counting.BeatSide side)
        {
            if (signal == FreqReadout.Counting.SignalKind.Beat && side == FreqReadout.Counting.BeatSide.Below)
            {
                return -1.0;
            }

            return 1.0;
        }

        /// <summary>
        /// Class of a peak: Unclear when forcedUnclear (mixed sign, beat below floor) or when
        /// |peak| / sigma &lt; thresholdSigma + unclearBandSigma; otherwise the sign of
        /// polarity x peakShiftHz: positive -> NonFerrous, negative -> Ferrous.
        /// </summary>
        /// <param name="peakShiftHz">Search-oscillator peak shift (beat side applied), Hz.</param>
        /// <param name="peakSigma">|peak| in noise sigmas.</param>
        /// <param name="thresholdSigma">Detection threshold, sigmas.</param>
        /// <param name="unclearBandSigma">Width of the unclear band above the threshold, sigmas.</param>
        /// <param name="polarity">Normal or inverted.</param>
        /// <param name="forcedUnclear">True when something else makes the sign untrustworthy.</param>
        public static TargetClass Classify(double peakShiftHz, double peakSigma, double thresholdSigma, double unclearBandSigma, Polarity polarity, bool forcedUnclear)
        {
            if (forcedUnclear || peakSigma < thresholdSigma + unclearBandSigma || peakShiftHz == 0)
            {
                return TargetClass.Unclear;
            }

            bool rise = peakShiftHz > 0;
            if (polarity == Polarity.Inverted)
            {
                rise = !rise;
            }

            return rise ? TargetClass.NonFerrous : TargetClass.Ferrous;
        }
    }
}
