using System;
using System.Device.I2c;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// A Texas Instruments TMP102 on the I2C bus the LCD uses (bus 1, GPIO 21/22, pins routed by the LCD adapter), address
    /// 0x48 (ADD0 to ground). Each read sets the pointer to the temperature register and reads its two bytes in one
    /// transaction; <see cref="Tmp102Conversion"/> turns them into deg C. The sensor converts on its own, 4 times a
    /// second by default (data sheet, from memory), so reading once a second (<see cref="TemperaturePoller"/>) is enough.
    /// </summary>
    public sealed class Tmp102Sensor : ITemperaturePort
    {
        private readonly I2cDevice device;
        private readonly byte[] pointer = new byte[] { Tmp102Conversion.TemperatureRegister };
        private readonly byte[] data = new byte[2];

        /// <summary>Opens the sensor at <paramref name="address"/> on I2C bus 1 (its pins already routed).</summary>
        public Tmp102Sensor(int address)
        {
            device = new I2cDevice(new I2cConnectionSettings(1, address, I2cBusSpeed.StandardMode));
        }

        /// <inheritdoc />
        public bool TryReadCelsius(out double celsius)
        {
            celsius = 0;
            try
            {
                // I2cDevice.WriteRead takes two structs SpanByte and returns the struct I2cTransferResult: the API forces
                // them, once a read of the sensor (once a second), never per counter read.
                I2cTransferResult result = device.WriteRead(new SpanByte(pointer, 0, 1), new SpanByte(data, 0, 2));
                if (result.Status != I2cTransferStatus.FullTransfer)
                {
                    return false;
                }
            }
            catch (Exception)
            {
                return false;
            }

            celsius = Tmp102Conversion.CelsiusFromRegister(data[0], data[1]);
            return true;
        }
    }
}
