using FreqReadout.Link;

namespace FreqReadout.Firmware.Link
{
    /// <summary>
    /// Frames waiting for the link's writer thread: a ring of slots made once, each holding one encoded frame (at most
    /// <see cref="LinkFrameEncoder.MaxWireBytes"/> bytes). The readout loop encodes into a free slot and never waits for
    /// the serial port; when every slot is taken the frame is dropped and counted in <see cref="FramesLost"/> (the status
    /// frame reports it) and its sequence number is used up, so the PC sees the gap where it happened. One producer (the loop) and one consumer (the
    /// writer thread); a lock guards the indices. Nothing allocates.
    /// </summary>
    public sealed class LinkSendQueue
    {
        private readonly object gate = new object();
        private readonly LinkFrameEncoder encoder = new LinkFrameEncoder();
        private readonly byte[][] slots;
        private readonly int[] lengths;
        private int head;
        private int queued;
        private long framesLost;
        private long framesQueued;

        /// <summary>A queue of <paramref name="slotCount"/> frames (at least 2).</summary>
        public LinkSendQueue(int slotCount)
        {
            if (slotCount < 2)
            {
                slotCount = 2;
            }

            slots = new byte[slotCount][];
            for (int i = 0; i < slotCount; i++)
            {
                slots[i] = new byte[LinkFrameEncoder.MaxWireBytes];
            }

            lengths = new int[slotCount];
        }

        /// <summary>Slots in the ring.</summary>
        public int Capacity
        {
            get { return slots.Length; }
        }

        /// <summary>Frames waiting now.</summary>
        public int Queued
        {
            get
            {
                lock (gate)
                {
                    return queued;
                }
            }
        }

        /// <summary>Frames dropped because the ring was full.</summary>
        public long FramesLost
        {
            get
            {
                lock (gate)
                {
                    return framesLost;
                }
            }
        }

        /// <summary>Frames queued so far.</summary>
        public long FramesQueued
        {
            get
            {
                lock (gate)
                {
                    return framesQueued;
                }
            }
        }

        /// <summary>Encodes a frame of <paramref name="frameType"/> with the writer's payload into a free slot; false, and counted as lost, when none is free or the payload overflowed.</summary>
        public bool TryEnqueue(int frameType, LinkPayloadWriter payload)
        {
            lock (gate)
            {
                if (queued == slots.Length || payload.Overflowed)
                {
                    framesLost++;
                    encoder.SkipSequence();    // the PC sees the loss as a sequence gap, where it happened
                    return false;
                }

                int slot = (head + queued) % slots.Length;
                int written;
                if (!encoder.TryEncode(frameType, payload.Buffer, 0, payload.Length, slots[slot], 0, out written))
                {
                    framesLost++;
                    return false;
                }

                lengths[slot] = written;
                queued++;
                framesQueued++;
                return true;
            }
        }

        /// <summary>Copies the oldest frame into <paramref name="into"/> (room for <see cref="LinkFrameEncoder.MaxWireBytes"/>) and frees its slot; false when none waits.</summary>
        public bool TryDequeue(byte[] into, out int length)
        {
            lock (gate)
            {
                length = 0;
                if (queued == 0)
                {
                    return false;
                }

                length = lengths[head];
                System.Array.Copy(slots[head], 0, into, 0, length);
                head = (head + 1) % slots.Length;
                queued--;
                return true;
            }
        }
    }
}
