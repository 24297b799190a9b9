using FreqReadout.Host.Planning;
using FreqReadout.Host.Simulation;

namespace FreqReadout.Tests.Planning;

/// <summary>
/// <see cref="DepthModel.GateShiftHz"/> when the coil travels far in one gate. Expected values by definition of the
/// reciprocal counter's reading (the mean of the shift over the ground covered in the gate): a gate far longer than the
/// pass holds the whole pass (or splits it now and then), so its largest reading is the integral of the shift along the
/// line over the travel, here computed independently by the trapezoidal rule on a finer grid. A faster sweep then reads
/// proportionally less, never nothing.
/// </summary>
public sealed class DepthModelLongGateTests
{
    private static DepthModel Model(double speedMPerS)
    {
        var coil = new SearchCoil(20, 0.2, 0.01, 0.01, 0.0005);
        Assert.True(MaterialPresets.TryGet("copper", null, out Material copper));
        var polarizability = SpherePolarizability.PolarizabilityM3(0.2, copper.ConductivitySPerM, copper.RelativePermeability, 100_000);
        return new DepthModel(coil, coil.WheelerInductanceH, 100_000, polarizability, 0.05, speedMPerS);
    }

    [Theory]
    [InlineData(5.0)]
    [InlineData(20.0)]
    public void A_gate_longer_than_the_pass_reads_the_shift_integral_over_the_travel(double speedMPerS)
    {
        const double depthM = 0.3;
        DepthModel model = Model(speedMPerS);
        double reach = 3.0 * (0.1 + 0.05 + depthM); // the stretch the model takes the shift over (the coil's mean radius is 0.1 m)
        const int n = 20_000;
        double integral = 0;
        for (int i = 0; i <= n; i++)
        {
            double x = -reach + (2.0 * reach * i / n);
            integral += (i == 0 || i == n ? 0.5 : 1.0) * model.ShiftHz(depthM, x) * (2.0 * reach / n);
        }

        double travel = speedMPerS * 1.0;
        double reading = model.GateShiftHz(depthM, 1.0, PlanEstimators.Reciprocal);
        // A gate boundary falls inside the pass for a fraction (pass width / travel) of the phases: then the larger part
        // is read. So the average lies between integral / travel and a little less; 2 * reach / travel bounds that fraction.
        double expected = integral / travel;
        Assert.True(reading != 0, "a long gate still reads the pass");
        Assert.InRange(Math.Abs(reading), Math.Abs(expected) * (1 - (2.0 * reach / travel)) - 1e-9, Math.Abs(expected) * 1.01);
    }

    [Fact]
    public void Doubling_the_speed_of_a_long_gate_halves_its_reading_and_short_gates_are_unchanged()
    {
        double at10 = Model(10).GateShiftHz(0.3, 1.0, PlanEstimators.Reciprocal);
        double at20 = Model(20).GateShiftHz(0.3, 1.0, PlanEstimators.Reciprocal);
        Assert.Equal(0.5, at20 / at10, 0.05);

        // Regression weights over a long gate still read a pass (the parabola's middle is where it counts most).
        Assert.True(Math.Abs(Model(20).GateShiftHz(0.3, 1.0, PlanEstimators.Regression)) > 0);

        // No travel: the instantaneous peak, whatever the estimator.
        DepthModel still = Model(0.5);
        Assert.Equal(still.PeakShiftHz(0.3), still.GateShiftHz(0.3, 0.0, PlanEstimators.Regression), 12);
    }
}
