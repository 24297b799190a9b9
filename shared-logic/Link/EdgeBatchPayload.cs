namespace FreqReadout.Link
{
    /// <summary>
    /// Edge times of one <see cref="LinkFrameType.EdgeBatch"/> frame, unwrapped ticks of the capture header's clock.
    /// Layout: row count (1 byte, 1 to <see cref="MaxRows"/>), the first tick (8 bytes), then each further tick's
    /// increase over the one before (LEB128). Ticks must increase; one that does not starts the next batch.
    /// </summary>
    public sealed class EdgeBatchPayload
    {
        /// <summary>Most edges in one batch.</summary>
        public const int MaxRows = 128;

        private const int FirstRowBytes = 1 + 8;

        private readonly long[] ticks = new long[MaxRows];
        private int rows;
        private int encodedBytes;

        /// <summary>Edges held.</summary>
        public int Count
        {
            get { return rows; }
        }

        /// <summary>The tick of edge <paramref name="index"/>.</summary>
        public long TickAt(int index)
        {
            return ticks[index];
        }

        /// <summary>Empties the batch.</summary>
        public void Clear()
        {
            rows = 0;
            encodedBytes = 0;
        }

        /// <summary>Appends an edge; false (nothing changed) when full, out of payload room, or the tick does not increase.</summary>
        public bool TryAdd(long tick)
        {
            if (rows == 0)
            {
                ticks[0] = tick;
                rows = 1;
                encodedBytes = FirstRowBytes;
                return true;
            }

            if (rows >= MaxRows || tick <= ticks[rows - 1])
            {
                return false;
            }

            int bytes = LinkPayloadWriter.VarUIntBytes((ulong)(tick - ticks[rows - 1]));
            if (encodedBytes + bytes > LinkFrameEncoder.MaxPayloadBytes)
            {
                return false;
            }

            ticks[rows++] = tick;
            encodedBytes += bytes;
            return true;
        }

        /// <summary>Writes the payload (nothing when empty).</summary>
        public void Write(LinkPayloadWriter writer)
        {
            if (rows == 0)
            {
                return;
            }

            writer.WriteByte(rows);
            writer.WriteInt64(ticks[0]);
            for (int i = 1; i < rows; i++)
            {
                writer.WriteVarUInt((ulong)(ticks[i] - ticks[i - 1]));
            }
        }

        /// <summary>Reads a payload; false (the batch then empty) when short, the count is out of range, a delta is 0 or bytes are left over.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            Clear();
            int n;
            long tick;
            if (!reader.TryReadByte(out n) || n < 1 || n > MaxRows || !reader.TryReadInt64(out tick))
            {
                return false;
            }

            ticks[0] = tick;
            for (int i = 1; i < n; i++)
            {
                ulong dt;
                if (!reader.TryReadVarUInt(out dt) || dt == 0)
                {
                    return false;
                }

                ticks[i] = ticks[i - 1] + (long)dt;
            }

            if (reader.Remaining != 0)
            {
                return false;
            }

            rows = n;
            return true;
        }
    }
}
