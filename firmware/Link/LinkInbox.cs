namespace FreqReadout.Firmware.Link
{
    /// <summary>
    /// What the PC sent, handed from the link's writer thread to the readout loop: the latest settings text (a newer one
    /// replaces one not yet taken) and the frame types asked for. A lock guards it; only the settings text allocates (it
    /// is rare).
    /// </summary>
    public sealed class LinkInbox
    {
        private readonly object gate = new object();
        private string settingsText;
        private bool wantHeader;
        private bool wantStatus;
        private bool wantSettings;

        /// <summary>Called by the writer thread: a settings text arrived.</summary>
        public void PutSettings(string text)
        {
            lock (gate)
            {
                settingsText = text;
            }
        }

        /// <summary>Called by the writer thread: the PC asked for a frame of this type (<see cref="FreqReadout.Link.LinkFrameType"/>); other types are ignored.</summary>
        public void PutRequest(int frameType)
        {
            lock (gate)
            {
                if (frameType == FreqReadout.Link.LinkFrameType.CaptureHeader)
                {
                    wantHeader = true;
                }
                else if (frameType == FreqReadout.Link.LinkFrameType.Status)
                {
                    wantStatus = true;
                }
                else if (frameType == FreqReadout.Link.LinkFrameType.Settings)
                {
                    wantSettings = true;
                }
            }
        }

        /// <summary>Takes the settings text that arrived, if any.</summary>
        public bool TryTakeSettings(out string text)
        {
            lock (gate)
            {
                text = settingsText;
                settingsText = null;
                return text != null;
            }
        }

        /// <summary>Takes a pending request of this type (<see cref="FreqReadout.Link.LinkFrameType"/>: capture header, status or settings).</summary>
        public bool TryTakeRequest(int frameType)
        {
            lock (gate)
            {
                bool wanted;
                if (frameType == FreqReadout.Link.LinkFrameType.CaptureHeader)
                {
                    wanted = wantHeader;
                    wantHeader = false;
                }
                else if (frameType == FreqReadout.Link.LinkFrameType.Status)
                {
                    wanted = wantStatus;
                    wantStatus = false;
                }
                else if (frameType == FreqReadout.Link.LinkFrameType.Settings)
                {
                    wanted = wantSettings;
                    wantSettings = false;
                }
                else
                {
                    wanted = false;
                }

                return wanted;
            }
        }
    }
}
