using System.Reflection.Metadata;

namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// Static worst-case IL operation count from entry methods of a device assembly.
/// <para>
/// Method (a sound over-approximation, path-insensitive): every IL instruction of a body counts 1
/// operation, once on every pass of its innermost loop; both arms of every branch are counted, as if
/// every instruction ran. A loop with declared bound B (the most times its backward branch is taken
/// per entry) is passed B + 1 times per pass of what encloses it (B iterations plus the exit test),
/// so nested loops multiply. A call into the device assembly adds the callee's count (computed the
/// same way); a call into mscorlib adds <see cref="CostAssumptions.MscorlibCallOps"/>; a call of a
/// port interface adds <see cref="CostAssumptions.PortCallOps"/>. Both are listed with how often
/// they are made.
/// </para>
/// <para>
/// Refused (reported in <see cref="Problems"/>, which must stay empty): a loop on the path without a
/// declared bound, recursion, a virtual call that an override could take over, a call of a method
/// with no body that is not a port interface (delegates, extern), and calli.
/// </para>
/// </summary>
internal sealed class IlCostCounter
{
    private readonly DeviceModule module;
    private readonly Dictionary<string, LoopBound> bounds;
    private readonly CostAssumptions assumptions;
    private readonly Dictionary<MethodDefinitionHandle, MethodShape> shapes = new();
    private readonly SortedSet<string> problems = new(StringComparer.Ordinal);
    private readonly SortedDictionary<string, MethodShape> reached = new(StringComparer.Ordinal);

    public IlCostCounter(DeviceModule module, IEnumerable<LoopBound> bounds, CostAssumptions assumptions)
    {
        this.module = module;
        this.assumptions = assumptions;
        this.bounds = new Dictionary<string, LoopBound>(StringComparer.Ordinal);
        foreach (LoopBound b in bounds)
        {
            if (!this.bounds.TryAdd(b.Key, b))
            {
                problems.Add("loop bound " + b.Key + " is declared twice");
            }
        }
    }

    /// <summary>Undeclared loops, recursion and other paths that cannot be counted, found so far.</summary>
    public IReadOnlyCollection<string> Problems => problems;

    /// <summary>Every device method reached by a count so far, by name, with its IL size and loops.</summary>
    public IReadOnlyDictionary<string, MethodShape> Reached => reached;

    /// <summary>Declared bounds that no loop of the assembly has (renamed or removed code): "Type.Method#k".</summary>
    public IEnumerable<string> StaleBounds()
    {
        var existing = new HashSet<string>(StringComparer.Ordinal);
        foreach (MethodDefinitionHandle m in module.Methods())
        {
            foreach (IlLoop loop in Shape(m).Loops)
            {
                existing.Add(module.MethodName(m) + "#" + loop.Index);
            }
        }

        return bounds.Keys.Where(k => !existing.Contains(k)).OrderBy(k => k, StringComparer.Ordinal);
    }

    /// <summary>
    /// Counts the given entries (device method names, or port interface methods) as one run of each.
    /// </summary>
    /// <param name="entries">Method names as <see cref="DeviceModule.MethodName"/> gives them.</param>
    /// <param name="profile">Which bound of each loop to use.</param>
    /// <param name="excluded">Methods (device, port or mscorlib names) whose calls are not followed: a branch known not to be taken in this case.</param>
    /// <param name="overrides">Loop bounds used instead of the declared ones, by "Type.Method#k".</param>
    /// <param name="onePassOf">When set ("Type.Method#k"), counts one pass of that loop of the single entry instead of the whole method.</param>
    public IlCost Count(IReadOnlyList<string> entries, CostProfile profile, IReadOnlyCollection<string>? excluded = null, IReadOnlyDictionary<string, long>? overrides = null, string? onePassOf = null)
    {
        var walk = new Walk(profile, excluded ?? [], overrides ?? new Dictionary<string, long>());
        foreach (string name in walk.Excluded.Concat(walk.Overrides.Keys.Select(k => k.Split('#')[0])))
        {
            if (module.FindMethods(name).Count == 0 && !name.Contains('('))
            {
                problems.Add("excluded or overridden method " + name + " is not in " + module.Name);
            }
        }

        var total = new IlCost();
        foreach (string entry in entries)
        {
            IReadOnlyList<MethodDefinitionHandle> found = module.FindMethods(entry);
            if (found.Count != 1)
            {
                problems.Add("entry method " + entry + (found.Count == 0 ? " is not in " : " is ambiguous in ") + module.Name);
                continue;
            }

            MethodDefinitionHandle h = found[0];
            if (onePassOf != null)
            {
                MethodShape shape = Shape(h);
                IlLoop? loop = shape.Loops.FirstOrDefault(l => shape.Name + "#" + l.Index == onePassOf);
                if (loop == null)
                {
                    problems.Add("loop " + onePassOf + " is not a loop of " + entry);
                    continue;
                }

                walk.Stack.Add(h);
                total.Add(RegionCost(walk, shape, loop), 1);
                walk.Stack.Remove(h);
            }
            else if (module.Body(h) == null && module.IsInterfaceMethod(h))
            {
                total.AddOps(assumptions.PortCallOps);
                total.AddCall(total.PortCalls, entry, 1);
            }
            else
            {
                total.Add(MethodCost(walk, h), 1);
            }
        }

        return total;
    }

    /// <summary>The method's IL size and loops (decoded once).</summary>
    public MethodShape Shape(MethodDefinitionHandle handle)
    {
        if (!shapes.TryGetValue(handle, out MethodShape? shape))
        {
            string name = module.MethodName(handle);
            IReadOnlyList<IlInstruction> instructions = module.Instructions(handle);
            shape = new MethodShape(name, instructions, LoopFinder.Find(instructions, module.Name + ": " + name), module.ExceptionRegionOffsets(handle));
            shapes[handle] = shape;
        }

        return shape;
    }

    /// <summary>The declared bound of a loop, or null when none is declared.</summary>
    public LoopBound? DeclaredBound(string key) => bounds.TryGetValue(key, out LoopBound? b) ? b : null;

    private IlCost MethodCost(Walk walk, MethodDefinitionHandle handle)
    {
        if (walk.Memo.TryGetValue(handle, out IlCost? known))
        {
            return known;
        }

        MethodShape shape = Shape(handle);
        if (walk.Stack.Contains(handle))
        {
            int from = walk.Stack.IndexOf(handle);
            problems.Add("recursion: " + string.Join(" -> ", walk.Stack.Skip(from).Select(module.MethodName).Append(shape.Name))
                + " (a call chain that can come back to itself has no static bound)");
            return new IlCost();
        }

        reached[shape.Name] = shape;
        walk.Stack.Add(handle);
        IlCost cost = RegionCost(walk, shape, null);
        walk.Stack.RemoveAt(walk.Stack.Count - 1);
        walk.Memo[handle] = cost;
        return cost;
    }

    // The worst pass through a region (a loop, or the whole body when region is null): the longest
    // path, by operations, from an entry of the region to where it leaves or jumps back to its header.
    // Within the region a directly nested loop is one node costing (bound + 1) passes of its own; the
    // rest are basic blocks. Blocks no path from an entry reaches (exception handlers) are added once.
    private IlCost RegionCost(Walk walk, MethodShape shape, IlLoop? region)
    {
        object NodeOf(int offset) => (object?)shape.ChildHolding(region, offset) ?? shape.BlockAt[offset];

        List<BasicBlock> members = shape.Blocks.Where(b => MethodShape.InRegion(region, b.Start)).ToList();
        List<object> nodes = members.Select(b => NodeOf(b.Start)).Distinct().ToList();
        var next = nodes.ToDictionary(n => n, _ => new List<object>());
        foreach (BasicBlock b in members)
        {
            object from = NodeOf(b.Start);
            foreach (int t in b.Successors)
            {
                if (!MethodShape.InRegion(region, t) || (region != null && t == region.HeaderOffset))
                {
                    continue; // leaves the region, or ends this pass of the loop
                }

                object to = NodeOf(t);
                if (to != from && !next[from].Contains(to))
                {
                    next[from].Add(to);
                }
            }
        }

        var entries = new List<object>();
        if (region == null)
        {
            if (members.Count > 0)
            {
                entries.Add(NodeOf(0));
            }
        }
        else
        {
            entries.Add(NodeOf(region.HeaderOffset));
            foreach (BasicBlock b in shape.Blocks.Where(b => !region.Contains(b.Start)))
            {
                foreach (int t in b.Successors.Where(region.Contains))
                {
                    object entry = NodeOf(t);
                    if (!entries.Contains(entry))
                    {
                        entries.Add(entry);
                    }
                }
            }
        }

        var own = new Dictionary<object, IlCost>();
        IlCost Own(object node)
        {
            if (!own.TryGetValue(node, out IlCost? c))
            {
                c = node is BasicBlock block ? BlockCost(walk, shape, block) : LoopCost(walk, shape, (IlLoop)node);
                own[node] = c;
            }

            return c;
        }

        var best = new Dictionary<object, IlCost>();
        var onPath = new HashSet<object>();
        IlCost Best(object node)
        {
            if (best.TryGetValue(node, out IlCost? known))
            {
                return known;
            }

            if (!onPath.Add(node))
            {
                problems.Add(shape.Name + ": control flow that is not a loop found from backward branches (irreducible); its cost cannot be bounded");
                return new IlCost();
            }

            IlCost? longest = null;
            foreach (object n in next[node])
            {
                IlCost c = Best(n);
                if (longest == null || Greater(c, longest))
                {
                    longest = c;
                }
            }

            var total = new IlCost();
            total.Add(Own(node), 1);
            if (longest != null)
            {
                total.Add(longest, 1);
            }

            onPath.Remove(node);
            best[node] = total;
            return total;
        }

        var result = new IlCost();
        IlCost? worst = null;
        foreach (object e in entries)
        {
            IlCost c = Best(e);
            if (worst == null || Greater(c, worst))
            {
                worst = c;
            }
        }

        if (worst != null)
        {
            result.Add(worst, 1);
        }

        var reachable = new HashSet<object>();
        var todo = new Stack<object>(entries);
        while (todo.Count > 0)
        {
            object n = todo.Pop();
            if (reachable.Add(n))
            {
                next[n].ForEach(todo.Push);
            }
        }

        foreach (object n in nodes.Where(n => !reachable.Contains(n)))
        {
            result.Add(Own(n), 1);
        }

        return result;
    }

    private static bool Greater(IlCost a, IlCost b)
    {
        if ((a.UnboundedBy != null) != (b.UnboundedBy != null))
        {
            return a.UnboundedBy != null;
        }

        return a.Ops > b.Ops;
    }

    private IlCost BlockCost(Walk walk, MethodShape shape, BasicBlock block)
    {
        var cost = new IlCost();
        foreach (IlInstruction ins in block.Instructions)
        {
            cost.AddOps(1);
            AddCallee(walk, shape, ins, cost);
        }

        return cost;
    }

    // A loop nested in the region being counted: (bound + 1) passes.
    private IlCost LoopCost(Walk walk, MethodShape shape, IlLoop loop)
    {
        string key = shape.Name + "#" + loop.Index;
        long passes;
        var cost = new IlCost();
        if (walk.Overrides.TryGetValue(key, out long overridden))
        {
            passes = overridden + 1;
        }
        else if (bounds.TryGetValue(key, out LoopBound? bound))
        {
            long? value = bound.Value(walk.Profile);
            if (value == null)
            {
                cost.MarkUnbounded(key);
                value = 0;
            }

            passes = value.Value + 1;
        }
        else
        {
            problems.Add("undeclared loop: " + shape.Name + " loop #" + loop.Index + " (IL_" + loop.HeaderOffset.ToString("x4") + " to IL_"
                + loop.EndOffset.ToString("x4") + ") has no declared bound; add it to the loop-bound table with the expression the code bounds it by");
            passes = 1;
        }

        cost.Add(RegionCost(walk, shape, loop), passes);
        return cost;
    }

    private void AddCallee(Walk walk, MethodShape shape, IlInstruction ins, IlCost cost)
    {
        if (ins.OpCode == ILOpCode.Calli || ins.OpCode == ILOpCode.Jmp)
        {
            problems.Add(shape.Name + ": " + ins.OpCode + " at IL_" + ins.Offset.ToString("x4") + " has a target that cannot be known statically");
            return;
        }

        if (ins.OpCode != ILOpCode.Call && ins.OpCode != ILOpCode.Callvirt && ins.OpCode != ILOpCode.Newobj)
        {
            return;
        }

        if (!module.TryGetLocalMethod(ins.Token, out MethodDefinitionHandle callee, out string external))
        {
            if (!walk.Excluded.Contains(external))
            {
                cost.AddOps(assumptions.MscorlibCallOps);
                cost.AddCall(cost.MscorlibCalls, external, 1);
            }

            return;
        }

        string name = module.MethodName(callee);
        if (walk.Excluded.Contains(name))
        {
            return;
        }

        if (module.Body(callee) == null)
        {
            if (module.IsInterfaceMethod(callee))
            {
                cost.AddOps(assumptions.PortCallOps);
                cost.AddCall(cost.PortCalls, name, 1);
            }
            else
            {
                problems.Add(shape.Name + ": call of " + name + " at IL_" + ins.Offset.ToString("x4") + ", which has no body (abstract, extern or a delegate) and is not a port interface");
            }

            return;
        }

        if (ins.OpCode == ILOpCode.Callvirt && module.IsOverridable(callee))
        {
            problems.Add(shape.Name + ": virtual call of " + name + " at IL_" + ins.Offset.ToString("x4") + " may run an override; seal the class or the method");
        }

        cost.Add(MethodCost(walk, callee), 1);
    }

    private sealed class Walk
    {
        public Walk(CostProfile profile, IReadOnlyCollection<string> excluded, IReadOnlyDictionary<string, long> overrides)
        {
            Profile = profile;
            Excluded = new HashSet<string>(excluded, StringComparer.Ordinal);
            Overrides = overrides;
        }

        public CostProfile Profile { get; }

        public HashSet<string> Excluded { get; }

        public IReadOnlyDictionary<string, long> Overrides { get; }

        public Dictionary<MethodDefinitionHandle, IlCost> Memo { get; } = new();

        public List<MethodDefinitionHandle> Stack { get; } = new();
    }
}
