namespace FreqReadout.Firmware.Ports
{
    /// <summary>An optional temperature sensor near the search coil's oscillator (board adapter). May take milliseconds: call it rarely.</summary>
    public interface ITemperaturePort
    {
        /// <summary>Reads the temperature, deg C; false when the sensor did not answer or its answer is not a temperature.</summary>
        bool TryReadCelsius(out double celsius);
    }
}
