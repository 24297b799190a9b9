namespace FreqReadout.Link
{
    /// <summary>
    /// Pulse-counter reads of one <see cref="LinkFrameType.SnapshotBatch"/> frame: the time of each read in ticks of the
    /// capture header's clock and the cumulative count, both unwrapped (64-bit). Layout: row count (1 byte, 1 to
    /// <see cref="MaxRows"/>), the first row's tick and count (8 bytes each), then for every further row the increase of
    /// tick and of count over the row before (LEB128 each). Ticks must increase and counts never decrease within a batch,
    /// so the deltas are unsigned; a read that breaks this starts the next batch. Each batch stands alone: a lost frame
    /// loses its own rows only. Arrays are made once; the device fills and reuses one object.
    /// </summary>
    public sealed class SnapshotBatchPayload
    {
        /// <summary>Most rows in one batch.</summary>
        public const int MaxRows = 64;

        private const int FirstRowBytes = 1 + 8 + 8;

        private readonly long[] ticks = new long[MaxRows];
        private readonly long[] counts = new long[MaxRows];
        private int rows;
        private int encodedBytes;

        /// <summary>Rows held.</summary>
        public int Count
        {
            get { return rows; }
        }

        /// <summary>Bytes the payload takes when written.</summary>
        public int EncodedBytes
        {
            get { return encodedBytes; }
        }

        /// <summary>The tick of row <paramref name="index"/>.</summary>
        public long TickAt(int index)
        {
            return ticks[index];
        }

        /// <summary>The count of row <paramref name="index"/>.</summary>
        public long CountAt(int index)
        {
            return counts[index];
        }

        /// <summary>Empties the batch.</summary>
        public void Clear()
        {
            rows = 0;
            encodedBytes = 0;
        }

        /// <summary>
        /// Appends a read; false (and nothing changed) when the batch is full, the payload would pass
        /// <see cref="LinkFrameEncoder.MaxPayloadBytes"/>, the tick does not increase or the count decreases.
        /// </summary>
        public bool TryAdd(long tick, long count)
        {
            if (rows == 0)
            {
                ticks[0] = tick;
                counts[0] = count;
                rows = 1;
                encodedBytes = FirstRowBytes;
                return true;
            }

            if (rows >= MaxRows || tick <= ticks[rows - 1] || count < counts[rows - 1])
            {
                return false;
            }

            int bytes = LinkPayloadWriter.VarUIntBytes((ulong)(tick - ticks[rows - 1])) + LinkPayloadWriter.VarUIntBytes((ulong)(count - counts[rows - 1]));
            if (encodedBytes + bytes > LinkFrameEncoder.MaxPayloadBytes)
            {
                return false;
            }

            ticks[rows] = tick;
            counts[rows] = count;
            rows++;
            encodedBytes += bytes;
            return true;
        }

        /// <summary>Writes the payload (nothing when the batch is empty).</summary>
        public void Write(LinkPayloadWriter writer)
        {
            if (rows == 0)
            {
                return;
            }

            writer.WriteByte(rows);
            writer.WriteInt64(ticks[0]);
            writer.WriteInt64(counts[0]);
            for (int i = 1; i < rows; i++)
            {
                writer.WriteVarUInt((ulong)(ticks[i] - ticks[i - 1]));
                writer.WriteVarUInt((ulong)(counts[i] - counts[i - 1]));
            }
        }

        /// <summary>Reads a payload; false (the batch then empty) when it is short, its row count is 0 or above <see cref="MaxRows"/>, a tick delta is 0, or bytes are left over.</summary>
        public bool TryRead(LinkPayloadReader reader)
        {
            Clear();
            int n;
            long tick;
            long count;
            if (!reader.TryReadByte(out n) || n < 1 || n > MaxRows || !reader.TryReadInt64(out tick) || !reader.TryReadInt64(out count))
            {
                return false;
            }

            ticks[0] = tick;
            counts[0] = count;
            for (int i = 1; i < n; i++)
            {
                ulong dt;
                ulong dc;
                if (!reader.TryReadVarUInt(out dt) || !reader.TryReadVarUInt(out dc) || dt == 0)
                {
                    return false;
                }

                ticks[i] = ticks[i - 1] + (long)dt;
                counts[i] = counts[i - 1] + (long)dc;
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
