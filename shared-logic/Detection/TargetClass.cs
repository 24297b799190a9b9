namespace FreqReadout.Detection
{
    /// <summary>Class of a target from the sign rule.</summary>
    public enum TargetClass
    {
        /// <summary>No target.</summary>
        None = 0,

        /// <summary>Search frequency fell (with normal polarity): inductance rose, flux concentrated.</summary>
        Ferrous = 1,

        /// <summary>Search frequency rose (with normal polarity): eddy currents lowered the inductance.</summary>
        NonFerrous = 2,

        /// <summary>Too close to the threshold, mixed sign, or beat below its floor: the sign cannot be trusted.</summary>
        Unclear = 3,
    }
}
