namespace FreqReadout.Tests.DeviceFit;

/// <summary>A straight run of IL instructions entered only at its first and left only after its last, with the offsets it can go to next.</summary>
internal sealed class BasicBlock
{
    public BasicBlock(IReadOnlyList<IlInstruction> instructions, int[] successors)
    {
        Instructions = instructions;
        Successors = successors;
    }

    public int Start => Instructions[0].Offset;

    public IReadOnlyList<IlInstruction> Instructions { get; }

    /// <summary>Start offsets of the blocks control can pass to (none after ret, throw, rethrow, endfinally).</summary>
    public int[] Successors { get; }
}
