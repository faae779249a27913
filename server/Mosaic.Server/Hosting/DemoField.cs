using Mosaic.Demo;

namespace Mosaic.Server.Hosting;

/// <summary>The synthetic demo field: generated on first start when no --data is given, or on its own by `generate-demo`.</summary>
public static class DemoField
{
    public const string FieldId = "demo";

    /// <summary>The sizes `generate-demo --preset` and the server's --demo-preset accept.</summary>
    public static IReadOnlyList<string> Presets { get; } = ["small", "default", "large"];

    /// <summary>The presets as a message names them: "small, default or large".</summary>
    public static string PresetChoices => $"{string.Join(", ", Presets.SkipLast(1))} or {Presets[^1]}";

    public static void EnsureGenerated(MosaicOptions options)
    {
        var folder = Path.Combine(options.DataDirectory, FieldId);
        if (DemoFieldGenerator.IsComplete(folder)) return;
        Console.WriteLine($"Generating the synthetic demo field ({options.DemoPreset}) in {folder} ...");
        Generate(folder, options.DemoPreset);
    }

    /// <summary>`generate-demo --out DIR [--preset small|default|large]`.</summary>
    public static int RunCommand(string[] args)
    {
        string? output = null;
        var preset = "default";
        for (var i = 0; i < args.Length; i++)
        {
            switch (args[i])
            {
                case "--out" when i + 1 < args.Length: output = args[++i]; break;
                case "--preset" when i + 1 < args.Length: preset = args[++i]; break;
                default:
                    Console.Error.WriteLine($"generate-demo: unknown argument '{args[i]}'. Usage: generate-demo --out DIR [--preset small|default|large]");
                    return 2;
            }
        }
        if (output is null)
        {
            Console.Error.WriteLine("generate-demo: --out DIR is required (the folder that becomes the field).");
            return 2;
        }
        try
        {
            Generate(Path.GetFullPath(output), preset);
            return 0;
        }
        catch (ArgumentException e)
        {
            Console.Error.WriteLine($"generate-demo: {e.Message}");
            return 2;
        }
    }

    private static void Generate(string folder, string preset)
    {
        var options = preset switch
        {
            "small" => DemoFieldOptions.Small(folder),
            "default" => DemoFieldOptions.Default(folder),
            "large" => DemoFieldOptions.Large(folder),
            _ => throw new ArgumentException($"unknown preset '{preset}': use {PresetChoices}"),
        };
        var clock = System.Diagnostics.Stopwatch.StartNew();
        var shown = -1;
        DemoFieldGenerator.Generate(options, new Progress(p =>
        {
            var percent = (int)(p * 100);
            if (percent / 10 == shown / 10) return;
            shown = percent;
            Console.WriteLine($"  demo field: {percent}%");
        }));
        Console.WriteLine($"Demo field ready in {clock.Elapsed.TotalSeconds:F1} s: {folder}");
    }

    private sealed class Progress(Action<double> report) : IProgress<double>
    {
        public void Report(double value) => report(value);
    }
}
