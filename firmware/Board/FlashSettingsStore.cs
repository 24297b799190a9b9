using System;
using System.IO;
using FreqReadout.Firmware.Device;
using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// The settings text and the boot counter as two small files on the ESP32's internal flash through nanoFramework's
    /// file system (package nanoFramework.System.IO.FileSystem; the internal drive is <c>I:\</c>, the root its own unit
    /// tests use at v1.1.85, FileSystemUnitTestsBase.cs). Every failure (no file system in the firmware image, a missing
    /// or damaged file, a full flash) is caught and reported as false; <see cref="SettingsStorage"/> decides what follows.
    /// A power cut during a write can leave a damaged file: the next start then reads it as invalid and falls back.
    /// </summary>
    public sealed class FlashSettingsStore : ISettingsStore
    {
        /// <summary>The settings file.</summary>
        public const string SettingsPath = "I:\\freqreadout-settings.txt";

        /// <summary>The boot counter file.</summary>
        public const string BootCountPath = "I:\\freqreadout-boot.txt";

        /// <inheritdoc />
        public bool TryLoad(out string text)
        {
            text = null;
            try
            {
                if (!File.Exists(SettingsPath))
                {
                    return false;
                }

                text = File.ReadAllText(SettingsPath);
                return text != null;
            }
            catch (Exception)
            {
                text = null;
                return false;
            }
        }

        /// <inheritdoc />
        public bool TrySave(string text)
        {
            return TryWrite(SettingsPath, text);
        }

        /// <inheritdoc />
        public bool TryReadBootCount(out uint count)
        {
            count = 0;
            try
            {
                return File.Exists(BootCountPath) && BootCountText.TryParse(File.ReadAllText(BootCountPath), out count);
            }
            catch (Exception)
            {
                count = 0;
                return false;
            }
        }

        /// <inheritdoc />
        public bool TryWriteBootCount(uint count)
        {
            return TryWrite(BootCountPath, BootCountText.Format(count));
        }

        private static bool TryWrite(string path, string text)
        {
            try
            {
                File.WriteAllText(path, text);
                return true;
            }
            catch (Exception)
            {
                return false;
            }
        }
    }
}
