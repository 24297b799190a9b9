using System.Device.Pwm;
using FreqReadout.Firmware.Ports;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// A passive piezo buzzer (or a small speaker through a transistor) on a PWM pin, square wave at 50 % duty. The pin
    /// is given the ESP32's PWM1 function first (System.Device.Pwm README, v1.1.23: on an ESP32 the pin must be
    /// allocated with Configuration.SetPinFunction). Wiring and the supply check: hardware-notes/peripherals.md.
    /// </summary>
    public sealed class PwmBuzzer : IAlertPort
    {
        /// <summary>The tone the channel is opened with (not sounded until asked), Hz.</summary>
        public const int OpenFrequencyHz = 1000;

        private readonly PwmChannel channel;
        private bool running;
        private int frequencyHz;

        /// <summary>Opens the PWM channel on <paramref name="pin"/>, silent.</summary>
        public PwmBuzzer(int pin)
        {
            Configuration.SetPinFunction(pin, DeviceFunction.PWM1);
            channel = PwmChannel.CreateFromPin(pin, OpenFrequencyHz, 0.5);
            frequencyHz = OpenFrequencyHz;
        }

        /// <inheritdoc />
        public bool TrySetTone(int toneHz)
        {
            if (channel == null)
            {
                return false;    // CreateFromPin found no PWM channel for the pin
            }

            try
            {
                if (toneHz <= 0)
                {
                    if (running)
                    {
                        channel.Stop();
                        running = false;
                    }

                    return true;
                }

                if (toneHz != frequencyHz)
                {
                    channel.Frequency = toneHz;
                    frequencyHz = toneHz;
                }

                if (!running)
                {
                    channel.Start();
                    running = true;
                }

                return true;
            }
            catch (System.Exception)
            {
                running = false;
                frequencyHz = -1;
                return false;
            }
        }
    }
}
