using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// The device's main loop, one <see cref="Step"/> at a time: takes the re-baseline button and
    /// hold switch, drains pending edges (or takes one pulse-counter snapshot), unwraps the timer,
    /// counts gates with the shared counting core, runs each gate through the same
    /// <see cref="ReadoutPipeline"/> the host replays, and shows the numbers. The board's entry point
    /// calls <see cref="Step"/> in a loop; the ports are passed in, so the loop runs on the PC in tests.
    /// Per edge and per gate it allocates nothing; only a display refresh (at most every
    /// <see cref="DeviceSettings.DisplayIntervalSeconds"/>, or on a change of state or class) builds strings.
    /// </summary>
    public sealed class DeviceLoop
    {
        private readonly DeviceSettings settings;
        private readonly IEdgeSource edges;
        private readonly IPulseCounterPort pulseCounter;
        private readonly IClockPort clock;
        private readonly IDisplayPort display;
        private readonly IButtonPort buttons;
        private readonly TimerUnwrapper timeUnwrapper;
        private readonly TimerUnwrapper countUnwrapper;
        private readonly EdgeCounter edgeCounter;
        private readonly SnapshotCounter snapshotCounter;
        private readonly ReadoutPipeline pipeline;
        private readonly GateResult gate;
        private readonly Reading reading;
        private bool hasReading;
        private bool lastHold;
        private long gates;
        private long rejectedTicks;
        private long displayUpdates;
        private bool shown;
        private double lastShownSeconds;
        private ReadoutState lastShownState;
        private TargetClass lastShownClass;

        /// <summary>A loop over timestamped edges.</summary>
        public DeviceLoop(DeviceSettings settings, IEdgeSource edges, IClockPort clock, IDisplayPort display, IButtonPort buttons)
            : this(settings, edges, null, clock, display, buttons)
        {
            if (settings.Input != InputKind.Edges)
            {
                throw new System.ArgumentException("settings.Input must be Edges for an edge source");
            }
        }

        /// <summary>A loop over pulse-counter snapshots.</summary>
        public DeviceLoop(DeviceSettings settings, IPulseCounterPort pulseCounter, IDisplayPort display, IButtonPort buttons)
            : this(settings, null, pulseCounter, null, display, buttons)
        {
            if (settings.Input != InputKind.Snapshots)
            {
                throw new System.ArgumentException("settings.Input must be Snapshots for a pulse counter");
            }
        }

        private DeviceLoop(DeviceSettings settings, IEdgeSource edges, IPulseCounterPort pulseCounter, IClockPort clock, IDisplayPort display, IButtonPort buttons)
        {
            if (settings == null)
            {
                throw new System.ArgumentNullException("settings");
            }

            string error;
            if (!settings.TryValidate(out error))
            {
                throw new System.ArgumentException(error);
            }

            if (display == null || buttons == null || (edges == null && pulseCounter == null))
            {
                throw new System.ArgumentNullException("ports");
            }

            this.settings = settings;
            this.edges = edges;
            this.pulseCounter = pulseCounter;
            this.clock = clock;
            this.display = display;
            this.buttons = buttons;
            timeUnwrapper = new TimerUnwrapper(settings.TimerBits);
            if (edges != null)
            {
                edgeCounter = new EdgeCounter(settings.Counter);
            }
            else
            {
                countUnwrapper = new TimerUnwrapper(settings.CountBits, true);
                snapshotCounter = new SnapshotCounter(settings.Counter);
            }

            pipeline = new ReadoutPipeline(settings.Readout);
            gate = new GateResult();
            reading = new Reading();
        }

        /// <summary>Gates counted so far.</summary>
        public long Gates
        {
            get { return gates; }
        }

        /// <summary>Raw timer (or count) values the unwrapper refused (out of range or going backwards).</summary>
        public long RejectedTicks
        {
            get { return rejectedTicks; }
        }

        /// <summary>Times the display was refreshed.</summary>
        public long DisplayUpdates
        {
            get { return displayUpdates; }
        }

        /// <summary>The readout pipeline (baseline, noise, hold state) this loop drives.</summary>
        public ReadoutPipeline Pipeline
        {
            get { return pipeline; }
        }

        /// <summary>Copies the latest reading into a caller-owned object, if any gate has closed yet (unchanged when false is returned).</summary>
        public bool TryGetLastReading(Reading into)
        {
            if (hasReading)
            {
                into.CopyFrom(reading);
            }

            return hasReading;
        }

        /// <summary>Takes the oldest finished detection event into a caller-owned object, if any.</summary>
        public bool TryTakeEvent(DetectionEvent into)
        {
            return pipeline.TryTakeEvent(into);
        }

        /// <summary>
        /// One pass of the loop. Returns the number of gates that closed in this pass.
        /// </summary>
        public int Step()
        {
            if (buttons.TryTakeRebaselinePress())
            {
                pipeline.RequestRebaseline();
            }

            bool hold;
            if (buttons.TryReadHold(out hold) && hold != lastHold)
            {
                lastHold = hold;
                pipeline.SetHold(hold);
            }

            return edges != null ? StepEdges() : StepSnapshot();
        }

        private int StepEdges()
        {
            int closed = 0;
            int taken = 0;
            ulong raw;
            long tick;
            while (taken < settings.MaxEdgesPerStep && edges.TryReadEdge(out raw))
            {
                taken++;
                if (!timeUnwrapper.TryUnwrap(raw, out tick))
                {
                    rejectedTicks++;
                    continue;
                }

                if (edgeCounter.AddEdge(tick, gate))
                {
                    Publish();
                    closed++;
                }
            }

            if (taken == 0 && clock != null && timeUnwrapper.HasValue && clock.TryReadNow(out raw))
            {
                // Unwrap "now" against the last edge without moving the edge unwrapper.
                long now = timeUnwrapper.LastTick + (long)((raw - timeUnwrapper.LastRaw) & timeUnwrapper.MaxRaw);
                if (edgeCounter.Poll(now, gate))
                {
                    Publish();
                    closed++;
                }
            }

            return closed;
        }

        private int StepSnapshot()
        {
            ulong rawCount;
            ulong rawTime;
            if (!pulseCounter.TryReadSnapshot(out rawCount, out rawTime))
            {
                return 0;
            }

            long tick;
            long count;
            if (!timeUnwrapper.TryUnwrap(rawTime, out tick) || !countUnwrapper.TryUnwrap(rawCount, out count))
            {
                rejectedTicks++;
                return 0;
            }

            if (snapshotCounter.AddSnapshot(tick, count, gate))
            {
                Publish();
                return 1;
            }

            return 0;
        }

        private void Publish()
        {
            gates++;
            pipeline.Process(gate, reading);
            hasReading = true;
            bool changed = !shown || reading.State != lastShownState || reading.Class != lastShownClass;
            if (changed || reading.TimeSeconds - lastShownSeconds >= settings.DisplayIntervalSeconds)
            {
                shown = true;
                lastShownSeconds = reading.TimeSeconds;
                lastShownState = reading.State;
                lastShownClass = reading.Class;
                displayUpdates++;
                display.Show(DisplayText.FrequencyLine(reading), DisplayText.ShiftLine(reading), DisplayText.StatusLine(reading));
            }
        }
    }
}
