namespace FreqReadout.Link
{
    /// <summary>A temperature sample in a <see cref="LinkFrameType.Temperature"/> frame. Layout: tick (i64, unwrapped, the capture's clock), temperature in deg C (double).</summary>
    public sealed class TemperaturePayload
    {
        /// <summary>When the sample was taken, ticks of the capture's clock.</summary>
        public long Tick { get; set; }

        /// <summary>The sample, deg C.</summary>
        public double TemperatureC { get; set; }

        /// <summary>Writes the layout.</summary>
        public void Write(LinkPayloadWriter writer)
        {
            writer.WriteInt64(Tick);
            writer.WriteDouble(TemperatureC);
        }

        /// <summary>Reads the layout (later bytes ignored); false when short or the temperature is not a number of at least -273.15.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            long tick;
            double t;
            if (!reader.TryReadInt64(out tick) || !reader.TryReadDouble(out t) || !(t >= -273.15) || double.IsInfinity(t))
            {
                return false;
            }

            Tick = tick;
            TemperatureC = t;
            return true;
        }
    }
}
