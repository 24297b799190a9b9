namespace FreqReadout.Settings
{
    /// <summary>
    /// Writes <see cref="DeviceSettingsValues"/> as a settings text (docs/settings-format.md): the magic line
    /// <see cref="SettingsKeys.MagicLine"/>, then every key once in <see cref="SettingsKeys"/> order as "key=value",
    /// each line ended by LF, no comments, numbers by <see cref="SettingsDecimal.FormatScaled"/> (the same on every
    /// platform and culture). The text is ASCII and at most <see cref="SettingsKeys.MaxTextBytes"/> bytes, and
    /// <see cref="DeviceSettingsParser"/> reads it back to the same values with no problem.
    /// </summary>
    public static class DeviceSettingsFormatter
    {
        /// <summary>Writes the settings text of valid values.</summary>
        /// <param name="values">The values; they must pass <see cref="DeviceSettingsValues.TryValidate"/>.</param>
        /// <param name="text">The settings text; null when the values are not valid.</param>
        /// <param name="error">The first invalid value with what is allowed; null on success.</param>
        /// <returns>True when the text was written.</returns>
        public static bool TryFormat(DeviceSettingsValues values, out string text, out string error)
        {
            text = null;
            if (values == null)
            {
                error = "no settings values";
                return false;
            }

            if (!values.TryValidate(out error))
            {
                return false;
            }

            string result = SettingsKeys.MagicLine + "\n";
            for (int i = 0; i < SettingsKeys.Count; i++)
            {
                result = result + SettingsKeys.KeyAt(i) + "=" + ValueText(values, i) + "\n";
            }

            text = result;
            return true;
        }

        /// <summary>
        /// The text of the value of the key at <paramref name="keyIndex"/> (<see cref="SettingsKeys.KeyAt"/>): a word, an
        /// integer, or a decimal rounded to the key's places (halves away from zero; exact for valid values); null for a
        /// bad index, a value with no word or a number beyond <see cref="SettingsDecimal.MaxScaled"/> steps.
        /// </summary>
        public static string ValueText(DeviceSettingsValues values, int keyIndex)
        {
            switch (keyIndex)
            {
                case 0: return Decimal(values.GateSeconds, DeviceSettingsValues.GateSecondsDecimals);
                case 1: return SettingsWords.EstimatorWord(values.Estimator);
                case 2: return Decimal(values.ThresholdSigma, DeviceSettingsValues.ThresholdSigmaDecimals);
                case 3: return SettingsWords.PolarityWord(values.Polarity);
                case 4: return SettingsWords.SignalWord(values.Signal);
                case 5: return SettingsWords.BeatSideWord(values.BeatSide);
                case 6: return Decimal(values.SearchHz, DeviceSettingsValues.SearchHzDecimals);
                case 7: return Decimal(values.TempcoPpmPerK, DeviceSettingsValues.TempcoPpmPerKDecimals);
                case 8: return SettingsWords.LinkModeWord(values.LinkMode);
                case 9: return SettingsDecimal.FormatScaled(values.ReadRateHz, 0);
                case 10: return SettingsDecimal.FormatScaled(values.StallLimitMilliseconds, 0);
                default: return null;
            }
        }

        private static string Decimal(double value, int decimals)
        {
            long m;
            return SettingsDecimal.TryToScaled(value, decimals, out m) ? SettingsDecimal.FormatScaled(m, decimals) : null;
        }
    }
}
