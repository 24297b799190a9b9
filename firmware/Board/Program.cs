// Board entry point (builds only with -p:FreqReadoutBoard=true).
using System.Device.Gpio;
using System.Threading;
using FreqReadout.Counting;
using FreqReadout.Firmware.Device;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Board
{
    /// <summary>ESP32: the search oscillator on GPIO 26 through the hardware pulse counter, re-baseline button on GPIO 0.</summary>
    public static class Program
    {
        public static void Main()
        {
            var counterSettings = new CounterSettings { ClockHz = PulseCounterPort.ClockHz, GateSeconds = 0.2, JitterTicks = 5 };
            var settings = new DeviceSettings(counterSettings, new ReadoutSettings()) { Input = InputKind.Snapshots, TimerBits = 64, CountBits = 64 };
            var gpio = new GpioController();
            var loop = new DeviceLoop(settings, new PulseCounterPort(26), new DebugDisplay(), new GpioButtons(gpio, 0, -1));
            while (true)
            {
                loop.Step();
                // Thread.Sleep(1) lasts a whole 10 ms system tick on nanoFramework: this paces about 100
                // reads a second. Pacing on HighResTimer deadlines is the device issue's work.
                Thread.Sleep(1);
            }
        }
    }
}
