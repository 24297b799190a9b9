namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Finds loops in decoded IL: every branch (conditional, unconditional, leave or switch arm) to an
/// offset at or before its own starts or extends a loop at that target. C# compiles each while, for,
/// foreach and do loop to one such backward branch (the condition at the bottom jumping to the top of
/// the body); a goto backwards is a loop too. Loops that overlap without nesting are refused.
/// </summary>
internal static class LoopFinder
{
    public static IReadOnlyList<IlLoop> Find(IReadOnlyList<IlInstruction> instructions, string methodName)
    {
        var ends = new SortedDictionary<int, int>(); // header -> end of the last backward branch to it
        foreach (IlInstruction ins in instructions)
        {
            foreach (int target in ins.BranchTargets)
            {
                if (target <= ins.Offset)
                {
                    ends[target] = ends.TryGetValue(target, out int end) ? Math.Max(end, ins.End) : ins.End;
                }
            }
        }

        var loops = new List<IlLoop>();
        foreach (KeyValuePair<int, int> pair in ends)
        {
            loops.Add(new IlLoop(loops.Count, pair.Key, pair.Value));
        }

        foreach (IlLoop a in loops)
        {
            foreach (IlLoop b in loops)
            {
                if (a.HeaderOffset < b.HeaderOffset && b.HeaderOffset < a.EndOffset && a.EndOffset < b.EndOffset)
                {
                    throw new InvalidDataException(methodName + ": loops at IL_" + a.HeaderOffset.ToString("x4") + " and IL_" + b.HeaderOffset.ToString("x4")
                        + " overlap without nesting; their cost cannot be bounded loop by loop");
                }
            }
        }

        return loops;
    }
}
