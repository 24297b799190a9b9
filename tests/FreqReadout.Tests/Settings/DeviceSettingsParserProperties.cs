using FreqReadout.Counting;
using FreqReadout.Settings;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// The parser never throws and never leaves invalid values, whatever the text: random strings (from the characters
/// the format uses and from any UTF-16 code unit) and valid texts mutated by cutting, inserting, duplicating, swapping
/// and changing characters and lines. Lines a mutation left alone keep their values.
/// </summary>
public sealed class DeviceSettingsParserProperties
{
    private const int MaxMessageChars = 400;

    private static readonly string[] Pieces =
    {
        "\n", "\r\n", "\r", " ", "\t", "=", " = ", "#", "-", ".", "0", "1", "9", "5.5", "-0", "1e3", ",", "\u00e9", "\u0000", "\uffff", "\ud800",
        "# freqreadout settings 1", "# freqreadout settings 2", "# freqreadout settings ", "gate_s", "estimator", "threshold_sigma", "polarity",
        "signal", "beat_side", "search_hz", "tempco_ppm_per_k", "link", "read_rate_hz", "stall_ms", "beat", "above", "below", "none",
        "regression", "capture", "99999999999999999999", "1000000000000000", "0.0000001",
    };

    /// <summary>Runs the parser and checks what must hold for any text; the label says what failed.</summary>
    private static Property Holds(string text, Func<DeviceSettingsValues, bool, string?>? extra = null)
    {
        var values = new DeviceSettingsValues { LinkMode = LinkMode.Capture, ReadRateHz = 123 }; // reset by the read
        var problems = new SettingsProblemList();
        bool applied;
        try
        {
            applied = DeviceSettingsParser.TryParse(text, values, problems);
        }
        catch (Exception e)
        {
            return false.Label("threw " + e.GetType().Name + ": " + e.Message + " on " + Escape(text));
        }

        string? failure = null;
        if (!values.TryValidate(out string? invalid))
        {
            failure = "invalid values: " + invalid;
        }
        else if (!applied && !SettingsTestValues.Same(values, new DeviceSettingsValues()))
        {
            failure = "not applied, yet not the defaults";
        }
        else if (!applied && problems.TotalCount != 1)
        {
            failure = "not applied, with " + problems.TotalCount + " problems";
        }
        else if (problems.Count > problems.Capacity || problems.TotalCount < problems.Count)
        {
            failure = "problem counts";
        }
        else
        {
            int lines = text.Split('\n').Length;
            for (int i = 0; i < problems.Count && failure == null; i++)
            {
                SettingsProblem p = problems.Get(i);
                if (p.LineNumber < 0 || p.LineNumber > lines || p.Message == null || p.Message.Length > MaxMessageChars || p.Key == null
                    || p.Key.Length > SettingsProblemList.MaxKeyChars || p.Key.Any(c => c < ' ' || c > '~'))
                {
                    failure = $"bad problem {p.LineNumber}:{p.Key}: {p.Message}";
                }
            }
        }

        failure ??= extra?.Invoke(values, applied);
        return (failure == null).Label((failure ?? string.Empty) + " on " + Escape(text));
    }

    private static string Escape(string s) => "\"" + string.Concat(s.Select(c => c >= ' ' && c <= '~' ? c.ToString() : $"\\u{(int)c:x4}")) + "\"";

    private static Gen<string> PieceText() =>
        Gen.Choose(0, 60).SelectMany(n => Gen.ArrayOf(Gen.Elements(Pieces), n)).Select(string.Concat);

    [Property(MaxTest = 3000)]
    public Property Any_text_of_the_formats_pieces_is_read_without_throwing() =>
        Prop.ForAll(PieceText().ToArbitrary(), text => Holds(text));

    [Property(MaxTest = 1000)]
    public Property Any_string_is_read_without_throwing() =>
        Prop.ForAll(ArbMap.Default.ArbFor<string>(), text => Holds(text ?? string.Empty));

    [Property(MaxTest = 1000)]
    public Property Any_string_after_the_magic_line_is_read_without_throwing() =>
        Prop.ForAll(ArbMap.Default.ArbFor<string>(), text => Holds(SettingsKeys.MagicLine + "\n" + text));

    /// <summary>One change to a text, by position fractions so it applies to any length.</summary>
    public sealed record Mutation(int Kind, double At, double To, string Piece)
    {
        public string Apply(string text)
        {
            int a = (int)(At * text.Length);
            int b = (int)(To * text.Length);
            int lo = Math.Min(a, b);
            int hi = Math.Max(a, b);
            string[] lines = text.Split('\n');
            int la = (int)(At * lines.Length) % lines.Length;
            int lb = (int)(To * lines.Length) % lines.Length;
            switch (Kind)
            {
                case 0: return text.Remove(lo, Math.Min(hi - lo, 12));                               // cut a few characters
                case 1: return text.Insert(a, Piece);                                                // insert a piece
                case 2: return a < text.Length ? text.Remove(a, 1).Insert(a, Piece[..1]) : text;    // change one character
                case 3: return text[..a];                                                            // truncate
                case 4: { var l = lines.ToList(); l.Insert(lb, lines[la]); return string.Join("\n", l); } // duplicate a line
                case 5: { (lines[la], lines[lb]) = (lines[lb], lines[la]); return string.Join("\n", lines); } // swap two lines
                case 6: return string.Join("\n", lines.Where((_, i) => i != la));                    // drop a line
                default: return text.Replace("\n", "\r\n");                                          // CRLF
            }
        }
    }

    private static Gen<Mutation> MutationGen() =>
        from kind in Gen.Choose(0, 7)
        from at in Gen.Choose(0, 1000)
        from to in Gen.Choose(0, 1000)
        from piece in Gen.Elements(Pieces)
        select new Mutation(kind, at / 1001.0, to / 1001.0, piece.Length == 0 ? "x" : piece);

    /// <summary>A line without the one CR of a CRLF (a second CR is part of the line, as for the parser).</summary>
    private static string WithoutCr(string line) => line.EndsWith('\r') ? line[..^1] : line;

    /// <summary>The key of a line as the parser sees it (null for blank, comment or no '=').</summary>
    private static string? KeyOf(string line)
    {
        string t = WithoutCr(line).Trim(' ', '\t');
        int eq = t.IndexOf('=');
        return t.Length == 0 || t[0] == '#' || eq < 0 ? null : t[..eq].Trim(' ', '\t');
    }

    [Property(MaxTest = 3000)]
    public Property Mutated_valid_texts_are_read_and_lines_left_alone_keep_their_values() =>
        Prop.ForAll(
            (from v in SettingsTestValues.Valid()
             from n in Gen.Choose(1, 4)
             from ms in Gen.ArrayOf(MutationGen(), n)
             select (v, ms)).ToArbitrary(),
            c =>
            {
                Assert.True(DeviceSettingsFormatter.TryFormat(c.v, out string? original, out _));
                string text = c.ms.Aggregate(original!, (t, m) => m.Apply(t));
                string[] originalLines = original!.Split('\n');
                string[] lines = text.Split('\n');
                return Holds(text, (parsed, applied) =>
                {
                    if (!applied)
                    {
                        return null;
                    }

                    for (int k = 0; k < SettingsKeys.Count; k++)
                    {
                        string key = SettingsKeys.KeyAt(k);
                        if (key == SettingsKeys.Signal || key == SettingsKeys.TempcoPpmPerK)
                        {
                            continue; // the rules between keys may set these back when another line was damaged
                        }

                        string[] withKey = lines.Where(l => KeyOf(l) == key).ToArray();
                        if (withKey.Length == 1 && WithoutCr(withKey[0]) == originalLines[k + 1]
                            && DeviceSettingsFormatter.ValueText(parsed, k) != DeviceSettingsFormatter.ValueText(c.v, k))
                        {
                            return key + " was left alone but read as " + DeviceSettingsFormatter.ValueText(parsed, k);
                        }
                    }

                    return null;
                });
            });
}
