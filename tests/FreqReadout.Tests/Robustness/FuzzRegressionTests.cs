using System.Diagnostics;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Replays every input kept under Data/fuzz-regressions/&lt;parser&gt;/ (inputs that once made a parser
/// throw an undocumented exception, or kept as hard cases): each must now end in a result or the
/// documented format error, within the hang bound.
/// </summary>
public sealed class FuzzRegressionTests
{
    public static TheoryData<string, string> Inputs()
    {
        var data = new TheoryData<string, string>();
        foreach (string parser in new[] { "text", "binary", "scene" })
        {
            string folder = FuzzRegressionFiles.OutputFolder(parser);
            if (Directory.Exists(folder))
            {
                foreach (string file in Directory.GetFiles(folder).OrderBy(f => f, StringComparer.Ordinal))
                {
                    data.Add(parser, Path.GetFileName(file));
                }
            }
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Inputs))]
    public void Kept_input_ends_in_a_result_or_the_documented_error(string parser, string file)
    {
        byte[] input = File.ReadAllBytes(Path.Combine(FuzzRegressionFiles.OutputFolder(parser), file));
        var runner = new FuzzRunner(ParserTargets.ByName(parser));
        long t0 = Stopwatch.GetTimestamp();
        string? problem = runner.Check(input);
        Assert.Null(problem);
        Assert.True(Stopwatch.GetElapsedTime(t0) < FuzzRunner.HangBound, "within the hang bound");
    }

    [Fact]
    public void Every_parser_has_kept_inputs()
    {
        var parsers = Inputs().Select(row => (string)row[0]).Distinct().ToList();
        Assert.Equal(new[] { "binary", "scene", "text" }, parsers.OrderBy(p => p, StringComparer.Ordinal));
    }
}
