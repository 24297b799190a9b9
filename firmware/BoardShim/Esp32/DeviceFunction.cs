// COMPILE-ONLY SHIM (FreqReadout.BoardShim.CompileOnly): never deployed, never run; every body throws.
// Signature as declared in nanoframework/nanoFramework.Hardware.Esp32, nanoFramework.Hardware.Esp32/DeviceTypePins.cs, tag v1.6.34: value = device type x 0x10000 + device index x 0x100 + signal (SERIAL 3, I2C 2, PWM 4) (written from the signature; no implementation copied).
namespace nanoFramework.Hardware.Esp32
{
    /// <summary>Shim of nanoFramework's ESP32 DeviceFunction: only the values firmware/Board/ uses, with the real numbers.</summary>
    public enum DeviceFunction
    {
        /// <summary>I2C bus 1 data (SDA).</summary>
        I2C1_DATA = 0x20100,

        /// <summary>I2C bus 1 clock (SCL).</summary>
        I2C1_CLOCK = 0x20101,

        /// <summary>UART of COM1, transmit.</summary>
        COM1_TX = 0x30100,

        /// <summary>UART of COM1, receive.</summary>
        COM1_RX = 0x30101,

        /// <summary>UART of COM2, transmit.</summary>
        COM2_TX = 0x30200,

        /// <summary>UART of COM2, receive.</summary>
        COM2_RX = 0x30201,

        /// <summary>PWM channel 1 (DeviceTypes.PWM 4 x 0x10000 + index 1 x 0x100).</summary>
        PWM1 = 0x40100,
    }
}
