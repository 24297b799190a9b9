namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: a fixed reference oscillator for beat mode (JSON object <c>reference</c>; its presence makes the counted signal the
/// beat |f_search - f_ref|). <c>beat_side</c> follows from the tuning: above when the nominal search frequency is above
/// the reference.
/// </summary>
public sealed class SceneReference
{
    /// <summary>Nominal reference frequency at its nominal temperature, Hz (&gt; 0).</summary>
    public double FrequencyHz { get; set; }

    /// <summary>Reference tempco, ppm/K. Default 0.</summary>
    public double TempcoPpmPerK { get; set; }

    /// <summary>Temperature at which it runs at its nominal frequency, deg C. Default 20.</summary>
    public double NominalTemperatureC { get; set; } = 20.0;

    /// <summary>The reference's own temperature profile. Default constant 20 deg C.</summary>
    public SceneTemperature Temperature { get; set; } = new();

    /// <summary>White FM Allan deviation at 1 s. Default 2e-8.</summary>
    [System.Text.Json.Serialization.JsonPropertyName("white_fm_adev_1s")]
    public double WhiteFmAdev1s { get; set; } = 2e-8;

    /// <summary>Flicker-like floor. Default 5e-9.</summary>
    public double FlickerAdev { get; set; } = 5e-9;
}
