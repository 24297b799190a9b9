using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Planning;

/// <summary>
/// The three timestamp methods of hardware-notes/timestamp-methods.md as <c>plan</c> presets. Where the figures come from
/// is given per preset; the table "Presets of plan" on that page shows the same numbers (PlanPresetTableTests).
/// </summary>
public static class TimestampPresets
{
    /// <summary>Name of the pin-interrupt method stamped in software.</summary>
    public const string PinEvent = "pin-event";

    /// <summary>Name of the hardware pulse counter read on a timer.</summary>
    public const string PulseCounter = "pulse-counter";

    /// <summary>Name of the hardware edge-capture peripheral.</summary>
    public const string EdgeCapture = "edge-capture";

    /// <summary>Name of the method given by the custom options.</summary>
    public const string Custom = "custom";

    /// <summary>The preset names in the order they are printed.</summary>
    public static IReadOnlyList<string> Names { get; } = new[] { PinEvent, PulseCounter, EdgeCapture };

    /// <summary>
    /// Fresh preset objects (nothing here is shared or mutable):
    /// <list type="bullet">
    /// <item>pin-event: the handler stamps the edge with the 1 us timer; jitter "hundreds of microseconds to milliseconds",
    /// 0.5 ms rms as the page's own budget example; "a few thousand events per second at most (half of them the falling
    /// edges)": 2000 recorded (rising) edges a second.</item>
    /// <item>pulse-counter: reads stamped in whole microseconds; read jitter 1 us rms (the simulator's default
    /// read_jitter_s); "an honest 100 reads a second"; the counter takes "up to MHz rates": 1e6 input edges a second.</item>
    /// <item>edge-capture: 12.5 ns ticks (80 MHz), quantisation only (jitter 0, as the simulator's input_capture); its
    /// edge rate is not documented for a continuous carrier: 1e5 recorded edges a second is an assumption (no source),
    /// and the device budget decides first.</item>
    /// </list>
    /// </summary>
    public static IReadOnlyList<TimestampPreset> All() => new[]
    {
        new TimestampPreset(PinEvent, CaptureKind.Edges, 0.5e-3, 1e6, 0, 2000, "pin interrupt, edge stamped in software with the 1 us timer"),
        new TimestampPreset(PulseCounter, CaptureKind.Snapshots, 1e-6, 1e6, 100, 1e6, "hardware pulse counter read on deadlines of the 1 us timer"),
        new TimestampPreset(EdgeCapture, CaptureKind.Edges, 0, 80e6, 0, 1e5, "hardware edge-capture peripheral, 12.5 ns ticks"),
    };

    /// <summary>The preset of that name (case-insensitive), or false.</summary>
    public static bool TryGet(string name, out TimestampPreset? preset)
    {
        preset = All().FirstOrDefault(p => string.Equals(p.Name, name, StringComparison.OrdinalIgnoreCase));
        return preset is not null;
    }
}
