using FreqReadout.Firmware.Ports;
using FreqReadout.Link;

namespace FreqReadout.Firmware.Link
{
    /// <summary>
    /// The work of the link's writer thread, one <see cref="RunOnce"/> at a time: sends every queued frame to the port
    /// (a write may block until the UART took it; only this thread waits), then reads what the PC sent, decodes its
    /// frames and puts settings texts and requests into the <see cref="LinkInbox"/> for the readout loop. The board runs
    /// it in its own thread; tests call it directly. Buffers are made once; a received settings text allocates its string.
    /// </summary>
    public sealed class LinkPortWorker
    {
        private readonly ILinkPort port;
        private readonly LinkSendQueue queue;
        private readonly LinkInbox inbox;
        private readonly byte[] frame = new byte[LinkFrameEncoder.MaxWireBytes];
        private readonly byte[] incoming = new byte[64];
        private readonly LinkFrameDecoder decoder = new LinkFrameDecoder();
        private readonly LinkFrame received = new LinkFrame();
        private readonly LinkPayloadReader reader = new LinkPayloadReader();
        private readonly RequestPayload request = new RequestPayload();

        /// <summary>A worker that drains <paramref name="queue"/> into <paramref name="port"/> and fills <paramref name="inbox"/>.</summary>
        public LinkPortWorker(ILinkPort port, LinkSendQueue queue, LinkInbox inbox)
        {
            if (port == null || queue == null || inbox == null)
            {
                throw new System.ArgumentNullException("port");
            }

            this.port = port;
            this.queue = queue;
            this.inbox = inbox;
        }

        /// <summary>Frames written to the port.</summary>
        public long FramesSent { get; private set; }

        /// <summary>Frames the port failed to write (lost).</summary>
        public long WriteFailures { get; private set; }

        /// <summary>Frames received from the PC.</summary>
        public long FramesReceived
        {
            get { return decoder.Frames; }
        }

        /// <summary>Damaged or malformed stretches received from the PC.</summary>
        public long ReceiveErrors
        {
            get { return decoder.CrcErrors + decoder.Malformed; }
        }

        /// <summary>Sends what is queued and takes what arrived; true when anything was sent or received (a thread sleeps a little when false).</summary>
        public bool RunOnce()
        {
            bool worked = false;
            int length;
            while (queue.TryDequeue(frame, out length))
            {
                worked = true;
                if (port.TryWrite(frame, 0, length))
                {
                    FramesSent++;
                }
                else
                {
                    WriteFailures++;
                }
            }

            int read;
            while (port.TryRead(incoming, 0, incoming.Length, out read))
            {
                worked = true;
                for (int i = 0; i < read; i++)
                {
                    if (decoder.Push(incoming[i], received))
                    {
                        Take(received);
                    }
                }
            }

            return worked;
        }

        private void Take(LinkFrame f)
        {
            reader.Reset(f.Payload, f.PayloadLength);
            if (f.FrameType == LinkFrameType.Settings)
            {
                string text;
                if (reader.TryReadAscii(out text))
                {
                    inbox.PutSettings(text);
                }
            }
            else if (f.FrameType == LinkFrameType.Request && request.TryRead(reader))
            {
                inbox.PutRequest(request.WantedType);
            }
        }
    }
}
