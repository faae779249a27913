using SharpFuzz;

namespace Mosaic.Fuzz;

/// <summary>
/// Fuzzing entry point: <c>Mosaic.Fuzz file|decoders</c> under afl-fuzz, or
/// <c>Mosaic.Fuzz file|decoders --replay INPUT...</c> to run saved inputs once and print what each does.
/// Only the reader's own typed errors count as a rejection; any other exception is a crash for afl-fuzz to keep.
/// </summary>
public static class Program
{
    public static int Main(string[] args)
    {
        if (args.Length == 0 || ResolveTarget(args[0]) is not { } target)
        {
            Console.Error.WriteLine("usage: Mosaic.Fuzz file|decoders [--replay INPUT...]");
            return 2;
        }
        if (args.Length > 1 && args[1] == "--replay") return Replay(target, args[2..]);
        Fuzzer.OutOfProcess.Run(target);
        return 0;
    }

    private static Action<Stream>? ResolveTarget(string name) => name switch
    {
        "file" => FileTarget.Run,
        "decoders" => DecoderTarget.Run,
        _ => null,
    };

    private static int Replay(Action<Stream> target, string[] inputs)
    {
        var failures = 0;
        foreach (var input in inputs)
        {
            try
            {
                using var stream = File.OpenRead(input);
                target(stream);
                Console.WriteLine($"{input}: handled");
            }
            catch (Exception e)
            {
                failures++;
                Console.WriteLine($"{input}: CRASH {e}");
            }
        }
        return failures == 0 ? 0 : 1;
    }
}
