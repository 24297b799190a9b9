namespace FreqReadout.Tests.Robustness;

/// <summary>The named mutation operators of the parser fuzz tests.</summary>
public enum MutationOperator
{
    /// <summary>Flip 1 to 8 random bits.</summary>
    BitFlip,

    /// <summary>Insert 1 to 16 bytes (random, or structural characters of the formats) at a random place.</summary>
    ByteInsertion,

    /// <summary>Delete a run of 1 to 16 bytes.</summary>
    ByteDeletion,

    /// <summary>Copy a chunk of up to 256 bytes to another place (repeated lines, repeated blocks).</summary>
    ChunkDuplication,

    /// <summary>Cut the input at a random length.</summary>
    Truncation,

    /// <summary>Replace a run of digits with 0, -1, 2^63, 2^64, 1e308, NaN, a very long digit string, and similar.</summary>
    BoundaryNumber,

    /// <summary>The head of one seed joined to the tail of another.</summary>
    Splice,
}
