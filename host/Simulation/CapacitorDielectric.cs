namespace FreqReadout.Host.Simulation;

/// <summary>Tuning-capacitor dielectric classes with their nominal temperature coefficient of capacitance.</summary>
public enum CapacitorDielectric
{
    /// <summary>Class 1 ceramic C0G/NP0: 0 +- 30 ppm/K (EIA-198); nominal 0.</summary>
    C0g,

    /// <summary>Polystyrene film: about -125 ppm/K (secondary sources).</summary>
    Polystyrene,

    /// <summary>A coefficient given by the user.</summary>
    Custom,
}
