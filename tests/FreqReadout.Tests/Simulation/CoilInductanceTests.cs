using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Simulation;

public class CoilInductanceTests
{
    private const double Inch = 0.0254;

    [Fact]
    public void LcResonance_MatchesClosedFormAndInverts()
    {
        // docs/references.md "Coil and target physics": LC resonance f = 1 / (2 pi sqrt(L C)).
        // 1 mH with 1/(4 pi^2 1e-3 1e10) F resonates at exactly 100 kHz (derived from the formula); tolerance 1e-12 relative.
        double l = 1e-3;
        double c = 1.0 / (4 * Math.PI * Math.PI * l * 1e10);
        Assert.Equal(100_000.0, LcResonance.FrequencyHz(l, c), 100_000.0 * 1e-12);
        Assert.Equal(c, LcResonance.CapacitanceF(l, 100_000.0), c * 1e-12);
        // 358.82 uH and 2.2 nF: 179 130.884 Hz, from `python3 -c "import math;print(1/(2*math.pi*math.sqrt(358.82e-6*2.2e-9)))"`; 0.01 Hz.
        Assert.Equal(179_130.884, LcResonance.FrequencyHz(358.82e-6, 2.2e-9), 0.01);
    }

    [Fact]
    public void LcResonance_ExactShiftAgreesWithSmallChangeRule()
    {
        // docs/references.md: exact f'/f = (1 + dL/L)^(-1/2); small change df/f = -dL/(2L). dL/L = 1e-6: agree to 1e-12.
        Assert.Equal(-0.5e-6, LcResonance.FractionalShift(1.0, 1e-6), 1e-12);
        // dL/L = 0.21: (1.21)^(-1/2) - 1 = 1/1.1 - 1 exactly, 1e-15.
        Assert.Equal(1 / 1.1 - 1, LcResonance.FractionalShift(1.0, 0.21), 1e-15);
    }

    [Fact]
    public void Wheeler_CheckValues()
    {
        // Wheeler, Proc. IRE 16(10):1398, 1928 (docs/references.md check values, calculated):
        // a = 1 in, b = 1 in, c = 0.5 in, n = 100 -> 400.0 uH (inch form 0.8 a^2 n^2 / (6a + 9b + 10c)); 0.05 uH (half the last digit given).
        double l1 = SearchCoil.WheelerH(1 * Inch, 1 * Inch, 0.5 * Inch, 100);
        Assert.Equal(400.0e-6, l1, 0.05e-6);
        // a = 0.1 m, b = c = 0.01 m, N = 30 -> 358.82 uH; 0.005 uH.
        var coil = new SearchCoil(30, 0.2, 0.01, 0.01, 0.0005);
        Assert.Equal(358.82e-6, coil.WheelerInductanceH, 0.005e-6);
    }

    [Fact]
    public void ThinLoop_CheckValues()
    {
        // Thin N-turn loop (Maxwell 1865; Rosa and Grover; Makarov et al., Low-Frequency Electromagnetic Modeling, Wiley 2015, eq. 10.11)
        // (docs/references.md): R = 5 cm, a = 2 mm, N = 1: 207.24 nH (-2, skin effect), 222.95 nH (-1.75, uniform); 0.01 nH.
        Assert.Equal(207.24e-9, SearchCoil.ThinLoopH(0.05, 0.002, 1, ThinLoopCurrent.SkinEffect), 0.01e-9);
        Assert.Equal(222.95e-9, SearchCoil.ThinLoopH(0.05, 0.002, 1, ThinLoopCurrent.Uniform), 0.01e-9);
        // The 0.1 m / 30-turn coil as a round bundle of equal area: 362.41 uH; 0.01 uH.
        var coil = new SearchCoil(30, 0.2, 0.01, 0.01, 0.0005);
        Assert.Equal(362.41e-6, coil.ThinLoopInductanceH, 0.01e-6);
    }

    [Fact]
    public void WheelerAndThinLoop_AgreeWithinTwoPercent()
    {
        // docs/references.md: the 0.1 m / 30-turn coil: thin loop 1.0 % above Wheeler, the two agree within 2 %.
        var coil = new SearchCoil(30, 0.2, 0.01, 0.01, 0.0005);
        Assert.InRange(coil.InductanceRelativeDifference, 0.005, 0.015);
        Assert.True(Math.Abs(coil.InductanceRelativeDifference) < 0.02);
    }

    [Fact]
    public void Coil_RejectsBadGeometryNamingTheSetting()
    {
        var ex = Assert.Throws<ArgumentOutOfRangeException>(() => new SearchCoil(0, 0.2, 0.01, 0.01, 0.0005));
        Assert.Contains("turns", ex.Message);
        Assert.Contains("1..100000", ex.Message);
    }
}
