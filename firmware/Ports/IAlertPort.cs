namespace FreqReadout.Firmware.Ports
{
    /// <summary>
    /// The audible or visible alert (board adapter: a PWM buzzer, or an LED that is on for any tone). The caller changes
    /// it only when the wanted tone changes, so an adapter may do real work (a native call) in each call.
    /// </summary>
    public interface IAlertPort
    {
        /// <summary>Sounds a square-wave tone of <paramref name="frequencyHz"/> (&gt; 0), or turns the alert off (0).</summary>
        /// <returns>False when the hardware refused it (the alert is then in an unknown state).</returns>
        bool TrySetTone(int frequencyHz);
    }
}
