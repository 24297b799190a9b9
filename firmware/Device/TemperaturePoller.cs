using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Reads an optional temperature sensor at most once an interval (default 1 s), never per read: the loop calls
    /// <see cref="TryPoll"/> every step and it returns a fresh temperature only when one was read now. A sensor that
    /// fails is asked again only at the next interval; failures are counted. O(1), nothing allocated.
    /// </summary>
    public sealed class TemperaturePoller
    {
        /// <summary>Default time between sensor reads, us.</summary>
        public const long DefaultIntervalMicroseconds = 1000000;

        private readonly ITemperaturePort sensor;
        private readonly long intervalMicroseconds;
        private bool polled;
        private long lastPollMicroseconds;

        /// <summary>Polls <paramref name="sensor"/> (null: no sensor, never polled) every <paramref name="intervalMicroseconds"/> (&gt; 0).</summary>
        public TemperaturePoller(ITemperaturePort sensor, long intervalMicroseconds)
        {
            if (intervalMicroseconds <= 0)
            {
                throw new System.ArgumentOutOfRangeException("intervalMicroseconds");
            }

            this.sensor = sensor;
            this.intervalMicroseconds = intervalMicroseconds;
        }

        /// <summary>Sensor reads that failed.</summary>
        public long Failures { get; private set; }

        /// <summary>Sensor reads made.</summary>
        public long Polls { get; private set; }

        /// <summary>Reads the sensor when an interval has passed since the last read (or at the first call); true with a fresh temperature, deg C.</summary>
        public bool TryPoll(long nowMicroseconds, out double celsius)
        {
            celsius = 0;
            if (sensor == null || (polled && nowMicroseconds - lastPollMicroseconds < intervalMicroseconds))
            {
                return false;
            }

            polled = true;
            lastPollMicroseconds = nowMicroseconds;
            Polls++;
            if (sensor.TryReadCelsius(out celsius) && celsius >= -273.15 && celsius <= 1000)
            {
                return true;
            }

            celsius = 0;
            Failures++;
            return false;
        }
    }
}
