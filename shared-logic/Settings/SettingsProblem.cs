namespace FreqReadout.Settings
{
    /// <summary>
    /// One problem found while reading a settings text: where it is, which key, and what was wrong or allowed.
    /// A class (not a struct) so the device never copies it; <see cref="SettingsProblemList"/> owns and refills them.
    /// </summary>
    public sealed class SettingsProblem
    {
        /// <summary>Line of the text the problem is on, 1-based (lines end at LF); 0 when it concerns the text as a whole.</summary>
        public int LineNumber { get; internal set; }

        /// <summary>The key concerned ("" when the line had none); an unknown key is cut to <see cref="SettingsProblemList.MaxKeyChars"/> characters, anything but printable ASCII written as '?'.</summary>
        public string Key { get; internal set; }

        /// <summary>What was wrong and what is allowed; the setting keeps its default.</summary>
        public string Message { get; internal set; }
    }
}
