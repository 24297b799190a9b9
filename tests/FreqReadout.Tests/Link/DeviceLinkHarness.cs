using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Link;
using FreqReadout.Firmware.Ports;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Simulation;
using FreqReadout.Link;
using FreqReadout.Readout;
using FreqReadout.Settings;
using FreqReadout.Tests.Simulation;
using Moq;

namespace FreqReadout.Tests.Link;

/// <summary>
/// The device side of the link tests: the device loop (the net10.0 build of the firmware's portable sources) reading a
/// simulated pulse-counter capture through a fake counter, streaming through the send queue and the writer thread's
/// worker into a fake serial port.
/// </summary>
internal sealed class DeviceLinkHarness
{
    private static readonly Lazy<(CaptureMetadata Metadata, List<CaptureRow> Rows)> DemoSnapshots = new(() =>
    {
        // The built-in invented demo scene, simulated as pulse-counter reads every 1 ms on a 32-bit timer at 80 MHz
        // (it wraps every 53.7 s, so the device must unwrap).
        var scene = Scene.Load(Path.Combine(SceneFileTests.RepoRoot(), "host", "Scenes", "demo-floor-scan.json"));
        scene.Hardware.Kind = CaptureKind.Snapshots;
        scene.Hardware.Prescale = 1;
        var simulator = new CaptureSimulator(new SceneModel(scene, "demo-floor-scan.json"));
        var rows = new MemoryCaptureWriter();
        simulator.Run(rows);
        return (simulator.Metadata, rows.Rows);
    });

    public DeviceLinkHarness(uint bootId = 0x5EED0001, int queueSlots = 64, ILinkPort? port = null, LinkMode link = LinkMode.Capture)
    {
        (Metadata, Rows) = DemoSnapshots.Value;
        Port = new MemoryLinkPort();
        Queue = new LinkSendQueue(queueSlots);
        Inbox = new LinkInbox();
        Worker = new LinkPortWorker(port ?? Port, Queue, Inbox);
        var header = new CaptureHeaderPayload
        {
            BootId = bootId,
            Snapshots = true,
            ClockHz = Metadata.ClockHz,
            Prescale = (uint)Metadata.Prescale,
            Signal = Metadata.Signal,
            BeatSide = Metadata.BeatSide,
            SearchHz = Metadata.SearchHz ?? 0,
        };
        Streamer = new DeviceLinkStreamer(Queue, header);
        var counter = new CounterSettings { ClockHz = Metadata.ClockHz, Prescale = Metadata.Prescale, GateSeconds = 0.1 };
        Settings = new DeviceSettings(counter, new ReadoutSettings()) { Input = InputKind.Snapshots, TimerBits = Metadata.TimerBits, CountBits = Metadata.CountBits, BootId = bootId, Link = link };
        Counter = new RowPulseCounter(Rows);
        Loop = new DeviceLoop(Settings, Counter, null, new Mock<IDisplayPort>().Object, new Mock<IButtonPort>().Object, Streamer, Inbox);
    }

    public CaptureMetadata Metadata { get; }

    public List<CaptureRow> Rows { get; }

    /// <summary>The fake serial port the device writes to (unused when another port was given).</summary>
    public MemoryLinkPort Port { get; }

    public LinkSendQueue Queue { get; }

    public LinkInbox Inbox { get; }

    public LinkPortWorker Worker { get; }

    public DeviceLinkStreamer Streamer { get; }

    public DeviceSettings Settings { get; }

    public RowPulseCounter Counter { get; }

    public DeviceLoop Loop { get; }

    /// <summary>Runs the loop for <paramref name="steps"/> reads at most (fewer when the rows run out), then the writer's worker; false when the rows ran out.</summary>
    public bool RunSome(int steps)
    {
        for (int i = 0; i < steps && !Counter.Done; i++)
        {
            Loop.Step();
        }

        Worker.RunOnce();
        return !Counter.Done;
    }

    /// <summary>Runs the loop over every row; the writer's worker runs after every <paramref name="stepsPerDrain"/> steps (0 = never until the end).</summary>
    public void RunAll(int stepsPerDrain)
    {
        int steps = 0;
        while (!Counter.Done)
        {
            Loop.Step();
            if (stepsPerDrain > 0 && ++steps % stepsPerDrain == 0)
            {
                Worker.RunOnce();
            }
        }

        Loop.FlushLink();
        Worker.RunOnce();
    }

    /// <summary>The source capture written as a text file (what replaying "directly" reads).</summary>
    public void WriteSource(string path)
    {
        using var writer = TextCaptureWriter.Create(path, Metadata);
        foreach (CaptureRow row in Rows)
        {
            writer.WriteRow(row);
        }

        writer.Complete(Array.Empty<KeyValuePair<string, string>>());
    }

    /// <summary>The rows' ticks and counts unwrapped at the capture's widths, from 0 at the first row (what the device sends: its unwrappers start at 0).</summary>
    public List<(ulong Tick, ulong Count)> UnwrappedRows()
    {
        var result = new List<(ulong, ulong)>(Rows.Count);
        ulong tickMask = Metadata.TimerBits >= 64 ? ulong.MaxValue : (1UL << Metadata.TimerBits) - 1;
        ulong countMask = Metadata.CountBits >= 64 ? ulong.MaxValue : (1UL << Metadata.CountBits) - 1;
        ulong tick = 0;
        ulong count = 0;
        result.Add((tick, count));
        for (int i = 1; i < Rows.Count; i++)
        {
            tick += (Rows[i].Tick - Rows[i - 1].Tick) & tickMask;
            count += (Rows[i].Count - Rows[i - 1].Count) & countMask;
            result.Add((tick, count));
        }

        return result;
    }
}
