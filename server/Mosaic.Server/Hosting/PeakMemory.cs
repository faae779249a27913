namespace Mosaic.Server.Hosting;

/// <summary>The process's resident memory from /proc/self/status (Linux); null where that is not available.</summary>
internal static class PeakMemory
{
    /// <summary>VmHWM: the peak resident set so far, in bytes.</summary>
    public static long? PeakBytes() => Read("VmHWM:");

    /// <summary>VmRSS: the resident set now, in bytes.</summary>
    public static long? CurrentBytes() => Read("VmRSS:");

    private static long? Read(string key)
    {
        try
        {
            foreach (var line in File.ReadLines("/proc/self/status"))
            {
                if (!line.StartsWith(key, StringComparison.Ordinal)) continue;
                var parts = line[key.Length..].Split((char[]?)null, StringSplitOptions.RemoveEmptyEntries);
                return parts.Length == 2 && parts[1] == "kB" && long.TryParse(parts[0], out var kilobytes) ? kilobytes * 1024 : null;
            }
        }
        catch (IOException) { }
        catch (UnauthorizedAccessException) { }
        return null;
    }
}
