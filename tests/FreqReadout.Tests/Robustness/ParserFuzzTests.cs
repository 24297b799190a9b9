using System.Diagnostics;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Mutation fuzzing of every parser: 100 000 mutated inputs each (fixed seeds), every one ending in a
/// result or the documented format error, none running past the hang bound. A failing input is
/// minimised a little and saved under Data/fuzz-regressions/&lt;parser&gt;/, where
/// <see cref="FuzzRegressionTests"/> replays it from then on.
/// </summary>
public sealed class ParserFuzzTests
{
    /// <summary>Mutated inputs per parser per run.</summary>
    public const int InputsPerParser = 100_000;

    private readonly ITestOutputHelper _output;

    public ParserFuzzTests(ITestOutputHelper output)
    {
        _output = output;
    }

    [Fact]
    public void Text_capture_reader_survives_mutated_input() => Fuzz(ParserTargets.Text(), 20261201);

    [Fact]
    public void Binary_capture_reader_survives_mutated_input() => Fuzz(ParserTargets.Binary(), 20261202);

    [Fact]
    public void Scene_parser_survives_mutated_input() => Fuzz(ParserTargets.Scene(), 20261203);

    private void Fuzz(ParserTarget target, int baseSeed)
    {
        Assert.NotEmpty(target.Seeds);
        foreach (var seed in target.Seeds)
        {
            // The seeds themselves: a result or the documented error, like every mutant.
            Assert.Null(new FuzzRunner(target).Check(seed));
        }

        var runner = new FuzzRunner(target);
        var clock = Stopwatch.StartNew();
        runner.Run(baseSeed, InputsPerParser);
        clock.Stop();
        int parsed = runner.Results + runner.DocumentedErrors;
        _output.WriteLine($"{target.Name}: {parsed} inputs ({runner.Results} results, {runner.DocumentedErrors} {target.DocumentedError.Name}) in {clock.Elapsed.TotalSeconds:F1} s, base seed {baseSeed}");
        _output.WriteLine("operators: " + string.Join(", ", runner.OperatorCounts.Select(kv => $"{kv.Key} {kv.Value}")));

        var lines = new List<string>();
        foreach (var failure in runner.Failures)
        {
            if (!failure.Problem.Contains("hang", StringComparison.Ordinal) && !failure.Problem.StartsWith("took", StringComparison.Ordinal))
            {
                failure.Input = runner.Minimise(failure.Input, failure.Problem);
            }

            string? saved = FuzzRegressionFiles.Save(target.Name, failure);
            lines.Add($"{failure} (saved to {saved ?? "nowhere: no source tree"})");
        }

        Assert.True(runner.Failures.Count == 0, $"{target.Name}: {runner.Failures.Count} failing inputs (base seed {baseSeed}):\n" + string.Join("\n", lines));
        Assert.Equal(InputsPerParser, parsed);
        Assert.All(runner.OperatorCounts.Values, n => Assert.True(n > InputsPerParser / 20, "every operator is used"));
        Assert.True(runner.Results > 0 && runner.DocumentedErrors > 0, "the mutants reach both outcomes");
    }
}
