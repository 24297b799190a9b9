namespace FreqReadout.Host.Simulation;

/// <summary>Oscillator frequency temperature coefficient from its parts: df/f per K = -(alpha_L + alpha_C) / 2.</summary>
public static class Tempco
{
    /// <summary>Copper linear expansion 16.5e-6 /K (CRC, from memory): a copper coil's L rises ~16.5 ppm/K.</summary>
    public const double CopperExpansionPpmPerK = 16.5;

    /// <summary>Nominal temperature coefficient of capacitance, ppm/K: C0G 0, polystyrene -125; custom throws.</summary>
    public static double NominalCapacitorPpmPerK(CapacitorDielectric dielectric)
    {
        return dielectric switch
        {
            CapacitorDielectric.C0g => 0.0,
            CapacitorDielectric.Polystyrene => -125.0,
            _ => throw new ArgumentOutOfRangeException(nameof(dielectric), dielectric, "a custom dielectric needs its ppm/K given"),
        };
    }

    /// <summary>df/f per K, ppm/K: -(alpha_L + alpha_C)/2 with both in ppm/K (e.g. copper coil and C0G: -8.25).</summary>
    public static double FrequencyPpmPerK(double inductancePpmPerK, double capacitancePpmPerK)
    {
        return -(inductancePpmPerK + capacitancePpmPerK) / 2.0;
    }
}
