namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: the search oscillator (JSON object <c>oscillator</c>). Give either <see cref="FrequencyHz"/> (the tuning
/// capacitance follows) or <see cref="TuningCapacitanceNf"/> (the frequency follows). The tempco is either given directly
/// (<see cref="TempcoPpmPerK"/>) or derived from the parts: df/f per K = -(alpha_L + alpha_C)/2.
/// </summary>
public sealed class SceneOscillator
{
    /// <summary>The operating frequency when neither it nor the tuning capacitance is given, Hz.</summary>
    public const double DefaultFrequencyHz = 100_000;

    /// <summary>Nominal operating frequency at <see cref="NominalTemperatureC"/>, no target, Hz; null when the capacitance is given (or neither, meaning <see cref="DefaultFrequencyHz"/>).</summary>
    public double? FrequencyHz { get; set; }

    /// <summary>Tuning capacitance, nF; null when the frequency is given.</summary>
    public double? TuningCapacitanceNf { get; set; }

    /// <summary>
    /// The operating frequency to use, Hz: <see cref="FrequencyHz"/> when given, <see cref="DefaultFrequencyHz"/> when neither
    /// it nor <see cref="TuningCapacitanceNf"/> is given, null when the capacitance sets the frequency.
    /// </summary>
    public double? FrequencyOrDefaultHz() => FrequencyHz ?? (TuningCapacitanceNf.HasValue ? null : DefaultFrequencyHz);

    /// <summary>Frequency tempco, ppm/K; null = derived from the parts.</summary>
    public double? TempcoPpmPerK { get; set; }

    /// <summary>Capacitor dielectric for the derived tempco. Default C0G.</summary>
    public CapacitorDielectric Capacitor { get; set; } = CapacitorDielectric.C0g;

    /// <summary>Capacitor tempco, ppm/K: required for custom, else overrides the class's nominal value.</summary>
    public double? CapacitorPpmPerK { get; set; }

    /// <summary>Coil inductance tempco, ppm/K (copper expansion 16.5 by default).</summary>
    public double CoilPpmPerK { get; set; } = Tempco.CopperExpansionPpmPerK;

    /// <summary>Temperature at which the oscillator runs at its nominal frequency, deg C. Default 20.</summary>
    public double NominalTemperatureC { get; set; } = 20.0;

    /// <summary>White frequency noise as its Allan deviation at 1 s (sigma_y(tau) = this / sqrt(tau)). Default 2e-8.</summary>
    [System.Text.Json.Serialization.JsonPropertyName("white_fm_adev_1s")]
    public double WhiteFmAdev1s { get; set; } = 2e-8;

    /// <summary>Flicker-like frequency noise floor (approximate Allan deviation, sum of Gauss-Markov processes). Default 5e-9.</summary>
    public double FlickerAdev { get; set; } = 5e-9;
}
