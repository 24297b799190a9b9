namespace FreqReadout.Settings
{
    /// <summary>What the device sends over the serial link to the PC (settings key <c>link</c>).</summary>
    public enum LinkMode
    {
        /// <summary>Nothing is sent (the default): the link costs the device no time.</summary>
        Off = 0,

        /// <summary>Readings, detection events and status frames only.</summary>
        Readings = 1,

        /// <summary>Everything of <see cref="Readings"/> and also every pulse-counter snapshot, so the PC can record a full capture.</summary>
        Capture = 2,
    }
}
