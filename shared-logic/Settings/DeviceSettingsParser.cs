using FreqReadout.Counting;

namespace FreqReadout.Settings
{
    /// <summary>
    /// Reads a settings text (docs/settings-format.md) into <see cref="DeviceSettingsValues"/>. Never throws, whatever
    /// the text: every problem is reported with its line, key and what is allowed, and the setting concerned keeps its
    /// default. The first non-blank line must be <see cref="SettingsKeys.MagicLine"/>; a missing magic line or another
    /// version applies nothing. Then "key = value" lines (spaces and tabs around key and value are ignored), comment
    /// lines whose first non-blank character is '#', and blank lines; lines end at LF, a CR before the LF is dropped.
    /// Unknown keys are reported and ignored; of a key given twice the first line counts and the later ones are reported
    /// and ignored (also when the first had a bad value). Keys left out keep their defaults. Cost O(text length).
    /// </summary>
    public static class DeviceSettingsParser
    {
        /// <summary>Longest excerpt of a bad value quoted in a problem, characters.</summary>
        public const int MaxQuotedChars = 24;

        /// <summary>
        /// Reads <paramref name="text"/>: <paramref name="values"/> is first set to its defaults, then every valid setting
        /// of the text is written into it; <paramref name="problems"/> is cleared, then gets every problem found.
        /// After the lines, the rules between keys are applied: signal = beat without beat_side above or below is
        /// reported and signal falls back to its default (search); a non-zero tempco_ppm_per_k that beat mode cannot
        /// use (search_hz = 0) is reported and falls back to 0. The values are then always valid.
        /// </summary>
        /// <param name="text">The settings text (null reads as no text).</param>
        /// <param name="values">Filled in; left at its defaults when nothing is applied.</param>
        /// <param name="problems">Filled in; may be null when the caller does not want them.</param>
        /// <returns>True when the text has the magic line of this version (its valid settings were applied); false when nothing was applied.</returns>
        public static bool TryParse(string text, DeviceSettingsValues values, SettingsProblemList problems)
        {
            if (problems == null)
            {
                problems = new SettingsProblemList(1);
            }

            problems.Clear();
            if (values == null)
            {
                problems.Add(0, string.Empty, "no settings values to fill in");
                return false;
            }

            values.ResetToDefaults();
            if (text == null)
            {
                problems.Add(0, string.Empty, "no settings text; the first line must be '" + SettingsKeys.MagicLine + "'; defaults used");
                return false;
            }

            DeviceSettingsValues parsed = new DeviceSettingsValues();
            int[] lineOfKey = new int[SettingsKeys.Count];
            bool magicSeen = false;
            int lineNumber = 0;
            int pos = 0;
            while (pos <= text.Length)
            {
                // Own scans rather than string.IndexOf: its start-index checks differ between nanoFramework and .NET.
                int end = pos;
                while (end < text.Length && text[end] != '\n')
                {
                    end++;
                }

                lineNumber++;
                int start = pos;
                int stop = end;
                pos = end + 1;
                if (stop > start && text[stop - 1] == '\r')
                {
                    stop--;
                }

                while (start < stop && IsBlank(text[start]))
                {
                    start++;
                }

                while (stop > start && IsBlank(text[stop - 1]))
                {
                    stop--;
                }

                if (start == stop)
                {
                    continue;
                }

                if (!magicSeen)
                {
                    if (!IsMagicLine(text, start, stop, lineNumber, problems))
                    {
                        return false;
                    }

                    magicSeen = true;
                    continue;
                }

                if (text[start] == '#')
                {
                    continue;
                }

                int equals = start;
                while (equals < stop && text[equals] != '=')
                {
                    equals++;
                }

                if (equals == stop)
                {
                    problems.Add(lineNumber, string.Empty, "expected 'key = value', a comment starting with '#' or a blank line, got " + Quote(text.Substring(start, stop - start)) + " (ignored)");
                    continue;
                }

                string key = Trimmed(text, start, equals);
                string valueText = Trimmed(text, equals + 1, stop);
                int index = SettingsKeys.IndexOf(key);
                if (index < 0)
                {
                    problems.Add(lineNumber, key, "unknown key (ignored)");
                    continue;
                }

                if (lineOfKey[index] != 0)
                {
                    problems.Add(lineNumber, key, "given again (line " + SettingsDecimal.FormatScaled(lineOfKey[index], 0) + " counts; this line is ignored)");
                    continue;
                }

                lineOfKey[index] = lineNumber;
                string message;
                if (!TrySetValue(parsed, index, valueText, out message))
                {
                    problems.Add(lineNumber, key, message + "; the default stays");
                }
            }

            if (!magicSeen)
            {
                problems.Add(0, string.Empty, "empty text; the first line must be '" + SettingsKeys.MagicLine + "'; defaults used");
                return false;
            }

            ApplyRulesBetweenKeys(parsed, lineOfKey, problems);
            values.CopyFrom(parsed);
            return true;
        }

        /// <summary>
        /// Reads one value for the key at <paramref name="keyIndex"/> (<see cref="SettingsKeys.KeyAt"/>) and, when it is
        /// valid on its own, writes it into <paramref name="values"/>; otherwise leaves them unchanged.
        /// </summary>
        /// <param name="values">Where the value goes.</param>
        /// <param name="keyIndex">The key.</param>
        /// <param name="valueText">The value, trimmed.</param>
        /// <param name="message">What is wrong and what is allowed; null on success.</param>
        /// <returns>True when the value was valid and written.</returns>
        public static bool TrySetValue(DeviceSettingsValues values, int keyIndex, string valueText, out string message)
        {
            double number;
            int integer;
            switch (keyIndex)
            {
                case 0:
                    if (!TryReadDecimal(valueText, DeviceSettingsValues.GateSecondsDecimals, out number, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckGateSeconds(number, out message), ref message))
                    {
                        return false;
                    }

                    values.GateSeconds = number;
                    return true;
                case 1:
                    EstimatorKind estimator;
                    if (!SettingsWords.TryReadEstimator(valueText, out estimator))
                    {
                        message = NotAWord(valueText, SettingsWords.EstimatorWords);
                        return false;
                    }

                    values.Estimator = estimator;
                    break;
                case 2:
                    if (!TryReadDecimal(valueText, DeviceSettingsValues.ThresholdSigmaDecimals, out number, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckThresholdSigma(number, out message), ref message))
                    {
                        return false;
                    }

                    values.ThresholdSigma = number;
                    return true;
                case 3:
                    Detection.Polarity polarity;
                    if (!SettingsWords.TryReadPolarity(valueText, out polarity))
                    {
                        message = NotAWord(valueText, SettingsWords.PolarityWords);
                        return false;
                    }

                    values.Polarity = polarity;
                    break;
                case 4:
                    SignalKind signal;
                    if (!SettingsWords.TryReadSignal(valueText, out signal))
                    {
                        message = NotAWord(valueText, SettingsWords.SignalWords);
                        return false;
                    }

                    values.Signal = signal;
                    break;
                case 5:
                    BeatSide side;
                    if (!SettingsWords.TryReadBeatSide(valueText, out side))
                    {
                        message = NotAWord(valueText, SettingsWords.BeatSideWords);
                        return false;
                    }

                    values.BeatSide = side;
                    break;
                case 6:
                    if (!TryReadDecimal(valueText, DeviceSettingsValues.SearchHzDecimals, out number, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckSearchHz(number, out message), ref message))
                    {
                        return false;
                    }

                    values.SearchHz = number;
                    return true;
                case 7:
                    if (!TryReadDecimal(valueText, DeviceSettingsValues.TempcoPpmPerKDecimals, out number, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckTempcoPpmPerK(number, out message), ref message))
                    {
                        return false;
                    }

                    values.TempcoPpmPerK = number;
                    return true;
                case 8:
                    LinkMode link;
                    if (!SettingsWords.TryReadLinkMode(valueText, out link))
                    {
                        message = NotAWord(valueText, SettingsWords.LinkModeWords);
                        return false;
                    }

                    values.LinkMode = link;
                    break;
                case 9:
                    if (!TryReadInteger(valueText, out integer, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckReadRateHz(integer, out message), ref message))
                    {
                        return false;
                    }

                    values.ReadRateHz = integer;
                    return true;
                case 10:
                    if (!TryReadInteger(valueText, out integer, out message)
                        || !Checked(valueText, DeviceSettingsValues.TryCheckStallLimitMilliseconds(integer, out message), ref message))
                    {
                        return false;
                    }

                    values.StallLimitMilliseconds = integer;
                    return true;
                default:
                    message = "unknown key";
                    return false;
            }

            message = null;
            return true;
        }

        private static void ApplyRulesBetweenKeys(DeviceSettingsValues parsed, int[] lineOfKey, SettingsProblemList problems)
        {
            DeviceSettingsValues defaults = new DeviceSettingsValues();
            if (parsed.Signal == SignalKind.Beat && parsed.BeatSide != BeatSide.Above && parsed.BeatSide != BeatSide.Below)
            {
                int beatSideLine = lineOfKey[SettingsKeys.IndexOf(SettingsKeys.BeatSide)];
                int line = beatSideLine != 0 ? beatSideLine : lineOfKey[SettingsKeys.IndexOf(SettingsKeys.Signal)];
                problems.Add(line, SettingsKeys.BeatSide, "beat_side must be above or below when signal = beat; signal falls back to its default, " + SettingsWords.SignalWord(defaults.Signal));
                parsed.Signal = defaults.Signal;
            }

            string error;
            if (!DeviceSettingsValues.TryCheckBeatRules(parsed.Signal, parsed.BeatSide, parsed.SearchHz, parsed.TempcoPpmPerK, out error))
            {
                problems.Add(lineOfKey[SettingsKeys.IndexOf(SettingsKeys.TempcoPpmPerK)], SettingsKeys.TempcoPpmPerK, error + "; it falls back to its default, " + DeviceSettingsFormatter.ValueText(defaults, SettingsKeys.IndexOf(SettingsKeys.TempcoPpmPerK)));
                parsed.TempcoPpmPerK = defaults.TempcoPpmPerK;
            }
        }

        private static bool IsMagicLine(string text, int start, int stop, int lineNumber, SettingsProblemList problems)
        {
            string line = text.Substring(start, stop - start);
            if (line == SettingsKeys.MagicLine)
            {
                return true;
            }

            string prefix = SettingsKeys.MagicPrefix + " ";
            bool versionOnly = line.Length > prefix.Length && line.Substring(0, prefix.Length) == prefix;
            for (int i = prefix.Length; versionOnly && i < line.Length; i++)
            {
                versionOnly = line[i] >= '0' && line[i] <= '9';
            }

            if (versionOnly)
            {
                problems.Add(lineNumber, string.Empty, "settings version " + Quote(line.Substring(prefix.Length)) + " is unknown (this reader knows " + SettingsDecimal.FormatScaled(SettingsKeys.Version, 0) + "); nothing applied, defaults used");
            }
            else
            {
                problems.Add(lineNumber, string.Empty, "the first line must be '" + SettingsKeys.MagicLine + "', got " + Quote(line) + "; nothing applied, defaults used");
            }

            return false;
        }

        private static bool TryReadDecimal(string valueText, int decimals, out double number, out string message)
        {
            long scaled;
            if (!SettingsDecimal.TryParseScaled(valueText, decimals, out scaled))
            {
                number = 0;
                message = SettingsDecimal.IsWellFormed(valueText)
                    ? Quote(valueText) + " has more than " + SettingsDecimal.FormatScaled(decimals, 0) + " decimal places or more digits than the settings text holds"
                    : Quote(valueText) + " is not a number (digits with an optional leading '-' and one '.')";
                return false;
            }

            number = SettingsDecimal.ToValue(scaled, decimals);
            message = null;
            return true;
        }

        private static bool TryReadInteger(string valueText, out int integer, out string message)
        {
            long scaled;
            if (!SettingsDecimal.TryParseScaled(valueText, 0, out scaled))
            {
                integer = 0;
                message = SettingsDecimal.IsWellFormed(valueText)
                    ? Quote(valueText) + " is not an integer (a fraction must be zeros) or has more digits than the settings text holds"
                    : Quote(valueText) + " is not an integer (digits with an optional leading '-')";
                return false;
            }

            // Beyond the int range is beyond every integer key's range too: clamp so the range check reports it.
            integer = scaled > int.MaxValue ? int.MaxValue : scaled < int.MinValue ? int.MinValue : (int)scaled;
            message = null;
            return true;
        }

        private static bool Checked(string valueText, bool valid, ref string message)
        {
            if (!valid)
            {
                message = Quote(valueText) + ": " + message;
            }

            return valid;
        }

        private static string NotAWord(string valueText, string words)
        {
            return Quote(valueText) + " is not one of " + words;
        }

        private static string Trimmed(string text, int start, int stop)
        {
            while (start < stop && IsBlank(text[start]))
            {
                start++;
            }

            while (stop > start && IsBlank(text[stop - 1]))
            {
                stop--;
            }

            return start == stop ? string.Empty : text.Substring(start, stop - start);
        }

        private static bool IsBlank(char c)
        {
            return c == ' ' || c == '\t';
        }

        /// <summary>The value quoted for a message: at most <see cref="MaxQuotedChars"/> characters, printable ASCII, others as '?', "..." when cut.</summary>
        private static string Quote(string value)
        {
            int n = value.Length < MaxQuotedChars ? value.Length : MaxQuotedChars;
            if (n == 0)
            {
                return "\"\"";
            }

            char[] chars = new char[n];
            for (int i = 0; i < n; i++)
            {
                char c = value[i];
                chars[i] = c >= ' ' && c <= '~' ? c : '?';
            }

            return "\"" + new string(chars, 0, n) + (value.Length > n ? "...\"" : "\"");
        }
    }
}
