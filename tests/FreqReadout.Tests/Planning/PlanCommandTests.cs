using System.Text.Json;
using FreqReadout.Host.Commands;
using FreqReadout.Tests.Commands;

namespace FreqReadout.Tests.Planning;

/// <summary><c>plan</c> from the command line: bad values name the option and what was expected; verdicts and cautions appear where they apply.</summary>
[Collection(ConsoleCollection.Name)]
public class PlanCommandTests
{
    [Theory]
    [InlineData("--gates-s", "0.1,x", "--gates-s must be a comma-separated list of gate times in [1e-4, 100] s")]
    [InlineData("--gates-s", "0.1,0.3,0.10", "--gates-s names 0.1 s twice")]
    [InlineData("--beat-hz", "200000", "--beat-hz must be in (0, 100000) Hz")]
    [InlineData("--search-prescale", "0", "--search-prescale must be an integer in [1, 65536]")]
    [InlineData("--methods", "sundial", "--methods must list pin-event, pulse-counter, edge-capture or custom")]
    [InlineData("--custom-jitter-us", "3", "the --custom-* options describe the custom method: add custom to --methods")]
    [InlineData("--signal", "ref", "--signal must be search or beat")]
    [InlineData("--speed-m-per-s", "0", "--speed-m-per-s must be in (0, 20] m/s")]
    [InlineData("--turns", "30", "are for the depth answer: give --material too")]
    [InlineData("--radius-mm", "1000", "changes the coil's inductance by more than the model allows")]
    public void A_bad_value_names_its_option_and_what_was_expected(string option, string value, string message)
    {
        string[] args = option is "--speed-m-per-s" or "--radius-mm"
            ? new[] { "plan", "--material", "copper", option, value }
            : new[] { "plan", option, value };
        var (exit, _, error) = ConsoleCapture.Run(args);
        Assert.Equal(ExitCodes.Usage, exit);
        Assert.Contains(message, error);
    }

    [Fact]
    public void Undivided_search_oscillator_into_pin_events_is_over_and_warned()
    {
        // 100 kHz into a method that takes 2000 edges a second (hardware-notes/timestamp-methods.md presets): over at every
        // gate, and the warning names the prescaler that would fit: 100000 / 2000 = 50, the next power of two 64.
        var (exit, stdout, error) = ConsoleCapture.Run("plan", "--methods", "pin-event", "--gates-s", "0.1", "--json");
        Assert.True(exit == 0, error);
        using JsonDocument doc = JsonDocument.Parse(stdout);
        foreach (JsonElement row in doc.RootElement.GetProperty("rows").EnumerateArray())
        {
            Assert.Equal("over", row.GetProperty("verdict").GetString());
            Assert.Contains(row.GetProperty("warnings").EnumerateArray(), w => w.GetString()!.Contains("divide by 64 or more", StringComparison.Ordinal));
        }
    }

    [Fact]
    public void The_depth_answer_prints_the_cautions()
    {
        var (exit, stdout, error) = ConsoleCapture.Run("plan", "--material", "copper", "--radius-mm", "20", "--gates-s", "0.1");
        Assert.True(exit == 0, error);
        Assert.Contains("how deep this target is seen", stdout);
        Assert.Contains("check utility records and local locating services before digging", stdout.Replace("\n", " ", StringComparison.Ordinal));
    }

    [Theory]
    [InlineData("plan --material copper --radius-mm 20 --gates-s 0.1 --json")]
    [InlineData("coil --material copper --radius-mm 12 --json")]
    [InlineData("demo --json --quiet")]
    public void With_json_the_caution_goes_to_stderr(string commandLine)
    {
        // docs/json-output.md: "With --json, standard output holds only JSON; warnings, the caution text and errors go to
        // standard error" (replay --json does so; these printed none before).
        var (exit, stdout, error) = ConsoleCapture.Run(commandLine.Split(' '));
        Assert.True(exit == 0, error);
        using JsonDocument doc = JsonDocument.Parse(stdout.Split('\n', StringSplitOptions.RemoveEmptyEntries).Single());
        Assert.Contains("verify with an approved voltage tester before drilling or cutting", error);
        Assert.DoesNotContain("voltage tester", stdout);
    }

    [Fact]
    public void A_warning_for_several_gates_says_its_figures_are_the_worst_gate_s()
    {
        // Beat note 1000 Hz into pin events: every gate is tight, with the device share falling as the gate grows (the same
        // run's --json rows are the expected values). One warning line covers the gates, so it must say whose figure it shows.
        string[] args = { "plan", "--signal", "beat", "--methods", "pin-event", "--gates-s", "0.03,1" };
        var (exit, text, error) = ConsoleCapture.Run(args);
        Assert.True(exit == 0, error);
        var (_, json, _) = ConsoleCapture.Run(args.Append("--json").ToArray());
        using JsonDocument doc = JsonDocument.Parse(json);
        JsonElement[] rows = doc.RootElement.GetProperty("rows").EnumerateArray().Where(r => r.GetProperty("estimator").GetString() == "reciprocal").ToArray();
        Assert.All(rows, r => Assert.Equal("tight", r.GetProperty("verdict").GetString()));
        JsonElement worst = rows.OrderByDescending(r => r.GetProperty("budget_pct_at_low_rate").GetDouble()).First();
        Assert.Equal(0.03, worst.GetProperty("gate_s").GetDouble());
        static string Flat(string s) => System.Text.RegularExpressions.Regex.Replace(s, @"\s+", " ");
        Assert.Contains(Flat($"gate 0.0300, 1.00 s (figures of the worst, 0.0300 s): {worst.GetProperty("warnings")[0].GetString()}"), Flat(text));
    }
}
