using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Simulation;

/// <summary>Built-in scenes. All are invented scenarios of our own, for demonstration, never a reference.</summary>
public static class DemoScenes
{
    /// <summary>
    /// Invented scenario: a crew scans a floor screed along a 3 m line for a buried 15 mm copper pipe (across the line), a
    /// small steel fixing and a large steel anchor, while a coil brought in from a cold van warms up (exponential settling
    /// from 12 deg C towards 24 deg C). At the 100 kHz operating frequency the small fixing (sphere-equivalent radius 4.5 mm,
    /// crossover about 290 kHz) reads ferrous, while the large anchor (radius 15 mm, crossover about 26 kHz) is above its
    /// crossover and reads non-ferrous: the sign rule's limit, stated in the truth file.
    /// Edges of the search oscillator divided by 32, stamped by input capture on an 80 MHz 32-bit timer, temp_c about every 0.1 s.
    /// </summary>
    public static Scene FloorScan()
    {
        return new Scene
        {
            Name = "demo-floor-scan",
            Note = "invented scenario: floor screed scan for a copper pipe, a small steel fixing and a large steel anchor while the coil warms up",
            Seed = 20261201,
            StartedUtc = new DateTimeOffset(2026, 11, 30, 7, 30, 0, TimeSpan.Zero),
            Coil = new SceneCoil { Turns = 45, MeanDiameterM = 0.18, WireDiameterM = 0.0005 },
            Oscillator = new SceneOscillator
            {
                FrequencyHz = 100_000,
                Capacitor = CapacitorDielectric.C0g,
                NominalTemperatureC = 20,
                WhiteFmAdev1s = 5e-8,
                FlickerAdev = 2e-8,
            },
            Temperature = new SceneTemperature { Kind = TemperatureProfileKind.Settling, StartC = 12, AmbientC = 24, TimeConstantS = 240 },
            Targets =
            {
                new SceneTarget { Name = "copper pipe", Material = "copper", Shape = TargetShape.Pipe, RadiusM = 0.0075, LengthM = 1.5, DepthM = 0.055, PositionM = 0.8, OffsetM = 0 },
                new SceneTarget { Name = "small steel fixing", Material = "carbon_steel", MuR = 100, RadiusM = 0.0045, DepthM = 0.03, PositionM = 1.6, OffsetM = 0.03 },
                new SceneTarget { Name = "large steel anchor", Material = "carbon_steel", MuR = 100, RadiusM = 0.015, DepthM = 0.13, PositionM = 2.3, OffsetM = -0.05 },
            },
            Sweep = new SceneSweep { StartM = 0, EndM = 3, SpeedMPerS = 0.25, HeightM = 0.02, Passes = 4, PauseS = 3, LeadInS = 20, TailS = 5, Alternate = true },
            Hardware = new SceneHardware
            {
                Kind = CaptureKind.Edges,
                ClockHz = 80e6,
                Prescale = 32,
                TimerBits = 32,
                TimestampMethod = TimestampMethod.InputCapture,
                TempEveryRows = 300,
            },
        };
    }
}
