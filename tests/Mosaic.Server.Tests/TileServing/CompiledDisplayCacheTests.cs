using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Imaging.Rendering;
using Mosaic.Server.Tiles;

namespace Mosaic.Server.Tests.TileServing;

/// <summary>
/// The compiled displays' bound in bytes, with real tone maps. Keeping the most recently used within a byte budget
/// and computing a missing key once for concurrent callers are common practice; the sizes come from the tone maps
/// themselves, each checked to hold at least its table (one byte an entry).
/// </summary>
public sealed class CompiledDisplayCacheTests
{
    private static ToneMap Compile(int n) =>
        ToneMap.Create(new ValueRange(100 + n, 5000), new AsinhCurve(100 + n, 5000, 30, 100 + n), new GrayPalette());

    [Fact]
    public void Many_new_displays_stay_within_the_bound_and_the_oldest_are_dropped_first()
    {
        var sample = Compile(0);
        // A table entry is one byte: the map holds at least its table.
        Assert.True(sample.TableEntries >= ToneMap.DefaultEntries);
        Assert.True(sample.RetainedBytes >= sample.TableEntries);
        var capacity = 5 * sample.RetainedBytes + 5 * 1024;
        var cache = new CompiledDisplayCache<ToneMap>(capacity, m => m.RetainedBytes);
        var compiles = 0;
        for (var n = 0; n < 40; n++)
        {
            var i = n;
            cache.GetOrCompile($"d{i}", () => { compiles++; return Compile(i); });
            Assert.True(cache.CurrentBytes <= capacity, $"after {n + 1} displays {cache.CurrentBytes} bytes are kept, over the bound of {capacity}");
        }
        Assert.Equal(40, compiles);
        Assert.Equal(5, cache.Count);
        Assert.True(cache.CurrentBytes >= 5 * sample.RetainedBytes);

        // The five most recent are kept (no compile); the first was dropped and compiles again.
        for (var n = 35; n < 40; n++) cache.GetOrCompile($"d{n}", () => throw new InvalidOperationException($"d{n} should be kept"));
        var again = 0;
        cache.GetOrCompile("d0", () => { again++; return Compile(0); });
        Assert.Equal(1, again);

        // Kept now, most recent first: d0, d39, d38, d37, d36. Using d36 makes it recent, so the next new display
        // drops d37, the least recently used, not d36.
        cache.GetOrCompile("d36", () => throw new InvalidOperationException("d36 should be kept"));
        cache.GetOrCompile("d99", () => Compile(99));
        cache.GetOrCompile("d36", () => throw new InvalidOperationException("d36 should still be kept"));
        var d37 = 0;
        cache.GetOrCompile("d37", () => { d37++; return Compile(37); });
        Assert.Equal(1, d37);
    }

    [Fact]
    public async Task Concurrent_requests_for_one_new_display_compile_it_once()
    {
        var cache = new CompiledDisplayCache<ToneMap>(64L << 20, m => m.RetainedBytes);
        var compiles = 0;
        using var gate = new ManualResetEventSlim();
        ToneMap Slow()
        {
            Interlocked.Increment(ref compiles);
            gate.Wait(TimeSpan.FromSeconds(10));
            return Compile(7);
        }

        var asks = Enumerable.Range(0, 16).Select(_ => Task.Run(() => cache.GetOrCompile("screen", Slow))).ToArray();
        await Task.Delay(200);
        gate.Set();
        var maps = await Task.WhenAll(asks);
        Assert.Equal(1, compiles);
        Assert.All(maps, m => Assert.Same(maps[0], m));
        Assert.Equal(1, cache.Count);
    }

    [Fact]
    public void A_failed_compile_is_not_kept()
    {
        var cache = new CompiledDisplayCache<ToneMap>(64L << 20, m => m.RetainedBytes);
        Assert.Throws<InvalidOperationException>(() => cache.GetOrCompile("k", () => throw new InvalidOperationException("band not ready")));
        Assert.Equal(0, cache.Count);
        Assert.Equal(0, cache.CurrentBytes);
        var map = cache.GetOrCompile("k", () => Compile(1));
        Assert.Same(map, cache.GetOrCompile("k", () => throw new InvalidOperationException("should be kept")));
    }

    [Fact]
    public void A_display_larger_than_the_bound_is_answered_but_not_kept_beside_others()
    {
        var cache = new CompiledDisplayCache<ToneMap>(1024, m => m.RetainedBytes);
        cache.GetOrCompile("a", () => Compile(1));
        cache.GetOrCompile("b", () => Compile(2));
        Assert.Equal(1, cache.Count);
        Assert.Throws<ArgumentOutOfRangeException>(() => new CompiledDisplayCache<ToneMap>(0, m => m.RetainedBytes));
    }
}
