using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>A method's decoded IL, its basic blocks and its loops, with the nesting of the loops.</summary>
internal sealed class MethodShape
{
    private readonly Dictionary<IlLoop, IlLoop?> parents = new();

    public MethodShape(string name, IReadOnlyList<IlInstruction> instructions, IReadOnlyList<IlLoop> loops, IEnumerable<int> regionOffsets)
    {
        Name = name;
        Instructions = instructions;
        Loops = loops;
        foreach (IlLoop loop in loops)
        {
            parents[loop] = loops.Where(o => o.Encloses(loop)).OrderBy(o => o.EndOffset - o.HeaderOffset).FirstOrDefault();
        }

        Blocks = SplitBlocks(instructions, regionOffsets);
        BlockAt = Blocks.ToDictionary(b => b.Start);
    }

    public string Name { get; }

    public IReadOnlyList<IlInstruction> Instructions { get; }

    public IReadOnlyList<IlLoop> Loops { get; }

    public IReadOnlyList<BasicBlock> Blocks { get; }

    public IReadOnlyDictionary<int, BasicBlock> BlockAt { get; }

    /// <summary>The smallest loop enclosing the loop; null for a top-level loop.</summary>
    public IlLoop? Parent(IlLoop loop) => parents[loop];

    /// <summary>True when the offset lies in the region (a loop, or the whole method when null).</summary>
    public static bool InRegion(IlLoop? region, int offset) => region == null || region.Contains(offset);

    /// <summary>The loop directly inside <paramref name="region"/> that holds the offset; null when the offset is in none.</summary>
    public IlLoop? ChildHolding(IlLoop? region, int offset) => Loops.FirstOrDefault(l => Parent(l) == region && l.Contains(offset));

    private static List<BasicBlock> SplitBlocks(IReadOnlyList<IlInstruction> instructions, IEnumerable<int> regionOffsets)
    {
        var leaders = new SortedSet<int>(regionOffsets);
        if (instructions.Count > 0)
        {
            leaders.Add(0);
        }

        foreach (IlInstruction ins in instructions)
        {
            foreach (int t in ins.BranchTargets)
            {
                leaders.Add(t);
            }

            if (EndsBlock(ins.OpCode))
            {
                leaders.Add(ins.End);
            }
        }

        var blocks = new List<BasicBlock>();
        var current = new List<IlInstruction>();
        int codeEnd = instructions.Count == 0 ? 0 : instructions[^1].End;
        for (int i = 0; i < instructions.Count; i++)
        {
            current.Add(instructions[i]);
            bool last = i == instructions.Count - 1 || leaders.Contains(instructions[i + 1].Offset);
            if (!last)
            {
                continue;
            }

            IlInstruction end = instructions[i];
            var next = new List<int>();
            if (end.OpCode.IsBranch() || end.OpCode == ILOpCode.Switch)
            {
                next.AddRange(end.BranchTargets);
            }

            if (FallsThrough(end.OpCode) && end.End < codeEnd)
            {
                next.Add(end.End);
            }

            blocks.Add(new BasicBlock(current, next.Distinct().ToArray()));
            current = new List<IlInstruction>();
        }

        return blocks;
    }

    private static bool EndsBlock(ILOpCode op) => op.IsBranch() || op == ILOpCode.Switch || !FallsThrough(op) || op == ILOpCode.Jmp;

    // Whether control can go on to the next instruction.
    private static bool FallsThrough(ILOpCode op)
    {
        switch (op)
        {
            case ILOpCode.Br:
            case ILOpCode.Br_s:
            case ILOpCode.Leave:
            case ILOpCode.Leave_s:
            case ILOpCode.Ret:
            case ILOpCode.Throw:
            case ILOpCode.Rethrow:
            case ILOpCode.Endfinally:
            case ILOpCode.Endfilter:
            case ILOpCode.Jmp:
                return false;
            default:
                return true;
        }
    }
}
