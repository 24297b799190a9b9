using System.Text.Json;

namespace FreqReadout.Host.Tuning;

/// <summary>The passes of a simulation's truth file (<c>simulate --truth</c>, docs/json-output.md "truth"): each pass's peak time and the class the sign rule gives its target.</summary>
public sealed class TruthPasses
{
    private TruthPasses(IReadOnlyList<double> peakSeconds, IReadOnlyList<string> signRuleClasses)
    {
        PeakSeconds = peakSeconds;
        SignRuleClasses = signRuleClasses;
    }

    /// <summary>Peak time of each pass, s from the capture's first row.</summary>
    public IReadOnlyList<double> PeakSeconds { get; }

    /// <summary>The sign rule's class of each pass's target: ferrous, non-ferrous or unclear.</summary>
    public IReadOnlyList<string> SignRuleClasses { get; }

    /// <summary>Reads a truth file; false with a message naming the file and the JSON path that is wrong.</summary>
    public static bool TryLoad(string path, out TruthPasses? passes, out string? error)
    {
        passes = null;
        try
        {
            using JsonDocument doc = JsonDocument.Parse(File.ReadAllText(path));
            if (!doc.RootElement.TryGetProperty("targets", out JsonElement targets) || targets.ValueKind != JsonValueKind.Array)
            {
                error = $"{path}: not a truth file: no \"targets\" array (expected what simulate --truth writes)";
                return false;
            }

            var peaks = new List<double>();
            var classes = new List<string>();
            int t = 0;
            foreach (JsonElement target in targets.EnumerateArray())
            {
                if (!target.TryGetProperty("sign_rule_class", out JsonElement cls) || cls.ValueKind != JsonValueKind.String
                    || !target.TryGetProperty("passes", out JsonElement list) || list.ValueKind != JsonValueKind.Array)
                {
                    error = $"{path}: targets[{t}] needs \"sign_rule_class\" (text) and \"passes\" (array)";
                    return false;
                }

                int p = 0;
                foreach (JsonElement pass in list.EnumerateArray())
                {
                    if (!pass.TryGetProperty("peak_time_s", out JsonElement peak) || peak.ValueKind != JsonValueKind.Number)
                    {
                        error = $"{path}: targets[{t}].passes[{p}].peak_time_s must be a number";
                        return false;
                    }

                    peaks.Add(peak.GetDouble());
                    classes.Add(cls.GetString()!);
                    p++;
                }

                t++;
            }

            passes = new TruthPasses(peaks, classes);
            error = null;
            return true;
        }
        catch (JsonException e)
        {
            error = $"{path}: not JSON: {e.Message}";
            return false;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            error = $"{path}: {Commands.FileErrorText.Reason(path, e)}";
            return false;
        }
    }
}
