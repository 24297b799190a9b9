namespace FreqReadout.Host.Simulation;

/// <summary>
/// Scene: mains pickup (JSON object <c>mains</c>): a readout used near live wiring sees the search oscillator frequency
/// modulated at the mains frequency. The search frequency is multiplied by
/// 1 + deviation_ppm 1e-6 sin(2 pi frequency_hz t + phase_deg pi / 180). It is evaluated at the control steps like the rest
/// of the slow parts (linear in between), so <c>hardware.control_step_s</c> must be at most 1 / (16 frequency_hz): the
/// phase integrated over a step of a piecewise-linear sinusoid with N steps per cycle is (theta/2) cot(theta/2), theta =
/// 2 pi / N, times the true one, at most 1.3 % (about theta^2 / 12) too small for N = 16 (the default 1 ms step serves 50 and
/// 60 Hz). The reference oscillator of beat mode is not
/// modulated (the beat carries the search oscillator's modulation).
/// </summary>
public sealed class SceneMains
{
    /// <summary>Peak frequency deviation of the search oscillator, ppm, [0, 10000]; 0 = no pickup (default).</summary>
    public double DeviationPpm { get; set; }

    /// <summary>Modulation frequency, Hz, [1, 1000]. Default 50 (60 where the mains runs at 60 Hz).</summary>
    public double FrequencyHz { get; set; } = 50.0;

    /// <summary>Phase of the modulation at t = 0, degrees. Default 0.</summary>
    public double PhaseDeg { get; set; }

    /// <summary>Fractional frequency change at time t: deviation_ppm 1e-6 sin(2 pi f t + phase); 0 when the deviation is 0.</summary>
    public double FractionAt(double timeS)
    {
        if (DeviationPpm == 0)
        {
            return 0.0;
        }

        return DeviationPpm * 1e-6 * Math.Sin((2.0 * Math.PI * FrequencyHz * timeS) + (PhaseDeg * Math.PI / 180.0));
    }
}
