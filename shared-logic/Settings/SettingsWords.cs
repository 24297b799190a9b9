using FreqReadout.Counting;
using FreqReadout.Detection;

namespace FreqReadout.Settings
{
    /// <summary>
    /// The words of the settings text for the enumerated settings, lower case, exact (case-sensitive) on reading.
    /// Each Word method returns null for a value that has no word (one the settings do not allow).
    /// </summary>
    public static class SettingsWords
    {
        /// <summary>The words estimator takes.</summary>
        public const string EstimatorWords = "reciprocal or regression";

        /// <summary>The words polarity takes.</summary>
        public const string PolarityWords = "normal or inverted";

        /// <summary>The words signal takes.</summary>
        public const string SignalWords = "search or beat";

        /// <summary>The words beat_side takes.</summary>
        public const string BeatSideWords = "none, above or below";

        /// <summary>The words link takes.</summary>
        public const string LinkModeWords = "off, readings or capture";

        /// <summary>reciprocal, regression; null otherwise.</summary>
        public static string EstimatorWord(EstimatorKind value)
        {
            return value == EstimatorKind.Reciprocal ? "reciprocal" : value == EstimatorKind.Regression ? "regression" : null;
        }

        /// <summary>Reads reciprocal or regression.</summary>
        public static bool TryReadEstimator(string word, out EstimatorKind value)
        {
            value = EstimatorKind.Regression;
            if (word == "reciprocal")
            {
                value = EstimatorKind.Reciprocal;
                return true;
            }

            return word == "regression";
        }

        /// <summary>normal, inverted; null otherwise.</summary>
        public static string PolarityWord(Polarity value)
        {
            return value == Polarity.Normal ? "normal" : value == Polarity.Inverted ? "inverted" : null;
        }

        /// <summary>Reads normal or inverted.</summary>
        public static bool TryReadPolarity(string word, out Polarity value)
        {
            value = Polarity.Normal;
            if (word == "inverted")
            {
                value = Polarity.Inverted;
                return true;
            }

            return word == "normal";
        }

        /// <summary>search, beat; null otherwise.</summary>
        public static string SignalWord(SignalKind value)
        {
            return value == SignalKind.Search ? "search" : value == SignalKind.Beat ? "beat" : null;
        }

        /// <summary>Reads search or beat.</summary>
        public static bool TryReadSignal(string word, out SignalKind value)
        {
            value = SignalKind.Search;
            if (word == "beat")
            {
                value = SignalKind.Beat;
                return true;
            }

            return word == "search";
        }

        /// <summary>none, above, below; null otherwise.</summary>
        public static string BeatSideWord(BeatSide value)
        {
            return value == BeatSide.None ? "none" : value == BeatSide.Above ? "above" : value == BeatSide.Below ? "below" : null;
        }

        /// <summary>Reads none, above or below.</summary>
        public static bool TryReadBeatSide(string word, out BeatSide value)
        {
            value = BeatSide.None;
            if (word == "above")
            {
                value = BeatSide.Above;
                return true;
            }

            if (word == "below")
            {
                value = BeatSide.Below;
                return true;
            }

            return word == "none";
        }

        /// <summary>off, readings, capture; null otherwise.</summary>
        public static string LinkModeWord(LinkMode value)
        {
            return value == LinkMode.Off ? "off" : value == LinkMode.Readings ? "readings" : value == LinkMode.Capture ? "capture" : null;
        }

        /// <summary>Reads off, readings or capture.</summary>
        public static bool TryReadLinkMode(string word, out LinkMode value)
        {
            value = LinkMode.Off;
            if (word == "readings")
            {
                value = LinkMode.Readings;
                return true;
            }

            if (word == "capture")
            {
                value = LinkMode.Capture;
                return true;
            }

            return word == "off";
        }
    }
}
