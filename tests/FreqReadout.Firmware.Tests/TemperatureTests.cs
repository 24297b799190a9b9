using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;
using Moq;

namespace FreqReadout.Firmware.Tests;

public class TemperatureTests
{
    /// <summary>
    /// Texas Instruments, TMP102 data sheet (SBOS397), "Temperature Register", 12-bit temperature data format table:
    /// temperature and its 12-bit digital output in hex. Values from memory (the 128 deg C row's code, 7FF, is
    /// 127.9375 deg C exactly; the table lists the nominal 128).
    /// </summary>
    [Theory]
    [InlineData(0x7FF, 127.9375)]
    [InlineData(0x640, 100.0)]
    [InlineData(0x500, 80.0)]
    [InlineData(0x4B0, 75.0)]
    [InlineData(0x320, 50.0)]
    [InlineData(0x190, 25.0)]
    [InlineData(0x004, 0.25)]
    [InlineData(0x000, 0.0)]
    [InlineData(0xFFC, -0.25)]
    [InlineData(0xE70, -25.0)]
    [InlineData(0xC90, -55.0)]
    public void Twelve_bit_codes_match_the_data_sheet_table(int code, double celsius)
    {
        // The 12 bits are left-justified in the two bytes read (normal mode: the low nibble of the second byte reads 0).
        byte msb = (byte)(code >> 4);
        byte lsb = (byte)((code & 0xF) << 4);
        Assert.Equal(celsius, Tmp102Conversion.CelsiusFromRegister(msb, lsb));
    }

    [Fact]
    public void Extended_mode_codes_are_13_bits_flagged_by_bit_0()
    {
        // Extended mode (EM = 1; data sheet, from memory): 13 bits left-justified, bit 0 of the second byte set. 150 deg C
        // is 2400 counts = 0x960; -55 deg C is -880 = 0x1C90 in 13 bits (computed from the format, not a table).
        Assert.Equal(150.0, Tmp102Conversion.CelsiusFromRegister((byte)(0x960 >> 5), (byte)(((0x960 & 0x1F) << 3) | 1)));
        Assert.Equal(-55.0, Tmp102Conversion.CelsiusFromRegister((byte)(0x1C90 >> 5), (byte)(((0x1C90 & 0x1F) << 3) | 1)));
        Assert.Equal(0.0625, Tmp102Conversion.CelsiusPerLsb);
    }

    [Fact]
    public void Every_12_bit_code_is_its_twos_complement_value_in_sixteenths()
    {
        for (int code = 0; code < 4096; code++)
        {
            int expected = code >= 2048 ? code - 4096 : code;
            Assert.Equal(expected, Tmp102Conversion.CountsFromRegister((byte)(code >> 4), (byte)((code & 0xF) << 4)));
        }
    }

    [Fact]
    public void The_poller_reads_the_sensor_at_most_once_an_interval()
    {
        var sensor = new Mock<ITemperaturePort>();
        double c = 21.5;
        sensor.Setup(s => s.TryReadCelsius(out c)).Returns(true);
        var poller = new TemperaturePoller(sensor.Object, TemperaturePoller.DefaultIntervalMicroseconds);
        int fresh = 0;
        for (long us = 0; us < 10_000_000; us += 1000) // 10 s of 1 ms steps
        {
            if (poller.TryPoll(us, out double t))
            {
                fresh++;
                Assert.Equal(21.5, t);
            }
        }

        Assert.Equal(10, fresh);
        sensor.Verify(s => s.TryReadCelsius(out c), Times.Exactly(10));
    }

    [Fact]
    public void A_failing_or_absent_sensor_is_counted_and_asked_again_only_at_the_next_interval()
    {
        var sensor = new Mock<ITemperaturePort>();
        double c = 0;
        sensor.Setup(s => s.TryReadCelsius(out c)).Returns(false);
        var poller = new TemperaturePoller(sensor.Object, 1_000_000);
        for (long us = 0; us < 3_000_000; us += 1000)
        {
            Assert.False(poller.TryPoll(us, out _));
        }

        Assert.Equal(3, poller.Failures);
        sensor.Verify(s => s.TryReadCelsius(out c), Times.Exactly(3));

        double nan = double.NaN;
        var broken = new Mock<ITemperaturePort>();
        broken.Setup(s => s.TryReadCelsius(out nan)).Returns(true);
        var p2 = new TemperaturePoller(broken.Object, 1_000_000);
        Assert.False(p2.TryPoll(0, out double t2));
        Assert.Equal(0, t2);
        Assert.Equal(1, p2.Failures);

        var none = new TemperaturePoller(null, 1_000_000);
        Assert.False(none.TryPoll(5_000_000, out _));
        Assert.Equal(0, none.Polls);
        Assert.Throws<ArgumentOutOfRangeException>(() => new TemperaturePoller(null, 0));
    }
}
