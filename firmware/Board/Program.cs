using System;
using System.Device.Gpio;
using System.Threading;
using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Link;
using FreqReadout.Link;
using FreqReadout.Readout;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// Entry point for a classic ESP32: the conditioned search oscillator (or beat note) on GPIO 26 through the
    /// hardware pulse counter, the button on GPIO 0 (the BOOT button of most boards: a short press re-baselines, a long one toggles hold), a 20x4 I2C character
    /// LCD on GPIO 21 (SDA) and 22 (SCL), the link to the PC on COM2 (TX GPIO 17, RX GPIO 16, 921600 baud) through a
    /// USB-UART adapter, a piezo buzzer on GPIO 25 (PWM), an optional TMP102 on the LCD's I2C bus, settings and a boot
    /// counter in the internal flash's file system. Wiring: hardware-notes/build-and-flash.md and hardware-notes/peripherals.md.
    /// <para>
    /// Pacing: the device loop reads the pulse counter on deadlines of <c>HighResTimer.GetCurrent()</c> (whole
    /// microseconds, the pulse counter's own time base; <see cref="HighResClockPort"/>) at the settings' read_rate_hz
    /// (default 1000), not on <c>Thread.Sleep(1)</c>, which lasts a whole 10 ms system tick on nanoFramework. While the
    /// next deadline is at most <see cref="LoopSleep.SleepAboveMicroseconds"/> away the loop yields with
    /// <c>Thread.Sleep(0)</c> and looks again, so the link's writer thread runs but a read is late by at most one pass of
    /// it; only when the deadline is further away than a tick and a margin does it sleep (<see cref="LoopSleep"/>).
    /// </para>
    /// <para>
    /// The rate is a target, not a promise: the counted per-read and per-gate costs in hardware-notes/device-budget.md
    /// (estimates until a board measures them) may exceed a 1 ms period. When a step overruns, the pacer reads again at
    /// once, restarts its schedule and counts the deadlines missed; the status frame and row 4 of the LCD show it.
    /// </para>
    /// <para>
    /// Link: the loop queues frames (<see cref="LinkSendQueue"/>); a writer thread of its own sends them on the serial
    /// port, which blocks while the UART drains, and hands what the PC sent (settings, requests) back through the
    /// <see cref="LinkInbox"/>. A full queue drops frames and counts them; the readout never waits for the port.
    /// </para>
    /// </summary>
    public static class Program
    {
        /// <summary>Frames the send queue holds: at 1000 reads a second a batch of 64 reads leaves every 64 ms, so 32 slots ride out a 1 s hold-up of the port with the readings.</summary>
        public const int SendQueueSlots = 32;

        /// <summary>The buzzer's pin (PWM, hardware-notes/peripherals.md).</summary>
        public const int BuzzerPin = 25;

        /// <summary>
        /// A steady alert tone sounded whatever the readings say, Hz; 0 (normal) = off. Set it (e.g. 1500) and deploy only
        /// for the supply-pulling check of hardware-notes/peripherals.md.
        /// </summary>
        public const int ForcedAlertToneHz = 0;

        /// <summary>Time between health lines on the LCD, us.</summary>
        public const long HealthIntervalMicroseconds = 5000000;

        /// <summary>Starts the readout and runs it for ever.</summary>
        public static void Main()
        {
            // Stored settings first, before the loop is built: a bad stored value falls back to its default and is counted
            // (the status frame's settings problems); a missing or unreadable file leaves the defaults (SettingsStorage).
            var storage = new SettingsStorage(new FlashSettingsStore());
            DeviceSettings settings = DefaultSettings();
            if (storage.LoadInto(settings, null) == StoredSettingsResult.Rejected)
            {
                int problems = settings.SettingsProblems;
                settings = DefaultSettings();    // values that together fail the checks: start from the defaults
                settings.SettingsProblems = problems + 1;
            }

            // The stored boot counter, incremented; a number drawn at start when the flash cannot keep it.
            settings.BootId = storage.NextBootId((uint)new Random().Next());

            var gpio = new GpioController();
            var clock = new HighResClockPort();
            var display = new I2cCharacterLcd(21, 22, I2cCharacterLcd.Pcf8574Address, 20, 4);
            var queue = new LinkSendQueue(SendQueueSlots);
            var inbox = new LinkInbox();
            var worker = new LinkPortWorker(new SerialLinkPort("COM2", 17, 16, SerialLinkPort.DefaultBaudRate), queue, inbox);
            var header = new CaptureHeaderPayload
            {
                BootId = settings.BootId,
                Snapshots = true,
                ClockHz = PulseCounterPort.ClockHz,
                Signal = settings.Readout.Signal,
                BeatSide = settings.Readout.BeatSide,
                SearchHz = settings.Readout.SearchHz,
            };
            var loop = new DeviceLoop(settings, new PulseCounterPort(26), clock, display, new GpioButtons(gpio, 0, -1, clock), new DeviceLinkStreamer(queue, header), inbox);
            new Thread(new LinkWriter(worker).Run).Start();
            var buzzer = new PwmBuzzer(BuzzerPin);
            var alert = new AlertPattern { ForcedToneHz = ForcedAlertToneHz };
            // Optional TMP102 beside the oscillator on the LCD's I2C bus (created after the LCD, which routes the pins); a
            // board without one only counts failed polls, once a second.
            var temperature = new TemperaturePoller(new Tmp102Sensor(Tmp102Conversion.DefaultAddress), TemperaturePoller.DefaultIntervalMicroseconds);
            var lastReading = new Reading();    // preallocated: the loop copies its last reading in when a gate closes

            long healthDue = (long)HighResTimer.GetCurrent() + HealthIntervalMicroseconds;
            long healthReads = 0;
            while (true)
            {
                int closed = loop.Step();
                long now = (long)HighResTimer.GetCurrent();
                if (closed > 0 && loop.TryGetLastReading(lastReading))
                {
                    alert.Update(lastReading, now);
                }

                storage.SaveFrom(loop);    // settings the PC sent, once in force: rare, a flash write
                alert.Drive(buzzer, now);    // touches the PWM only when the tone changes (chopping, a new reading)
                double celsius;
                if (temperature.TryPoll(now, out celsius))
                {
                    loop.SetTemperature(celsius);    // tempco and the capture's temp_c
                }

                if (now >= healthDue)
                {
                    ShowHealth(display, loop, loop.Reads - healthReads);
                    healthReads = loop.Reads;
                    healthDue = now + HealthIntervalMicroseconds;
                }

                long wait = loop.TicksUntilDue();
                if (wait > 0)
                {
                    Thread.Sleep(LoopSleep.MillisecondsToSleep(wait));
                }
            }
        }

        private static DeviceSettings DefaultSettings()
        {
            // Read jitter: the native read takes the count, then the time, in two calls a few us apart, and an
            // interrupt between them adds more: 2 us rms is an estimate until a board measures it.
            var counterSettings = new CounterSettings { ClockHz = PulseCounterPort.ClockHz, GateSeconds = 0.2, JitterTicks = 2 };
            return new DeviceSettings(counterSettings, new ReadoutSettings())
            {
                Input = InputKind.Snapshots,
                TimerBits = 64,
                CountBits = 64,
                CountWrapSpan = PulseCounterPort.WrapSpanCounts,
            };
        }

        private static void ShowHealth(I2cCharacterLcd display, DeviceLoop loop, long readsInInterval)
        {
            // A few strings every 5 s, never per read.
            ReadPacer pacer = loop.Pacer;
            long readsPerSecond = readsInInterval * 1000000 / HealthIntervalMicroseconds;
            display.TryShowFooter(DisplayText.HealthLine(readsPerSecond, pacer.Stalls, pacer.MissedDeadlines, pacer.LongestGapMicroseconds, display.LineWidth));
        }
    }
}
