using System;
using System.Device.Gpio;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The ESP32 hardware pulse counter through nanoFramework's <c>GpioPulseCounter</c> (package
    /// nanoFramework.Hardware.Esp32, namespace System.Device.Gpio). One read gives the cumulative count of rising
    /// edges and the time of the read. Sources: nanoframework/nanoFramework.Hardware.Esp32 tag v1.6.34,
    /// Gpio/GpioPulseCounter.cs and Gpio/GpioPulseCount.cs (managed side); nanoframework/nf-interpreter,
    /// targets/ESP32/_nanoCLR/nanoFramework.Hardware.ESP32/nanoFramework_hardware_esp32_native_System_Device_Gpio_GpioPulseCounter.cpp
    /// (native side, unchanged in that respect from commit f63c5d92a, 2024-05, to a3e8139, 2026-07).
    /// <para>
    /// Time: the native read stores <c>esp_timer_get_time()</c> (whole microseconds since boot, the timer behind
    /// <c>HighResTimer.GetCurrent()</c>) times 10 into <c>RelativeTime</c>'s TimeSpan ticks. This port divides by
    /// 10 and passes microseconds: <see cref="ClockHz"/> is 1 MHz and the time is 64 bits wide.
    /// </para>
    /// <para>
    /// Count: passed on as reported, 64 bits. The unit itself counts 16 bits signed; the driver sets watch points at
    /// +-32767 and adds 32767 to a 64-bit total in the interrupt that fires there (the unit restarts from 0). A read
    /// that races that interrupt is off by <see cref="WrapSpanCounts"/> one way or the other; the device loop mends
    /// such reads with firmware/Device/WrapStraddleFilter.cs (span 32767), not this port.
    /// </para>
    /// <para>
    /// Glitch filter: <c>FilterPulses</c> is passed by the native side to ESP-IDF as <c>max_glitch_ns</c>, so it is in
    /// nanoseconds, whatever the managed doc comment says (it says microseconds; its code comment says APB cycles).
    /// It is set to <see cref="GlitchFilterNanoseconds"/> (250 ns, 20 cycles of the 80 MHz APB clock): long enough
    /// to drop ringing and a comparator's chatter on a slow edge (tens of ns), short enough that every real pulse
    /// passes: the shortest high or low time of a counted signal must stay above it, which holds for any signal up to
    /// 1 MHz at 30-70 % duty (the 10-200 kHz of a search oscillator or a prescaled one have half-periods of 2.5 us or
    /// more). ESP-IDF accepts up to 1023 APB cycles (about 12.8 us, from memory).
    /// </para>
    /// <para>
    /// Which chips: the classic ESP32 has 8 pulse-counter units, ESP32-S2, S3, C6 and H2 have 4 (the native file's
    /// own table). <b>The ESP32-C3 has no pulse counter</b>: there the native calls are stubs and the constructor
    /// throws; use the edge input (<see cref="PinEventEdgeSource"/>) on a heavily divided signal instead.
    /// </para>
    /// </summary>
    public sealed class PulseCounterPort : IPulseCounterPort, IDisposable
    {
        /// <summary>Tick rate of the read times, Hz: whole microseconds.</summary>
        public const double ClockHz = 1000000.0;

        /// <summary>Counts a read can be off by when it races the driver's overflow interrupt (the watch point, 0x7fff).</summary>
        public const long WrapSpanCounts = 32767;

        /// <summary>The glitch filter set on the unit, nanoseconds (see the class notes for why).</summary>
        public const ushort GlitchFilterNanoseconds = 250;

        private const long TimeSpanTicksPerMicrosecond = 10;

        private readonly GpioPulseCounter counter;

        /// <summary>Claims a pulse-counter unit for <paramref name="pin"/>, counting rising edges, and starts it.</summary>
        /// <param name="pin">GPIO number of the conditioned signal (3.3 V logic).</param>
        public PulseCounterPort(int pin)
        {
            counter = new GpioPulseCounter(pin);
            counter.Polarity = GpioPulsePolarity.Rising;
            counter.FilterPulses = GlitchFilterNanoseconds;
            counter.Start();
        }

        /// <summary>Reads the cumulative count and the read's time in microseconds; false when the driver refused the read.</summary>
        public bool TryReadSnapshot(out ulong count, out ulong timeTicks)
        {
            try
            {
                // GpioPulseCounter.Read() returns the struct GpioPulseCount: the API forces one struct (a heap block on
                // nanoCLR) per read; its two fields are copied out at once.
                GpioPulseCount read = counter.Read();
                count = (ulong)read.Count;
                timeTicks = (ulong)(read.RelativeTime.Ticks / TimeSpanTicksPerMicrosecond);
                return true;
            }
            catch (Exception)
            {
                // Disposed or unit lost (the native side throws): no snapshot this time.
                count = 0;
                timeTicks = 0;
                return false;
            }
        }

        /// <summary>Stops the unit and releases it.</summary>
        public void Dispose()
        {
            counter.Stop();
            counter.Dispose();
        }
    }
}
