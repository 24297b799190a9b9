// Board: the link's writer thread.
using System.Threading;
using FreqReadout.Firmware.Link;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The body of the link's writer thread: runs the worker for ever, sleeping one system tick (10 ms) whenever it found
    /// nothing to send or receive. It is the only code that touches the serial port, so a blocking write holds up this
    /// thread alone, never the readout loop.
    /// </summary>
    public sealed class LinkWriter
    {
        private readonly LinkPortWorker worker;

        /// <summary>A writer over <paramref name="worker"/>.</summary>
        public LinkWriter(LinkPortWorker worker)
        {
            this.worker = worker;
        }

        /// <summary>The thread's body; never returns.</summary>
        public void Run()
        {
            while (true)
            {
                if (!worker.RunOnce())
                {
                    Thread.Sleep(10);
                }
            }
        }
    }
}
