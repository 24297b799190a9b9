using FreqReadout.Tests.DeviceFit;
using Microsoft.CodeAnalysis;

namespace FreqReadout.Tests;

/// <summary>
/// The static IL cost counter on small snippets compiled against nanoFramework's mscorlib: it counts
/// a loop by its declared bound, multiplies nested loops, takes the longer arm of a branch, charges
/// the stated constant per mscorlib call, and refuses undeclared loops and recursion (naming the method).
/// </summary>
public class DeviceCostCounterTests
{
    private const string LoopSnippet = @"
namespace Snippet
{
    public sealed class Work
    {
        private readonly double[] values = new double[64];

        public double Sum(int count)
        {
            double s = 0;
            for (int i = 0; i < count; i++) { s += values[i] * 0.5; }
            return s;
        }

        public double Nested(int n)
        {
            double s = 0;
            for (int i = 0; i < n; i++) { for (int j = 0; j < i; j++) { s += values[j]; } s *= 0.5; }
            return s;
        }

        public int Heavy(int x)
        {
            x = (x * 3) + 1; x = (x * 5) + 2; x = (x * 7) + 3; x = (x * 11) + 4; x = (x * 13) + 5; x = (x * 17) + 6;
            return x;
        }

        public int EitherArm(bool c, int x)
        {
            if (c) { x = Heavy(x); } else { x = Heavy(x + 1); }
            return x;
        }

        public string Text(int x) { return ""n="" + x.ToString(); }

        public int Down(int x) { return x <= 0 ? 0 : Down(x - 1) + 1; }

        public int Ping(int x) { return x <= 0 ? 0 : Pong(x - 1); }

        public int Pong(int x) { return Ping(x); }
    }
}";

    [Fact]
    public void Cost_count_refuses_an_undeclared_loop_and_names_the_method()
    {
        using DeviceModule module = LoopModule();
        var counter = new IlCostCounter(module, [], new CostAssumptions());
        counter.Count(["Work.Sum"], CostProfile.Defaults);
        string problem = Assert.Single(counter.Problems);
        Assert.StartsWith("undeclared loop: Work.Sum loop #0 ", problem);

        var declared = new IlCostCounter(module, [new LoopBound("Work.Sum", 0, "count <= 64 (test)", 64, 64)], new CostAssumptions());
        declared.Count(["Work.Sum"], CostProfile.Defaults);
        Assert.Empty(declared.Problems);
    }

    [Fact]
    public void Cost_count_refuses_recursion_direct_and_through_another_method()
    {
        using DeviceModule module = LoopModule();
        var counter = new IlCostCounter(module, [], new CostAssumptions());
        counter.Count(["Work.Down"], CostProfile.Defaults);
        Assert.Contains("recursion: Work.Down -> Work.Down (a call chain that can come back to itself has no static bound)", counter.Problems);

        var twice = new IlCostCounter(module, [], new CostAssumptions());
        twice.Count(["Work.Ping"], CostProfile.Defaults);
        Assert.Contains(twice.Problems, p => p.StartsWith("recursion: Work.Ping -> Work.Pong -> Work.Ping", StringComparison.Ordinal));
    }

    [Fact]
    public void Cost_count_passes_a_loop_bound_plus_one_times_and_multiplies_nested_loops()
    {
        using DeviceModule module = LoopModule();
        long Count(string method, params LoopBound[] bounds)
        {
            var counter = new IlCostCounter(module, bounds, new CostAssumptions());
            IlCost cost = counter.Count([method], CostProfile.Defaults);
            Assert.Empty(counter.Problems);
            return cost.Ops;
        }

        // One loop: cost(B) = straight part + (B + 1) x one pass, so it grows by one pass per unit of B.
        long sum0 = Count("Work.Sum", new LoopBound("Work.Sum", 0, "t", 0, 0));
        long sum1 = Count("Work.Sum", new LoopBound("Work.Sum", 0, "t", 1, 1));
        long sum10 = Count("Work.Sum", new LoopBound("Work.Sum", 0, "t", 10, 10));
        long pass = sum1 - sum0;
        Assert.True(pass > 5, "one pass of the loop counts " + pass);
        Assert.Equal(sum0 + (10 * pass), sum10);

        // sum0 holds the whole body once (one pass of the loop region and everything outside it).
        var shape = new IlCostCounter(module, [], new CostAssumptions()).Shape(module.FindMethods("Work.Sum")[0]);
        Assert.Equal(shape.Instructions.Count, sum0);

        // Nested: cost(O, I) = outside + (O + 1) x (outer's own + (I + 1) x inner pass).
        long Nested(long outer, long inner) => Count("Work.Nested", new LoopBound("Work.Nested", 0, "o", outer, outer), new LoopBound("Work.Nested", 1, "i", inner, inner));
        long innerPass = Nested(0, 1) - Nested(0, 0);
        long outerPass = Nested(1, 0) - Nested(0, 0); // outer's own instructions plus one inner pass
        Assert.True(innerPass > 5 && outerPass > innerPass, "inner pass " + innerPass + ", outer pass " + outerPass);
        Assert.Equal(Nested(0, 0) + (4 * outerPass) + (5 * 5 * innerPass), Nested(4, 5));
    }

    [Fact]
    public void Cost_count_takes_the_longer_arm_of_a_branch_not_both()
    {
        using DeviceModule module = LoopModule();
        var counter = new IlCostCounter(module, [], new CostAssumptions());
        long heavy = counter.Count(["Work.Heavy"], CostProfile.Defaults).Ops;
        long either = counter.Count(["Work.EitherArm"], CostProfile.Defaults).Ops;
        long body = counter.Shape(module.FindMethods("Work.EitherArm")[0]).Instructions.Count;
        Assert.Empty(counter.Problems);
        Assert.True(either > heavy && either < heavy + body, "EitherArm counts " + either + ", Heavy " + heavy + ", its own body " + body + ": one call of Heavy plus part of the body was expected");
    }

    [Fact]
    public void Cost_count_charges_a_stated_constant_per_mscorlib_call_and_lists_it()
    {
        using DeviceModule module = LoopModule();
        var cheap = new IlCostCounter(module, [], new CostAssumptions { MscorlibCallOps = 0 }).Count(["Work.Text"], CostProfile.Defaults);
        var dear = new IlCostCounter(module, [], new CostAssumptions { MscorlibCallOps = 1000 }).Count(["Work.Text"], CostProfile.Defaults);
        long calls = dear.MscorlibCalls.Values.Sum();
        Assert.Equal(2, calls);
        Assert.Contains("int.ToString()", dear.MscorlibCalls.Keys);
        Assert.Contains("String.Concat(string, string)", dear.MscorlibCalls.Keys);
        Assert.Equal(cheap.Ops + (1000 * calls), dear.Ops);
    }

    // Compiled once for all the tests here (Roslyn's first compile is the slow part).
    private static readonly Lazy<byte[]> LoopSnippetImage = new(() =>
        NanoSnippetCompiler.Compile(LoopSnippet, NanoMscorlib.FindPath(DeviceAssemblyMetadataTests.FindDeviceAssembly()), OptimizationLevel.Release));

    private static DeviceModule LoopModule()
    {
        return DeviceModule.Load("snippet", LoopSnippetImage.Value, NanoMscorlib.FindPath(DeviceAssemblyMetadataTests.FindDeviceAssembly()));
    }
}
