using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>Scene: the counting hardware and capture (JSON object <c>hardware</c>).</summary>
public sealed class SceneHardware
{
    /// <summary>Edges (one row per recorded edge) or pulse-counter snapshots. Default edges.</summary>
    public CaptureKind Kind { get; set; } = CaptureKind.Edges;

    /// <summary>Nominal timer clock written as clock_hz, Hz. Default 80 MHz (edges); use 1 MHz for snapshots.</summary>
    public double ClockHz { get; set; } = 80e6;

    /// <summary>True clock error against the nominal, ppm (the capture still states the nominal). Default 0.</summary>
    public double ClockErrorPpm { get; set; }

    /// <summary>Input edges per recorded edge, 1..65536 (edges only). Default 1.</summary>
    public int Prescale { get; set; } = 1;

    /// <summary>Timer width: 16, 24, 32 or 64. Default 32.</summary>
    public int TimerBits { get; set; } = 32;

    /// <summary>Pulse-counter width (snapshots): 16, 24, 32 or 64. Default 64.</summary>
    public int CountBits { get; set; } = 64;

    /// <summary>Timestamp method (sets the default jitter). Default input capture.</summary>
    public TimestampMethod TimestampMethod { get; set; } = TimestampMethod.InputCapture;

    /// <summary>Rms timestamp jitter, s; null = the method's default (required for custom).</summary>
    public double? JitterS { get; set; }

    /// <summary>Snapshots: interval between pulse-counter reads, s. Default 0.001.</summary>
    public double SnapshotIntervalS { get; set; } = 0.001;

    /// <summary>
    /// Snapshots: rms mismatch between the instant the count is latched and its time stamp, s (this is what costs accuracy,
    /// about f x this per read; the read schedule itself also wanders by up to +-10 % of the interval, which is harmless).
    /// Default 1e-6 (the driver's 1 us time resolution).
    /// </summary>
    public double ReadJitterS { get; set; } = 1e-6;

    /// <summary>A temp_c sample every this many rows; 0 = no temp_c column. Default 0.</summary>
    public int TempEveryRows { get; set; }

    /// <summary>Temperature sensor resolution, deg C (samples are rounded to it). Default 0.0625.</summary>
    public double TempResolutionC { get; set; } = 0.0625;

    /// <summary>Step at which the slow parts (geometry, drift, flicker) are evaluated, s; the counted frequency is linear between steps. Default 0.001.</summary>
    public double ControlStepS { get; set; } = 0.001;
}
