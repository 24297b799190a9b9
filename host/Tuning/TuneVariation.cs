using System.Globalization;
using FreqReadout.Counting;
using FreqReadout.Readout;

namespace FreqReadout.Host.Tuning;

/// <summary>
/// One setting varied over a range, <c>KEY=FROM:TO:STEP</c> (<c>tune --vary</c>): the key is a readout or counting
/// setting by its settings-file or option name (<see cref="Keys"/>); values FROM, FROM + STEP, ... up to TO (inclusive
/// within a millionth of a step), at most <see cref="MaxValues"/>.
/// </summary>
public sealed class TuneVariation
{
    /// <summary>Most values one variation may have.</summary>
    public const int MaxValues = 200;

    /// <summary>The settings that can be varied.</summary>
    public static IReadOnlyList<string> Keys { get; } =
        new[] { "threshold_sigma", "hysteresis_sigma", "min_duration_s", "release_s", "persistent_shift_s", "unclear_band_sigma", "lock_check_s", "gate_s" };

    private TuneVariation(string key, IReadOnlyList<double> values)
    {
        Key = key;
        Values = values;
    }

    /// <summary>The setting varied.</summary>
    public string Key { get; }

    /// <summary>Its values, in order.</summary>
    public IReadOnlyList<double> Values { get; }

    /// <summary>Parses <c>KEY=FROM:TO:STEP</c>; false with a message naming what is wrong.</summary>
    public static bool TryParse(string text, out TuneVariation? variation, out string? error)
    {
        variation = null;
        int eq = text.IndexOf('=');
        string key = eq > 0 ? text[..eq].Trim() : string.Empty;
        if (!Keys.Contains(key))
        {
            error = $"--vary must be KEY=FROM:TO:STEP with KEY one of {string.Join(", ", Keys)}; got {Commands.OptionValues.Quote(text)}";
            return false;
        }

        string[] parts = text[(eq + 1)..].Split(':');
        double[] numbers = new double[3];
        if (parts.Length != 3 || !parts.Select((p, i) => Commands.OptionValues.TryNumber(p.Trim(), out numbers[i])).All(ok => ok))
        {
            error = $"--vary {key}: the range must be FROM:TO:STEP (three numbers), got {Commands.OptionValues.Quote(text[(eq + 1)..])}";
            return false;
        }

        (double from, double to, double step) = (numbers[0], numbers[1], numbers[2]);
        if (!(step > 0) || !(to >= from))
        {
            error = $"--vary {key}: STEP must be > 0 and TO >= FROM, got {Commands.OptionValues.Quote(text[(eq + 1)..])}";
            return false;
        }

        double count = Math.Floor(((to - from) / step) + 1e-6) + 1;
        if (count > MaxValues)
        {
            error = $"--vary {key}: {count.ToString("0", CultureInfo.InvariantCulture)} values; at most {MaxValues}";
            return false;
        }

        var values = new List<double>();
        for (int i = 0; i < (int)count; i++)
        {
            values.Add(Math.Round(from + (i * step), 9));
        }

        variation = new TuneVariation(key, values);
        error = null;
        return true;
    }

    /// <summary>Sets the key to <paramref name="value"/> in the settings objects.</summary>
    public void Apply(double value, CounterSettings counter, ReadoutSettings readout)
    {
        switch (Key)
        {
            case "threshold_sigma": readout.ThresholdSigma = value; break;
            case "hysteresis_sigma": readout.HysteresisSigma = value; break;
            case "min_duration_s": readout.MinDurationSeconds = value; break;
            case "release_s": readout.ReleaseSeconds = value; break;
            case "persistent_shift_s": readout.PersistentShiftSeconds = value; break;
            case "unclear_band_sigma": readout.UnclearBandSigma = value; break;
            case "lock_check_s": readout.LockCheckSeconds = value; break;
            case "gate_s": counter.GateSeconds = value; break;
            default: throw new InvalidOperationException("unknown key " + Key);
        }
    }
}
