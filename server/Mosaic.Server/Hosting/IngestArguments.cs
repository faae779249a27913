namespace Mosaic.Server.Hosting;

/// <summary>`ingest [--data DIR] [--cache DIR] [--field ID]`: the folders as the server reads them, and one field or all.</summary>
internal sealed record IngestArguments(string? Data, string? Cache, string? Field)
{
    public const string Usage = "ingest [--data DIR] [--cache DIR] [--field ID]";

    /// <summary>The arguments, or null with the reason in <paramref name="error"/>.</summary>
    public static IngestArguments? Parse(IReadOnlyList<string> args, out string? error)
    {
        var values = new Dictionary<string, string>(StringComparer.Ordinal);
        for (var i = 0; i < args.Count; i++)
        {
            string name = args[i], value;
            // "--data=DIR" too, as the server's own command line accepts it.
            if (name.IndexOf('=') is > 2 and var equals && name.StartsWith("--", StringComparison.Ordinal))
                (name, value) = (name[..equals], name[(equals + 1)..]);
            else
                value = i + 1 < args.Count ? args[++i] : "";
            if (name is not ("--data" or "--cache" or "--field"))
            {
                error = $"unknown argument '{name}'";
                return null;
            }
            if (string.IsNullOrWhiteSpace(value))
            {
                error = $"{name} needs a value";
                return null;
            }
            if (!values.TryAdd(name, value))
            {
                error = $"{name} is given twice";
                return null;
            }
        }
        error = null;
        return new IngestArguments(values.GetValueOrDefault("--data"), values.GetValueOrDefault("--cache"), values.GetValueOrDefault("--field"));
    }
}
