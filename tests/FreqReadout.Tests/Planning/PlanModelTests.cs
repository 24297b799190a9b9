using FreqReadout.Host.Captures;
using FreqReadout.Host.Planning;

namespace FreqReadout.Tests.Planning;

/// <summary>
/// <c>plan</c>'s formulas against the published relations they come from (docs/references.md, "Least-squares (regression)
/// counting and its variance"): the Pi/Omega variance ratio, and the beat-note gains that follow from the two variances.
/// </summary>
public class PlanModelTests
{
    private static readonly TimestampPreset JitterOnly = new("custom", CaptureKind.Edges, 1e-6, 1e12, 0, 1e9, "test");

    [Theory]
    [InlineData(10, 2.037)]
    [InlineData(100, 17.00)]
    [InlineData(1000, 167.0)]
    public void Reciprocal_over_regression_variance_is_the_published_ratio(int timestamps, double ratio)
    {
        // Rubiola, Rev. Sci. Instrum. 76, 054703 (2005), Pi and Omega counters: Var_Pi / Var_Omega = N (N + 1) / (6 (N - 1));
        // check values N = 10: 2.037, 100: 17.00, 1000: 167.0 (docs/references.md, verified). A gate of N - 1 whole
        // periods at 1 kHz, a clock so fast that its tick adds nothing; tolerance: the check values' last digit.
        double gateS = (timestamps - 1) / 1000.0;
        double pi = ResolutionModel.ReciprocalSigmaHz(1000, 1, 1e-6, 1e12, gateS);
        double omega = ResolutionModel.RegressionSigmaHz(1000, 1, 1e-6, 1e12, gateS);
        Assert.Equal(ratio, pi * pi / (omega * omega), ratio * 5e-4);
    }

    [Fact]
    public void Counting_the_beat_note_gains_as_the_two_variances_say()
    {
        // From the same two variances with the gate fixed (docs/references.md; hardware-notes/timestamp-methods.md "Which
        // signal to count"): the reciprocal's sigma is f sqrt(2) sigma_x / T, so the beat note gains f_search / f_beat; the
        // regression's is about sqrt(12) sigma_x f / (T^1.5 sqrt(f)), so it gains sqrt(f_search / f_beat). Derived; 100 kHz
        // against 1 kHz over a 1 s gate: 100 and 10, to 0.5 % (the large-N form of the regression).
        PlanReport report = PlanBuilder.Build(new PlanInputs
        {
            SearchHz = 100_000,
            BeatHz = 1_000,
            GateS = 1.0,
            GatesS = new[] { 1.0 },
            Methods = new[] { JitterOnly, new TimestampPreset("custom-reads", CaptureKind.Snapshots, 0, 1e12, 1000, 1e9, "test") },
        });
        Assert.Equal(100, report.BeatGains.Single(g => g.Estimator == PlanEstimators.Reciprocal).Gain, 100 * 5e-3);
        Assert.Equal(10, report.BeatGains.Single(g => g.Estimator == PlanEstimators.Regression).Gain, 10 * 5e-3);

        // Pulse-counter reads limited by whole counts gain nothing (hardware-notes/timestamp-methods.md): exactly 1 here,
        // where the reads carry no timing error.
        Assert.Equal(1, report.BeatGains.Single(g => g.Estimator == PlanEstimators.SnapshotRegression).Gain, 1e-12);
    }

    [Fact]
    public void Snapshot_resolution_is_about_one_over_T_root_M_from_whole_counts()
    {
        // hardware-notes/timestamp-methods.md: "about 1 / (T sqrt(M)) Hz for M snapshots in the gate": T = 1 s, M = 1000
        // reads, about 0.03 Hz; the exact least-squares figure with 1/12 count^2 per read is sqrt(12 / 12) R / sqrt(M (M^2 - 1))
        // = 1000 / sqrt(1001 x 1001^2 - 1001), 0.0316 Hz at 1001 reads, within 1 %.
        double sigma = ResolutionModel.SnapshotSigmaHz(100_000, 1000, 0, 1e12, 1.0);
        Assert.Equal(1 / Math.Sqrt(1000), sigma, 0.01 / Math.Sqrt(1000));
    }
}
