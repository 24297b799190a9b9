using FreqReadout.Host.Bench;
using FreqReadout.Host.Simulation;
using FreqReadout.Readout;

namespace FreqReadout.Tests.Tracking;

/// <summary>
/// The regression scenes are what their descriptions say (rates, time constants, noise, timing, peaks), and they run through
/// the readout. These tests check the scenes, not the tracker.
/// </summary>
public class DriftScenariosTests
{
    private static double RatePpmPerS(SceneModel model, double t) => (model.SearchIntendedHz(t + 0.01) - model.SearchIntendedHz(t)) / 0.01 / model.SearchNominalHz * 1e6;

    [Fact]
    public void WarmToCold_StartsAtFivePpmPerSecond_FallsByETakesAMinute_AtTwoHundredthsOfAPpm()
    {
        DriftScenario s = DriftScenarios.WarmToColdSettling();
        var model = new SceneModel(s.Scene);
        Assert.InRange(RatePpmPerS(model, 0), 4.99, 5.0);
        Assert.InRange(RatePpmPerS(model, 60) * Math.E, 4.99, 5.0);
        Assert.InRange(s.Bench.GateNoisePpm, 0.012, 0.03);
        Assert.Equal(8, s.Bench.Targets.Count);
        Assert.Equal(4, model.Targets.Count(t => t.SignRuleClass == "ferrous"));
        Assert.All(model.Plan.Passes, p => Assert.True(p.EndTimeS < 200 - 3));
    }

    [Fact]
    public void Onset_IsFlatThroughTheBaseline_ThenThreeHundredthsOfAHertzPerSecond()
    {
        DriftScenario s = DriftScenarios.DriftRateOnset(false);
        var model = new SceneModel(s.Scene);
        Assert.Equal(model.SearchNominalHz, model.SearchIntendedHz(19.5), 9);
        Assert.InRange(model.SearchIntendedHz(30) - model.SearchIntendedHz(29), 0.03 * 0.999, 0.03 * 1.001);
        Assert.Empty(s.Bench.Targets);
        Assert.Equal(8, DriftScenarios.DriftRateOnset(true).Bench.Targets.Count);
    }

    [Fact]
    public void MetalLeaves_InsideTheDefaultBaselineCapture()
    {
        DriftScenario s = DriftScenarios.MetalLeavesDuringBaseline();
        var model = new SceneModel(s.Scene);
        double on = model.SearchIntendedHz(1.0) - model.SearchNominalHz;
        double off = model.SearchIntendedHz(3.35) - model.SearchNominalHz;
        Assert.InRange(on / s.Bench.GateNoiseHz, 50, 60.5); // up to 60 gate noises while the coil rests on it (its peak, unless shallow enough to peak under the winding)
        Assert.Equal(0.0, off); // lifted clear
        var defaults = new ReadoutSettings();
        Assert.InRange(3.0, defaults.SettlingSeconds, defaults.SettlingSeconds + defaults.BaselineSeconds); // leaves during the capture
        Assert.InRange(3.3, defaults.SettlingSeconds, defaults.SettlingSeconds + defaults.BaselineSeconds);
        Assert.Equal(6, s.Bench.Targets.Count);
        Assert.Equal(7, model.Targets.Count); // the leaving part is in the scene, not among the scored passes
    }

    [Fact]
    public void EveryScenario_RunsThroughTheReadoutAndThePlainWays()
    {
        foreach (DriftScenario s in new[] { DriftScenarios.WarmToColdSettling(), DriftScenarios.DriftRateOnset(true), DriftScenarios.MetalLeavesDuringBaseline() })
        {
            BenchSceneOutcome o = s.Run();
            Assert.Equal(s.Bench.Targets.Count, o.Passes.Count);
            Assert.Equal(3, o.Ways.Count);
            Assert.True(o.Readout.Gates > 0, s.Name);
            Assert.All(o.Ways, w => Assert.Equal(o.Passes.Count, w.Match.Matches.Count));
        }
    }
}
