namespace FreqReadout.Detection
{
    /// <summary>How the sign of the search-oscillator shift maps to a class.</summary>
    public enum Polarity
    {
        /// <summary>Positive search shift -> non-ferrous, negative -> ferrous (the usual low-frequency case).</summary>
        Normal = 0,

        /// <summary>Flipped, for a coil and operating point that behave the other way.</summary>
        Inverted = 1,
    }
}
