// Board adapter (builds only with -p:FreqReadoutBoard=true, where nanoFramework.Hardware.Esp32 restores).
using System;
using System.Device.Gpio;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The ESP32 hardware pulse counter through nanoFramework's GpioPulseCounter. Read() gives the
    /// cumulative count and a relative time (TimeSpan, 1 us resolution); the time is passed on in
    /// TimeSpan ticks, so the capture's clock_hz is 10 MHz and count_bits is 64.
    /// </summary>
    public sealed class PulseCounterPort : IPulseCounterPort, IDisposable
    {
        /// <summary>Tick rate of the read times, Hz.</summary>
        public const double ClockHz = 10000000.0;

        private readonly GpioPulseCounter counter;

        public PulseCounterPort(int pin)
        {
            counter = new GpioPulseCounter(pin);
            counter.Polarity = GpioPulsePolarity.Rising;
            counter.FilterPulses = 0;
            counter.Start();
        }

        public bool TryReadSnapshot(out ulong count, out ulong timeTicks)
        {
            GpioPulseCount read = counter.Read();
            count = (ulong)read.Count;
            timeTicks = (ulong)read.RelativeTime.Ticks;
            return true;
        }

        public void Dispose()
        {
            counter.Stop();
            counter.Dispose();
        }
    }
}
