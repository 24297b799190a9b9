namespace FreqReadout.Firmware.Ports
{
    /// <summary>
    /// Storage that survives a restart (board adapter: a file system on the internal flash): the settings text
    /// (docs/settings-format.md) and a boot counter. Slow (flash writes take milliseconds): used at start and when the PC
    /// sends settings, never per read. Every member reports failure instead of throwing.
    /// </summary>
    public interface ISettingsStore
    {
        /// <summary>Reads the stored settings text; false when none is stored or it cannot be read.</summary>
        bool TryLoad(out string text);

        /// <summary>Stores the settings text in place of the last one; false when it could not be written.</summary>
        bool TrySave(string text);

        /// <summary>Reads the stored boot counter; false when none is stored or it cannot be read or parsed.</summary>
        bool TryReadBootCount(out uint count);

        /// <summary>Stores the boot counter; false when it could not be written.</summary>
        bool TryWriteBootCount(uint count);
    }
}
