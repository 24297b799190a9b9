using System.Device.Gpio;
using System.Threading;
using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Readout;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// Entry point for a classic ESP32: the conditioned search oscillator (or beat note) on GPIO 26 through the
    /// hardware pulse counter, the re-baseline button on GPIO 0 (the BOOT button of most boards), a 20x4 I2C character
    /// LCD on GPIO 21 (SDA) and 22 (SCL). Wiring: hardware-notes/build-and-flash.md.
    /// <para>
    /// Pacing: a read is taken every <see cref="ReadPeriodMicroseconds"/> on deadlines of <c>HighResTimer.GetCurrent()</c>
    /// (whole microseconds, the pulse counter's own time base) kept by <see cref="ReadPacer"/>, not on
    /// <c>Thread.Sleep(1)</c>, which lasts a whole 10 ms system tick on nanoFramework. While the next deadline is at most
    /// <see cref="LoopSleep.SleepAboveMicroseconds"/> away the loop yields with <c>Thread.Sleep(0)</c> and looks again, so
    /// other threads (the link writer) run but the read is late by at most one pass of theirs; only when the deadline is
    /// further away than a tick and a margin does it sleep, ending at least one tick before the deadline (a sleep can
    /// overrun by up to a tick; <see cref="LoopSleep"/>). With the 2 ms period the loop never sleeps: the CPU spins,
    /// which is the price of reading on time; a longer period (a slow gate, battery saving) lets it sleep.
    /// </para>
    /// <para>
    /// The period is a target, not a promise: the counted per-read and per-gate costs in hardware-notes/device-budget.md
    /// (estimates until a board measures them) say a snapshot step costs more than 2 ms. When a step overruns, the pacer
    /// reads again at once, restarts its schedule and counts the deadlines missed; the health line shows the real rate.
    /// </para>
    /// <para>
    /// Health: every <see cref="HealthIntervalMicroseconds"/> row 4 of the LCD shows reads a second, stalls (gaps
    /// between reads over <see cref="StallLimitMicroseconds"/>), skipped deadlines and the longest gap in ms, for the
    /// board check in hardware-notes/build-and-flash.md.
    /// </para>
    /// </summary>
    public static class Program
    {
        /// <summary>Time between pulse-counter reads, us (500 reads a second; 100 snapshots per 0.2 s gate).</summary>
        public const long ReadPeriodMicroseconds = 2000;

        /// <summary>A gap between reads longer than this is a stall, us: a full LCD rewrite (about 25 ms) is one.</summary>
        public const long StallLimitMicroseconds = 20000;

        /// <summary>Time between health lines on the LCD, us.</summary>
        public const long HealthIntervalMicroseconds = 5000000;

        /// <summary>Starts the readout and runs it for ever.</summary>
        public static void Main()
        {
            // Read jitter: the native read takes the count, then the time, in two calls a few us apart, and an
            // interrupt between them adds more: 2 us rms is an estimate until a board measures it.
            var counterSettings = new CounterSettings { ClockHz = PulseCounterPort.ClockHz, GateSeconds = 0.2, JitterTicks = 2 };
            var settings = new DeviceSettings(counterSettings, new ReadoutSettings()) { Input = InputKind.Snapshots, TimerBits = 64, CountBits = 64 };
            var gpio = new GpioController();
            var display = new I2cCharacterLcd(21, 22, I2cCharacterLcd.Pcf8574Address, 20, 4);
            var loop = new DeviceLoop(settings, new PulseCounterPort(26), display, new GpioButtons(gpio, 0, -1));
            var pacer = new ReadPacer(ReadPeriodMicroseconds, StallLimitMicroseconds);
            long healthDue = (long)HighResTimer.GetCurrent() + HealthIntervalMicroseconds;
            long healthReads = 0;
            while (true)
            {
                long now = (long)HighResTimer.GetCurrent();
                long wait = pacer.MicrosecondsUntilDue(now);
                if (wait == 0)
                {
                    pacer.Taken(now);
                    loop.Step();
                    if (now >= healthDue)
                    {
                        ShowHealth(display, pacer, pacer.Reads - healthReads);
                        healthReads = pacer.Reads;
                        healthDue = now + HealthIntervalMicroseconds;
                    }
                }
                else
                {
                    Thread.Sleep(LoopSleep.MillisecondsToSleep(wait));
                }
            }
        }

        private static void ShowHealth(I2cCharacterLcd display, ReadPacer pacer, long readsInInterval)
        {
            // A few strings every 5 s, never per read.
            long readsPerSecond = readsInInterval * 1000000 / HealthIntervalMicroseconds;
            display.TryShowFooter("r" + readsPerSecond.ToString() + " s" + pacer.Stalls.ToString() + " m" + pacer.MissedDeadlines.ToString() + " g" + (pacer.LongestGapMicroseconds / 1000).ToString());
        }
    }
}
