namespace FreqReadout.Settings
{
    /// <summary>What the device sends over the serial link to the PC (settings key <c>link</c>).</summary>
    public enum LinkMode
    {
        /// <summary>Nothing is sent unless the PC asks (a capture header, status or settings frame on request, and the settings in force after new settings arrive): the link costs the device almost no time.</summary>
        Off = 0,

        /// <summary>Readings, detection events and status frames only.</summary>
        Readings = 1,

        /// <summary>Everything of <see cref="Readings"/> and also every pulse-counter snapshot (or edge), so the PC can record a full capture (the default).</summary>
        Capture = 2,
    }
}
