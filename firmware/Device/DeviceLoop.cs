using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Firmware.Link;
using FreqReadout.Firmware.Ports;
using FreqReadout.Readout;
using FreqReadout.Settings;

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
        private EdgeCounter edgeCounter;
        private SnapshotCounter snapshotCounter;
        private ReadoutPipeline pipeline;
        private readonly GateResult gate;
        private readonly Reading reading;
        private readonly ReadPacer pacer;
        private readonly WrapStraddleFilter straddle;
        private readonly DeviceLinkStreamer link;
        private readonly LinkInbox inbox;
        private readonly DetectionEvent linkEvent;
        private readonly long statusIntervalTicks;
        private readonly long headerIntervalTicks;
        private bool hasReading;
        private bool linkStarted;
        private long firstTick;
        private long latestTick;
        private long nextStatusTick;
        private long nextHeaderTick;
        private long reads;
        private uint settingsCheck;
        private string settingsToStore;
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
            : this(settings, edges, null, clock, display, buttons, null, null)
        {
        }

        /// <summary>A loop over timestamped edges that streams them, its readings and events to the PC.</summary>
        public DeviceLoop(DeviceSettings settings, IEdgeSource edges, IClockPort clock, IDisplayPort display, IButtonPort buttons, DeviceLinkStreamer link, LinkInbox inbox)
            : this(settings, edges, null, clock, display, buttons, link, inbox)
        {
        }

        /// <summary>A loop over pulse-counter snapshots, one read per <see cref="Step"/> (no pacing).</summary>
        public DeviceLoop(DeviceSettings settings, IPulseCounterPort pulseCounter, IDisplayPort display, IButtonPort buttons)
            : this(settings, null, pulseCounter, null, display, buttons, null, null)
        {
        }

        /// <summary>
        /// A loop over pulse-counter snapshots. With a <paramref name="clock"/> (the counter's own time base, 64-bit, at the
        /// counter settings' clock) it is paced: a <see cref="Step"/> reads only when a read is due
        /// (<see cref="DeviceSettings.ReadRateHz"/>), and stalls and missed deadlines are counted; without one, every
        /// <see cref="Step"/> reads. With a <paramref name="link"/> (and its <paramref name="inbox"/>; either may be null)
        /// every read, reading and event, a status frame and the capture header go to the PC.
        /// </summary>
        public DeviceLoop(DeviceSettings settings, IPulseCounterPort pulseCounter, IClockPort clock, IDisplayPort display, IButtonPort buttons, DeviceLinkStreamer link, LinkInbox inbox)
            : this(settings, null, pulseCounter, clock, display, buttons, link, inbox)
        {
        }

        private DeviceLoop(DeviceSettings settings, IEdgeSource edges, IPulseCounterPort pulseCounter, IClockPort clock, IDisplayPort display, IButtonPort buttons, DeviceLinkStreamer link, LinkInbox inbox)
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

            if (edges != null && settings.Input != InputKind.Edges)
            {
                throw new System.ArgumentException("settings.Input must be Edges for an edge source");
            }

            if (pulseCounter != null && settings.Input != InputKind.Snapshots)
            {
                throw new System.ArgumentException("settings.Input must be Snapshots for a pulse counter");
            }

            if (pulseCounter != null && clock != null && settings.TimerBits != 64)
            {
                throw new System.ArgumentException("a paced pulse-counter loop needs timer bits 64 (the clock is read unwrapped)");
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
            double clockHz = settings.Counter.ClockHz;
            if (pulseCounter != null && clock != null)
            {
                long period = (long)(clockHz / settings.ReadRateHz + 0.5);
                pacer = new ReadPacer(period, (long)(settings.StallLimitMilliseconds * 0.001 * clockHz + 0.5));
            }

            if (pulseCounter != null && settings.CountWrapSpan > 0)
            {
                straddle = new WrapStraddleFilter(settings.CountWrapSpan);
            }

            this.link = link;
            this.inbox = inbox;
            if (settings.SettingsText == null)
            {
                settings.TryDescribeInForce();
            }

            if (settings.SettingsText != null)
            {
                settingsCheck = SettingsCheck(settings.SettingsText);
            }
            if (link != null)
            {
                linkEvent = new DetectionEvent();
                statusIntervalTicks = (long)(settings.StatusIntervalSeconds * clockHz + 0.5);
                headerIntervalTicks = (long)(settings.HeaderIntervalSeconds * clockHz + 0.5);
            }
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

        /// <summary>Reads of the pulse counter (or edges) taken.</summary>
        public long Reads
        {
            get { return reads; }
        }

        /// <summary>The read pacer (stalls, missed deadlines, longest gap); null when the loop is not paced. It runs on the clock's ticks: its "microseconds" are ticks of the counter settings' clock (whole microseconds on a board, 1 MHz); the status frame converts.</summary>
        public ReadPacer Pacer
        {
            get { return pacer; }
        }

        /// <summary>The wrap mending of pulse-counter reads; null when <see cref="DeviceSettings.CountWrapSpan"/> is 0.</summary>
        public WrapStraddleFilter Straddle
        {
            get { return straddle; }
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

        /// <summary>Takes the oldest finished detection event into a caller-owned object, if any (with a link, events go to the PC instead and none are left here).</summary>
        public bool TryTakeEvent(DetectionEvent into)
        {
            return pipeline.TryTakeEvent(into);
        }

        /// <summary>
        /// One pass of the loop. Returns the number of gates that closed in this pass. A paced loop returns 0 at once when
        /// no read is due (<see cref="MicrosecondsUntilDue"/> says how long to wait).
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

            int closed = edges != null ? StepEdges() : StepSnapshot();
            if (link != null)
            {
                ServiceLink();
            }

            return closed;
        }

        /// <summary>
        /// A paced loop: how long until the next read is due, in ticks of the clock (µs on a board); 0 when due now or
        /// when the loop is not paced or the clock cannot be read. A board sleeps only when this is well over its 10 ms tick.
        /// </summary>
        public long TicksUntilDue()
        {
            ulong now;
            if (pacer == null || !clock.TryReadNow(out now))
            {
                return 0;
            }

            return pacer.MicrosecondsUntilDue((long)now);
        }

        /// <summary>With a link: queues the batches of reads gathered so far (before the loop stops).</summary>
        public void FlushLink()
        {
            if (link != null)
            {
                link.Flush();
            }
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
                reads++;
                if (!timeUnwrapper.TryUnwrap(raw, out tick))
                {
                    rejectedTicks++;
                    continue;
                }

                NoteTick(tick);
                if (link != null && settings.Link == LinkMode.Capture)
                {
                    link.AddEdge(tick);
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
            if (pacer != null)
            {
                ulong now;
                if (!clock.TryReadNow(out now) || !pacer.IsDue((long)now))
                {
                    return 0;
                }

                pacer.Taken((long)now);
            }

            ulong rawCount;
            ulong rawTime;
            if (!pulseCounter.TryReadSnapshot(out rawCount, out rawTime))
            {
                return 0;
            }

            reads++;
            if (straddle != null)
            {
                long mended;
                if (!straddle.TryAccept((long)rawCount, out mended))
                {
                    return 0;
                }

                rawCount = (ulong)mended;
            }

            long tick;
            long count;
            if (!timeUnwrapper.TryUnwrap(rawTime, out tick) || !countUnwrapper.TryUnwrap(rawCount, out count))
            {
                rejectedTicks++;
                return 0;
            }

            NoteTick(tick);
            if (link != null && settings.Link == LinkMode.Capture)
            {
                link.AddSnapshot(tick, count);
            }

            if (snapshotCounter.AddSnapshot(tick, count, gate))
            {
                Publish();
                return 1;
            }

            return 0;
        }

        private void NoteTick(long tick)
        {
            if (!linkStarted)
            {
                linkStarted = true;
                firstTick = tick;
                nextStatusTick = tick + statusIntervalTicks;
                nextHeaderTick = tick + headerIntervalTicks;
                if (link != null && settings.Link != LinkMode.Off)
                {
                    link.SendHeader();
                    if (settings.SettingsText != null)
                    {
                        link.SendSettings(settings.SettingsText);
                    }
                }
            }

            latestTick = tick;
        }

        private void ServiceLink()
        {
            if (inbox != null)
            {
                string text;
                if (inbox.TryTakeSettings(out text))
                {
                    ApplySettingsText(text);
                }

                if (inbox.TryTakeRequest(FreqReadout.Link.LinkFrameType.CaptureHeader))
                {
                    link.Flush();
                    link.SendHeader();
                }

                if (inbox.TryTakeRequest(FreqReadout.Link.LinkFrameType.Settings) && settings.SettingsText != null)
                {
                    link.SendSettings(settings.SettingsText);
                }

                if (inbox.TryTakeRequest(FreqReadout.Link.LinkFrameType.Status))
                {
                    SendStatus();
                }
            }

            if (!linkStarted || settings.Link == LinkMode.Off)
            {
                return;
            }

            if (latestTick >= nextHeaderTick)
            {
                nextHeaderTick = latestTick + headerIntervalTicks;
                link.Flush();
                link.SendHeader();
            }

            if (latestTick >= nextStatusTick)
            {
                nextStatusTick = latestTick + statusIntervalTicks;
                SendStatus();
            }
        }

        /// <summary>
        /// Puts a settings text (docs/settings-format.md) in force now, as the PC's settings frame does: bad values fall
        /// back to their defaults and are counted in the status frame; a text without the magic line changes nothing.
        /// The counter and the readout start afresh (a new baseline), the unwrapped time and count go on, and with a link
        /// the settings now in force and a status frame go to the PC at once. Allocates (rare).
        /// </summary>
        /// <returns>True when the text's values are in force.</returns>
        public bool ApplySettingsText(string text)
        {
            bool applied = settings.TryApplyText(text, null);
            string error;
            if (applied && settings.TryValidate(out error))
            {
                if (edges != null)
                {
                    edgeCounter = new EdgeCounter(settings.Counter);
                }
                else
                {
                    snapshotCounter = new SnapshotCounter(settings.Counter);
                }

                pipeline = new ReadoutPipeline(settings.Readout);
                pipeline.SetHold(lastHold);
                if (pacer != null)
                {
                    double clockHz = settings.Counter.ClockHz;
                    pacer.Change((long)(clockHz / settings.ReadRateHz + 0.5), (long)(settings.StallLimitMilliseconds * 0.001 * clockHz + 0.5));
                }

                settingsCheck = settings.SettingsText != null ? SettingsCheck(settings.SettingsText) : 0;
                settingsToStore = settings.SettingsText;
            }
            else
            {
                applied = false;
            }

            if (link != null)
            {
                if (applied)
                {
                    // The capture's metadata follows the signal settings: a changed header starts a new capture on the PC.
                    FreqReadout.Link.CaptureHeaderPayload header = link.Header;
                    header.Signal = settings.Readout.Signal;
                    header.BeatSide = settings.Readout.BeatSide;
                    header.SearchHz = settings.Readout.SearchHz;
                    link.Flush();
                    link.SendHeader();
                }

                if (settings.SettingsText != null)
                {
                    link.SendSettings(settings.SettingsText);
                }

                SendStatus();
            }

            return applied;
        }

        /// <summary>
        /// A new temperature sample from the board's sensor, deg C: the pipeline's tempco uses it from the next gate, and
        /// with link = capture it goes to the PC as a temperature frame after the reads so far (the capture's temp_c).
        /// </summary>
        public void SetTemperature(double celsius)
        {
            pipeline.SetTemperature(celsius);
            if (link != null && linkStarted && settings.Link == LinkMode.Capture)
            {
                link.SendTemperature(latestTick, celsius);
            }
        }

        /// <summary>Takes the settings text put in force since the last call, for the board to store; false when none.</summary>
        public bool TryTakeSettingsToStore(out string text)
        {
            text = settingsToStore;
            settingsToStore = null;
            return text != null;
        }

        private void SendStatus()
        {
            FreqReadout.Link.StatusPayload status = link.Status;
            status.BootId = settings.BootId;
            status.UptimeMicroseconds = (long)((latestTick - firstTick) * (1e6 / settings.Counter.ClockHz));
            status.Reads = reads;
            status.ReadsDropped = straddle != null ? straddle.Dropped : 0;
            status.WrapsMended = straddle != null ? straddle.Mended : 0;
            status.Stalls = pacer != null ? pacer.Stalls : 0;
            status.LongestGapMicroseconds = pacer != null ? (long)(pacer.LongestGapMicroseconds * (1e6 / settings.Counter.ClockHz)) : 0;
            status.MissedDeadlines = pacer != null ? pacer.MissedDeadlines : 0;
            status.FramesLost = link.Queue.FramesLost;
            status.RejectedTicks = rejectedTicks;
            status.SettingsCheck = settingsCheck;
            status.SettingsProblems = settings.SettingsProblems;
            status.HoldActive = lastHold || pipeline.HoldActive;
            link.Flush();
            link.SendStatus();
        }

        private static uint SettingsCheck(string text)
        {
            byte[] bytes = new byte[text.Length];
            for (int i = 0; i < text.Length; i++)
            {
                bytes[i] = (byte)text[i];
            }

            return FreqReadout.Link.FrameCrc.Compute(bytes, 0, bytes.Length);
        }

        private void Publish()
        {
            gates++;
            pipeline.Process(gate, reading);
            hasReading = true;
            if (link != null && settings.Link != LinkMode.Off)
            {
                link.SendReading(reading);
                if (pipeline.TryTakeEvent(linkEvent))
                {
                    link.SendEvent(linkEvent);    // at most one a gate; more wait in the pipeline's queue for the next gates
                }
            }

            bool changed = !shown || reading.State != lastShownState || reading.Class != lastShownClass;
            if (changed || reading.TimeSeconds - lastShownSeconds >= settings.DisplayIntervalSeconds)
            {
                shown = true;
                lastShownSeconds = reading.TimeSeconds;
                lastShownState = reading.State;
                lastShownClass = reading.Class;
                displayUpdates++;
                display.Show(DisplayText.FrequencyLine(reading, display.LineWidth), DisplayText.ShiftLine(reading, display.LineWidth), DisplayText.StatusLine(reading, display.LineWidth));
            }
        }
    }
}
