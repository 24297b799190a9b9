using System.Text;

namespace FreqReadout.Tests.Robustness;

/// <summary>The fuzz harness itself: it catches an undocumented exception and a hang, reproduces an input from its seed, and minimises.</summary>
public sealed class FuzzRunnerTests
{
    private static readonly byte[] Seed = Encoding.ASCII.GetBytes("# a = 12\nvalue,12345\nother,7\n");

    /// <summary>A toy parser: FormatException (its documented error) for lines without a comma, a crash on a run of five 9s.</summary>
    private static ParserTarget Toy(Action<byte[]>? extra = null) => new("toy", new[] { Seed }, typeof(FormatException), bytes =>
    {
        extra?.Invoke(bytes);
        string text = Encoding.ASCII.GetString(bytes);
        if (text.Contains("99999", StringComparison.Ordinal))
        {
            throw new IndexOutOfRangeException("toy crash");
        }

        if (text.Split('\n').Any(line => line.Length > 0 && !line.StartsWith('#') && !line.Contains(',')))
        {
            throw new FormatException("a line without a comma");
        }
    });

    [Fact]
    public void An_undocumented_exception_is_a_failure_that_reproduces_from_its_seed_and_minimises()
    {
        var runner = new FuzzRunner(Toy()) { MaxFailures = 3 };
        runner.Run(7, 5000);
        Assert.NotEmpty(runner.Failures);
        var failure = runner.Failures[0];
        Assert.Contains("IndexOutOfRangeException", failure.Problem);
        Assert.Contains("seed=" + failure.InputSeed, failure.ToString());
        Assert.Contains("hex=", failure.ToString());
        Assert.Equal(failure.Input, new FuzzRunner(Toy()).Build(failure.InputSeed, out string ops));
        Assert.Equal(failure.Operators, ops);
        Assert.Equal("99999", Encoding.ASCII.GetString(runner.Minimise(failure.Input, failure.Problem)));
        Assert.True(runner.DocumentedErrors > 0 && runner.Results > 0);
    }

    [Fact]
    public void An_input_that_does_not_finish_is_reported_as_a_hang()
    {
        var release = new ManualResetEventSlim(false);
        var runner = new FuzzRunner(Toy(bytes =>
        {
            if (bytes.Length % 5 == 0)
            {
                release.Wait();
            }
        }));
        try
        {
            runner.Run(11, 1000);
        }
        finally
        {
            release.Set();
        }

        var failure = Assert.Single(runner.Failures);
        Assert.Contains("a hang", failure.Problem);
        Assert.Equal(0, failure.Input.Length % 5);
    }
}
