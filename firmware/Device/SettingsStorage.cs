using FreqReadout.Firmware.Ports;
using FreqReadout.Settings;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// What the device does with its store, so that storage never stops it:
    /// <list type="bullet">
    /// <item>at start, <see cref="LoadInto"/> puts the stored settings text in force before the loop is built: a bad value
    /// falls back to its default and is counted in <see cref="DeviceSettings.SettingsProblems"/> (the status frame
    /// reports it); a missing or unreadable text leaves the defaults; a store that throws counts as unreadable;</item>
    /// <item><see cref="NextBootId"/> increments the stored boot counter and returns it (1 after a missing or damaged
    /// counter, 1 again after 4294967295), or the fallback (a number drawn at start) when the store fails;</item>
    /// <item>in the loop, <see cref="SaveFrom"/> stores the settings the PC sent once they are in force; a failed save is
    /// counted (<see cref="SaveFailures"/>) and not retried (the settings stay in force until the next restart).</item>
    /// </list>
    /// Allocates (strings), but only at start and when the PC sends settings.
    /// </summary>
    public sealed class SettingsStorage
    {
        private readonly ISettingsStore store;

        /// <summary>Uses <paramref name="store"/>; null when the board has none (every call then falls back).</summary>
        public SettingsStorage(ISettingsStore store)
        {
            this.store = store;
        }

        /// <summary>True when the last <see cref="NextBootId"/> came from the stored counter.</summary>
        public bool BootIdFromStore { get; private set; }

        /// <summary>Settings texts that could not be stored.</summary>
        public long SaveFailures { get; private set; }

        /// <summary>Settings texts stored.</summary>
        public long Saves { get; private set; }

        /// <summary>Puts the stored settings text, if any, in force in <paramref name="settings"/> (problems listed in <paramref name="problems"/>, may be null).</summary>
        public StoredSettingsResult LoadInto(DeviceSettings settings, SettingsProblemList problems)
        {
            string text;
            if (store == null || !TryLoad(out text) || text == null)
            {
                return StoredSettingsResult.Missing;
            }

            if (!settings.TryApplyText(text, problems))
            {
                return StoredSettingsResult.NotSettings;
            }

            string error;
            return settings.TryValidate(out error) ? StoredSettingsResult.Applied : StoredSettingsResult.Rejected;
        }

        /// <summary>The stored boot counter plus one, stored again; <paramref name="fallback"/> when the store cannot keep it.</summary>
        public uint NextBootId(uint fallback)
        {
            BootIdFromStore = false;
            if (store == null)
            {
                return fallback;
            }

            try
            {
                uint count;
                if (!store.TryReadBootCount(out count))
                {
                    count = 0;    // first start, or a damaged counter: start again
                }

                uint next = count == uint.MaxValue ? 1 : count + 1;
                if (store.TryWriteBootCount(next))
                {
                    BootIdFromStore = true;
                    return next;
                }
            }
            catch (System.Exception)
            {
                // an adapter that throws is a store that failed
            }

            return fallback;
        }

        /// <summary>Stores the settings text the loop put in force since the last call, if any; true when one was stored.</summary>
        public bool SaveFrom(DeviceLoop loop)
        {
            string text;
            if (!loop.TryTakeSettingsToStore(out text))
            {
                return false;
            }

            bool saved = false;
            if (store != null)
            {
                try
                {
                    saved = store.TrySave(text);
                }
                catch (System.Exception)
                {
                    saved = false;
                }
            }

            if (saved)
            {
                Saves++;
            }
            else
            {
                SaveFailures++;
            }

            return saved;
        }

        private bool TryLoad(out string text)
        {
            try
            {
                return store.TryLoad(out text);
            }
            catch (System.Exception)
            {
                text = null;
                return false;
            }
        }
    }
}
