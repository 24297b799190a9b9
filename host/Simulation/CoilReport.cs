using System.Numerics;

namespace FreqReadout.Host.Simulation;

/// <summary>
/// What <c>freqreadout coil</c> reports: the coil figures and, optionally, one target's expected on-axis shift against distance
/// and its ferrous crossover. Property names become the JSON keys (snake_case with units).
/// </summary>
public sealed class CoilReport
{
    public int Turns { get; set; }
    public double MeanDiameterM { get; set; }
    public double WindingLengthM { get; set; }
    public double WindingDepthM { get; set; }
    public double WireDiameterM { get; set; }
    public double BundleRadiusM { get; set; }
    public double InductanceWheelerUh { get; set; }
    public double InductanceThinLoopUh { get; set; }

    /// <summary>(thin loop - Wheeler) / Wheeler, percent.</summary>
    public double InductanceDifferencePct { get; set; }
    public string InductanceModel { get; set; } = "wheeler";
    public double InductanceUsedUh { get; set; }
    public double FrequencyHz { get; set; }
    public double CapacitanceNf { get; set; }
    public CoilTargetReport? Target { get; set; }

    /// <summary>
    /// Builds the report; <paramref name="depthsM"/> are target-centre depths below the surface, the target on the coil axis and
    /// the coil plane <paramref name="heightM"/> above the surface (distance = height + depth).
    /// </summary>
    public static CoilReport Create(SearchCoil coil, InductanceModel model, double? frequencyHz, double? capacitanceF, Material? material, double radiusM, IReadOnlyList<double> depthsM, double heightM)
    {
        double l = model == Simulation.InductanceModel.ThinLoop ? coil.ThinLoopInductanceH : coil.WheelerInductanceH;
        double f = frequencyHz ?? LcResonance.FrequencyHz(l, capacitanceF!.Value);
        double c = capacitanceF ?? LcResonance.CapacitanceF(l, f);
        var report = new CoilReport
        {
            Turns = coil.Turns,
            MeanDiameterM = coil.MeanDiameterM,
            WindingLengthM = coil.WindingLengthM,
            WindingDepthM = coil.WindingDepthM,
            WireDiameterM = coil.WireDiameterM,
            BundleRadiusM = coil.BundleRadiusM,
            InductanceWheelerUh = coil.WheelerInductanceH * 1e6,
            InductanceThinLoopUh = coil.ThinLoopInductanceH * 1e6,
            InductanceDifferencePct = coil.InductanceRelativeDifference * 100,
            InductanceModel = model == Simulation.InductanceModel.ThinLoop ? "thin_loop" : "wheeler",
            InductanceUsedUh = l * 1e6,
            FrequencyHz = f,
            CapacitanceNf = c * 1e9,
        };
        if (material is null)
        {
            return report;
        }

        Complex n = SpherePolarizability.Normalised(radiusM, material.ConductivitySPerM, material.RelativePermeability, f);
        Complex m = 2 * Math.PI * radiusM * radiusM * radiusM * n;
        double fx = SpherePolarizability.CrossoverFrequencyHz(radiusM, material.ConductivitySPerM, material.RelativePermeability);
        var t = new CoilTargetReport
        {
            Material = material.Name,
            ConductivitySPerM = material.ConductivitySPerM,
            MuR = material.RelativePermeability,
            RadiusM = radiusM,
            SkinDepthM = SpherePolarizability.SkinDepthM(f, material.ConductivitySPerM, material.RelativePermeability),
            PolarizabilityRe = n.Real,
            PolarizabilityIm = n.Imaginary,
            MaterialClass = material.IsFerrous ? "ferrous" : "non-ferrous",
            SignRuleClass = n.Real > 0 ? "ferrous" : "non-ferrous",
            CrossoverHz = double.IsNaN(fx) ? null : fx,
            AboveCrossover = double.IsNaN(fx) ? null : f > fx,
            HeightM = heightM,
        };
        foreach (double depth in depthsM)
        {
            double z = heightM + depth;
            double dl = CoilTargetCoupling.InductanceChangeH(coil, m, 0.0, z);
            double frac = LcResonance.FractionalShift(l, dl);
            t.Table.Add(new CoilShiftRow
            {
                DepthM = depth,
                DistanceM = z,
                DistanceRadii = z / radiusM,
                InductanceChangeNh = dl * 1e9,
                ShiftHz = f * frac,
                ShiftPpm = frac * 1e6,
            });
        }

        report.Target = t;
        return report;
    }
}
