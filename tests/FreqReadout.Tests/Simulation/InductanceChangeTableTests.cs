using FreqReadout.Host.Simulation;
using Xunit.Abstractions;

namespace FreqReadout.Tests.Simulation;

public class InductanceChangeTableTests
{
    private readonly ITestOutputHelper _output;

    public InductanceChangeTableTests(ITestOutputHelper output) => _output = output;

    /// <summary>Largest |table - exact| over many positions across the swept line, and the largest |exact| there.</summary>
    private static (double MaxError, double Peak) Compare(SceneModel model, int samples, int seed)
    {
        var table = new InductanceChangeTable(model);
        Assert.True(table.IsTabulated);
        double low = model.Plan.Passes.Min(p => Math.Min(p.FromM, p.ToM));
        double high = model.Plan.Passes.Max(p => Math.Max(p.FromM, p.ToM));
        var random = new Random(seed);
        double maxError = 0;
        double peak = 0;
        for (int i = 0; i <= samples; i++)
        {
            // Evenly spread points plus random ones (between nodes at arbitrary fractions), both ends included.
            double x = i % 2 == 0 ? low + (high - low) * i / samples : low + (high - low) * random.NextDouble();
            double exact = model.InductanceChangeAtPositionH(x);
            maxError = Math.Max(maxError, Math.Abs(table.AtPositionH(x) - exact));
            peak = Math.Max(peak, Math.Abs(exact));
        }

        return (maxError, peak);
    }

    [Fact]
    public void DemoScene_TableMatchesTheExactCoupling()
    {
        // The interpolation remainder (Abramowitz and Stegun 1964, 25.2.14, from memory) is about (h/d)^4 / 40 of the peak
        // for a spacing h = d/16 (measured: 1.8e-3 of the peak at h = d/2, 6.7e-7 at d/16): far below 1e-5. Checked against the exact coupling (every dipole, elliptic integrals).
        var model = new SceneModel(DemoScenes.FloorScan());
        var (maxError, peak) = Compare(model, 6000, 1);
        _output.WriteLine($"max error {maxError / peak:G3} of the peak");
        Assert.True(peak > 0);
        Assert.True(maxError <= 1e-5 * peak, $"max error {maxError:G3} H against a peak of {peak:G3} H");
    }

    [Fact]
    public void ShallowTargetAtTheSurface_TableMatchesTheExactCoupling()
    {
        // The hardest case: coil on the surface (height 0), a small sphere just below it and under the winding, so the field
        // at the target changes on the scale of its depth (the table's spacing follows it).
        var scene = new Scene
        {
            Name = "shallow",
            Oscillator = new SceneOscillator { FrequencyHz = 50_000 },
            Targets =
            {
                new SceneTarget { Name = "ball", Material = "copper", RadiusM = 0.001, DepthM = 0.004, PositionM = 0.3, OffsetM = 0.09 },
                new SceneTarget { Name = "nut", Material = "carbon_steel", MuR = 100, RadiusM = 0.003, DepthM = 0.05, PositionM = 0.5 },
            },
            Sweep = new SceneSweep { StartM = 0, EndM = 0.8, SpeedMPerS = 0.4, HeightM = 0, Passes = 2, LeadInS = 1, TailS = 1 },
        };
        var model = new SceneModel(scene);
        var table = new InductanceChangeTable(model);
        Assert.Equal(0.004 / InductanceChangeTable.NodesPerAxialDistance, table.SpacingM, 1e-15);
        var (maxError, peak) = Compare(model, 8000, 2);
        _output.WriteLine($"max error {maxError / peak:G3} of the peak");
        Assert.True(maxError <= 1e-5 * peak, $"max error {maxError:G3} H against a peak of {peak:G3} H");
    }

    [Fact]
    public void NodesAreEvaluatedOnlyWhereLookedUp()
    {
        var model = new SceneModel(DemoScenes.FloorScan());
        var table = new InductanceChangeTable(model);
        Assert.Equal(0, table.NodesEvaluated);
        table.AtPositionH(1.0);
        Assert.Equal(4, table.NodesEvaluated);
        table.AtPositionH(1.0 + 0.1 * table.SpacingM);
        Assert.Equal(4, table.NodesEvaluated);
    }

    [Fact]
    public void NoTargets_Zero_AndAnOverlongLine_IsExact()
    {
        var empty = new Scene { Name = "empty", Oscillator = new SceneOscillator { FrequencyHz = 50_000 } };
        var none = new InductanceChangeTable(new SceneModel(empty));
        Assert.False(none.IsTabulated);
        Assert.Equal(0.0, none.AtPositionH(0.3));

        // 10 km at a spacing of 4 mm / 16 is 4e7 nodes: beyond MaxNodes, so every lookup is the exact coupling.
        var scene = new Scene
        {
            Name = "long",
            Oscillator = new SceneOscillator { FrequencyHz = 50_000 },
            Targets = { new SceneTarget { Name = "ball", Material = "copper", RadiusM = 0.001, DepthM = 0.004, PositionM = 5000 } },
            Sweep = new SceneSweep { StartM = 0, EndM = 10_000, SpeedMPerS = 20, HeightM = 0, Passes = 1, LeadInS = 0, TailS = 0 },
            DurationS = 1,
        };
        var model = new SceneModel(scene);
        var table = new InductanceChangeTable(model);
        Assert.False(table.IsTabulated);
        Assert.Equal(model.InductanceChangeAtPositionH(5000.001), table.AtPositionH(5000.001));
    }
}
