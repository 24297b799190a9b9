namespace FreqReadout.Tests.Robustness;

/// <summary>One input that ended in an undocumented exception or ran past the time bound.</summary>
public sealed class FuzzFailure
{
    public FuzzFailure(string operators, int inputSeed, byte[] input, string problem)
    {
        Operators = operators;
        InputSeed = inputSeed;
        Input = input;
        Problem = problem;
    }

    /// <summary>The operators applied, in order (e.g. "BitFlip+Splice").</summary>
    public string Operators { get; }

    /// <summary>The seed of the input's own <see cref="Random"/>: reruns this one input.</summary>
    public int InputSeed { get; }

    /// <summary>The (possibly minimised) failing bytes.</summary>
    public byte[] Input { get; set; }

    /// <summary>The exception or the hang.</summary>
    public string Problem { get; }

    /// <summary>Operators, seed, problem and a short hex excerpt of the input.</summary>
    public override string ToString()
    {
        int n = Math.Min(Input.Length, 48);
        string hex = Convert.ToHexString(Input, 0, n) + (Input.Length > n ? "..." : string.Empty);
        return $"{Operators} seed={InputSeed} length={Input.Length} hex={hex}: {Problem}";
    }
}
