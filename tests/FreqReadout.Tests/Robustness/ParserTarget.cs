namespace FreqReadout.Tests.Robustness;

/// <summary>
/// A parser under fuzz: its folder name under Data/fuzz-regressions, the seed inputs, the exception
/// type its documentation promises for malformed input, and a run that parses one input fully
/// (every row up to the row cap, the trailer and the warnings).
/// </summary>
public sealed class ParserTarget
{
    public ParserTarget(string name, IReadOnlyList<byte[]> seeds, Type documentedError, Action<byte[]> parse)
    {
        Name = name;
        Seeds = seeds;
        DocumentedError = documentedError;
        Parse = parse;
    }

    /// <summary>Short name, also the regression folder (text, binary, scene).</summary>
    public string Name { get; }

    /// <summary>Valid and invalid example inputs the mutations start from.</summary>
    public IReadOnlyList<byte[]> Seeds { get; }

    /// <summary>The only exception malformed input may raise.</summary>
    public Type DocumentedError { get; }

    /// <summary>True for the binary capture: most mutants are made inside one block and framed again with a correct CRC.</summary>
    public bool BlockAware { get; init; }

    /// <summary>Parses one input to the end; throws what the parser throws.</summary>
    public Action<byte[]> Parse { get; }
}
