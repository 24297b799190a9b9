using FreqReadout.Detection;
using FreqReadout.Link;
using FreqReadout.Readout;

namespace FreqReadout.Firmware.Link
{
    /// <summary>
    /// The readout loop's side of the link: turns reads, readings, events, status and settings into frames in the
    /// <see cref="LinkSendQueue"/>. Reads are gathered into a snapshot (or edge) batch and queued when the batch is full,
    /// when a read cannot join it (the count went back), or on <see cref="Flush"/>; the other frames are queued at once.
    /// Every payload object is made once and refilled; queuing a frame costs O(payload) and allocates nothing.
    /// </summary>
    public sealed class DeviceLinkStreamer
    {
        private readonly LinkSendQueue queue;
        private readonly LinkPayloadWriter writer = new LinkPayloadWriter();
        private readonly SnapshotBatchPayload snapshots = new SnapshotBatchPayload();
        private readonly EdgeBatchPayload edges = new EdgeBatchPayload();
        private readonly ReadingPayload readingPayload = new ReadingPayload();
        private readonly EventPayload eventPayload = new EventPayload();
        private readonly TemperaturePayload temperature = new TemperaturePayload();
        private readonly CaptureHeaderPayload header;
        private readonly StatusPayload status = new StatusPayload();

        /// <summary>A streamer into <paramref name="queue"/> for the capture <paramref name="header"/> describes (kept, not copied).</summary>
        public DeviceLinkStreamer(LinkSendQueue queue, CaptureHeaderPayload header)
        {
            if (queue == null || header == null)
            {
                throw new System.ArgumentNullException("queue");
            }

            this.queue = queue;
            this.header = header;
        }

        /// <summary>The capture header sent by <see cref="SendHeader"/>.</summary>
        public CaptureHeaderPayload Header
        {
            get { return header; }
        }

        /// <summary>The status object <see cref="SendStatus"/> sends; the loop fills it first.</summary>
        public StatusPayload Status
        {
            get { return status; }
        }

        /// <summary>The queue frames go to.</summary>
        public LinkSendQueue Queue
        {
            get { return queue; }
        }

        /// <summary>Adds one pulse-counter read (unwrapped tick and count); queues the batch when it is full.</summary>
        public void AddSnapshot(long tick, long count)
        {
            if (!snapshots.TryAdd(tick, count))
            {
                FlushSnapshots();
                snapshots.TryAdd(tick, count);
            }

            if (snapshots.Count == SnapshotBatchPayload.MaxRows)
            {
                FlushSnapshots();
            }
        }

        /// <summary>Adds one edge (unwrapped tick); queues the batch when it is full.</summary>
        public void AddEdge(long tick)
        {
            if (!edges.TryAdd(tick))
            {
                FlushEdges();
                edges.TryAdd(tick);
            }

            if (edges.Count == EdgeBatchPayload.MaxRows)
            {
                FlushEdges();
            }
        }

        /// <summary>Queues the batches gathered so far (before a frame that must follow their rows, and at a stop).</summary>
        public void Flush()
        {
            FlushSnapshots();
            FlushEdges();
        }

        /// <summary>Queues the capture header.</summary>
        public void SendHeader()
        {
            writer.Reset();
            header.Write(writer);
            queue.TryEnqueue(LinkFrameType.CaptureHeader, writer);
        }

        /// <summary>Queues a gate's reading.</summary>
        public void SendReading(Reading reading)
        {
            readingPayload.CopyFrom(reading);
            writer.Reset();
            readingPayload.Write(writer);
            queue.TryEnqueue(LinkFrameType.Reading, writer);
        }

        /// <summary>Queues a finished event.</summary>
        public void SendEvent(DetectionEvent detection)
        {
            eventPayload.CopyFrom(detection);
            writer.Reset();
            eventPayload.Write(writer);
            queue.TryEnqueue(LinkFrameType.Event, writer);
        }

        /// <summary>Queues a temperature sample taken at <paramref name="tick"/> (after the reads gathered so far, so the PC puts it on the right row).</summary>
        public void SendTemperature(long tick, double temperatureC)
        {
            Flush();
            temperature.Tick = tick;
            temperature.TemperatureC = temperatureC;
            writer.Reset();
            temperature.Write(writer);
            queue.TryEnqueue(LinkFrameType.Temperature, writer);
        }

        /// <summary>Queues <see cref="Status"/> as the loop filled it.</summary>
        public void SendStatus()
        {
            writer.Reset();
            status.Write(writer);
            queue.TryEnqueue(LinkFrameType.Status, writer);
        }

        /// <summary>Queues the settings text in force (ASCII, at most <see cref="LinkFrameEncoder.MaxPayloadBytes"/> bytes; a longer one is counted lost).</summary>
        public void SendSettings(string text)
        {
            writer.Reset();
            writer.WriteAscii(text);
            queue.TryEnqueue(LinkFrameType.Settings, writer);
        }

        private void FlushSnapshots()
        {
            if (snapshots.Count == 0)
            {
                return;
            }

            writer.Reset();
            snapshots.Write(writer);
            snapshots.Clear();
            queue.TryEnqueue(LinkFrameType.SnapshotBatch, writer);
        }

        private void FlushEdges()
        {
            if (edges.Count == 0)
            {
                return;
            }

            writer.Reset();
            edges.Write(writer);
            edges.Clear();
            queue.TryEnqueue(LinkFrameType.EdgeBatch, writer);
        }
    }
}
