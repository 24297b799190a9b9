namespace FreqReadout.Counting
{
    /// <summary>What a gate result means.</summary>
    public enum GateState
    {
        /// <summary>A valid frequency estimate.</summary>
        Ok = 0,

        /// <summary>No edge arrived within the no-signal timeout: there is no frequency.</summary>
        NoSignal = 1,

        /// <summary>The gate is valid but double-triggered edges were rejected inside it.</summary>
        Glitch = 2,

        /// <summary>The gate was closed early by a gap of many expected periods.</summary>
        Dropout = 3,
    }
}
