namespace FreqReadout.Firmware.Device
{
    /// <summary>What <see cref="SettingsStorage.LoadInto"/> found in the store.</summary>
    public enum StoredSettingsResult
    {
        /// <summary>No store, nothing stored, or the store could not be read: the settings keep their defaults.</summary>
        Missing = 0,

        /// <summary>The stored text is in force (values that were bad fell back to their defaults and are counted).</summary>
        Applied = 1,

        /// <summary>The stored text is not a settings text of this version (no magic line): defaults kept, one problem counted.</summary>
        NotSettings = 2,

        /// <summary>The stored values were read but together fail the device's checks: the caller must start again from defaults.</summary>
        Rejected = 3,
    }
}
