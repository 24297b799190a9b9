using System.Numerics;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class CoilTargetShiftTests
{
    private static readonly SearchCoil WorkedCoil = new(30, 0.2, 0.01, 0.01, 0.0005);

    [Fact]
    public void WorkedCoilPlusSphere_Copper()
    {
        // docs/references.md worked coil check (calculated): R = 0.1 m, 30 turns, 1 cm x 1 cm winding (358.8 uH), sphere a = 1 cm
        // on axis at z = 0.1 m, 10 kHz, copper (sigma 5.8e7): dL = -20.005 nH (0.001 nH), df/f = +2.788e-5 (0.001e-5).
        Complex m = SpherePolarizability.PolarizabilityM3(0.01, 5.8e7, 1.0, 1e4);
        double dl = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 0.0, 0.1);
        Assert.Equal(-20.005e-9, dl, 0.001e-9);
        Assert.Equal(dl, CoilTargetCoupling.OnAxisInductanceChangeH(WorkedCoil, m, 0.1), 1e-15);
        Assert.Equal(2.788e-5, LcResonance.FractionalShift(WorkedCoil.WheelerInductanceH, dl), 0.001e-5);
    }

    [Fact]
    public void WorkedCoilPlusSphere_Steel()
    {
        // Same check: steel sigma 6e6, mu_r 100: dL = +18.27 nH (0.01 nH), df/f = -2.545e-5 (0.001e-5).
        Complex m = SpherePolarizability.PolarizabilityM3(0.01, 6e6, 100.0, 1e4);
        double dl = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 0.0, 0.1);
        Assert.Equal(18.27e-9, dl, 0.01e-9);
        Assert.Equal(-2.545e-5, LcResonance.FractionalShift(WorkedCoil.WheelerInductanceH, dl), 0.001e-5);
    }

    [Fact]
    public void FarField_ShiftFallsAsInverseSixthPower()
    {
        // docs/references.md: dL ~ N^2 R^4 / (4 (R^2 + z^2)^3) -> z^-6 far away. Local log-log slope between 2 m and 2.2 m
        // (z = 20 R) is -6 (R^2/z^2) of a percent: tolerance 0.05 on the slope.
        Complex m = SpherePolarizability.PolarizabilityM3(0.01, 5.8e7, 1.0, 1e4);
        double d1 = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 0.0, 2.0);
        double d2 = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 0.0, 2.2);
        double slope = Math.Log(d2 / d1) / Math.Log(2.2 / 2.0);
        Assert.Equal(-6.0, slope, 0.05);
        // Also off axis, at 45 degrees: the dipole field magnitude^2 goes as r^-6 too.
        double o1 = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 2.0, 2.0);
        double o2 = CoilTargetCoupling.InductanceChangeH(WorkedCoil, m, 2.4, 2.4);
        Assert.Equal(-6.0, Math.Log(o2 / o1) / Math.Log(1.2), 0.05);
    }

    [Fact]
    public void TradeSanity_CoinSizedTargetUnderBeatDetectorCoil()
    {
        // Common practice, no source: a simple beat-note detector with a 15-20 cm coil of 40-50 turns of 0.4-0.6 mm wire
        // hears a medium coin at about 5-8 cm and large objects at up to about 30 cm. Model: 18 cm, 45 turns, 0.5 mm wire,
        // 100 kHz; the coin as a brass sphere of 8 mm radius (a coin-sized copper alloy, between a coin's equal-volume
        // sphere and its radius). "A good readout's noise" taken as 0.05 Hz (common practice, no source).
        var coil = new SearchCoil(45, 0.18, 0, 0, 0.0005);
        double f0 = 100_000;
        Assert.True(MaterialPresets.TryGet("brass", null, out Material brass));
        Complex m = SpherePolarizability.PolarizabilityM3(0.008, brass.ConductivitySPerM, 1.0, f0);
        double l = coil.WheelerInductanceH;
        double at5 = f0 * LcResonance.FractionalShift(l, CoilTargetCoupling.InductanceChangeH(coil, m, 0, 0.05));
        double at30 = f0 * LcResonance.FractionalShift(l, CoilTargetCoupling.InductanceChangeH(coil, m, 0, 0.30));
        Assert.True(at5 > 0, "non-ferrous raises the frequency");
        Assert.True(at5 > 20 * 0.05, $"shift at 5 cm {at5} Hz must be well above 0.05 Hz noise");
        Assert.True(at5 / at30 > 100, $"shift must fall by orders of magnitude by 30 cm ({at5} -> {at30} Hz)");
    }
}
