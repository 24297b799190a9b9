namespace FreqReadout.Counting
{
    /// <summary>
    /// Unwraps raw timer values modulo 2^bits into a monotonic 64-bit tick (SKELETON: the counting-core work fills this in).
    /// </summary>
    public sealed class TimerUnwrapper
    {
        public TimerUnwrapper(int bits)
        {
            Bits = bits;
        }

        public int Bits { get; }

        /// <summary>Unwraps one raw value (must be below 2^bits). False when the value cannot be right.</summary>
        public bool TryUnwrap(ulong raw, out long tick)
        {
            throw new System.NotImplementedException();
        }
    }
}
