using System.Security.Cryptography;
using System.Text;
using Mosaic.TileCache.Disk;

namespace Mosaic.TileCache.Tests;

/// <summary>
/// The disk tier: byte bound, least-recently-used eviction (common practice), rebuild from file times, damaged files
/// as misses. Sizes on disk are counted from the file system, apart from the store's own count; the file naming is
/// checked against the SHA-256 test vector of FIPS 180-2.
/// </summary>
public sealed class DiskTileStoreTests : IDisposable
{
    private const long OneMiB = 1L << 20;
    private readonly TempFolder _folder = new();

    public void Dispose() => _folder.Dispose();

    private async Task<DiskTileStore> OpenAsync(long capacity = 64 * OneMiB)
    {
        var store = new DiskTileStore(new DiskTileStoreOptions { Directory = _folder.Path, CapacityBytes = capacity });
        await store.IndexRebuilt.WaitAsync(TimeSpan.FromSeconds(30));
        return store;
    }

    /// <summary>Bytes that depend on the key, so a tile read back under the wrong key shows.</summary>
    private static byte[] TileFor(string key, int length)
    {
        var tile = new byte[length];
        var seed = SHA256.HashData(Encoding.UTF8.GetBytes(key));
        for (var i = 0; i < length; i++) tile[i] = (byte)(seed[i % seed.Length] + i / seed.Length);
        return tile;
    }

    [Fact]
    public async Task Keeps_tiles_by_key_in_files_named_by_the_keys_SHA256()
    {
        var store = await OpenAsync();
        var tile = TileFor("field/3/1/2", 5000);
        await store.SetAsync("field/3/1/2", tile);

        Assert.Equal(tile, await store.GetAsync("field/3/1/2"));
        Assert.Null(await store.GetAsync("field/3/1/3"));
        // FIPS 180-2 appendix B.1: SHA-256("abc") = ba7816bf 8f01cfea 414140de 5dae2223 b00361a3 ...; the file name is its first 128 bits.
        Assert.Equal(Path.Combine(_folder.Path, "ba", "ba7816bf8f01cfea414140de5dae2223.tile"), store.PathFor("abc"));
        Assert.True(File.Exists(store.PathFor("field/3/1/2")));
        Assert.Empty(Directory.EnumerateFiles(_folder.Path, "*.tmp", SearchOption.AllDirectories));
    }

    [Fact]
    public async Task Stays_within_its_byte_bound()
    {
        var store = await OpenAsync(OneMiB);
        for (var i = 0; i < 100; i++)
        {
            await store.SetAsync($"tile/{i}", TileFor($"tile/{i}", 50_000));
            Assert.True(store.CurrentBytes <= OneMiB, $"{store.CurrentBytes} bytes counted after {i + 1} tiles");
        }
        // The files on disk, counted apart from the store, obey the bound as well and match its count.
        Assert.InRange(_folder.TileFileBytes(), 1, OneMiB);
        Assert.Equal(store.CurrentBytes, _folder.TileFileBytes());
        Assert.Equal(store.Count, _folder.TileFileCount());
        // 1 MiB holds 20 tiles of 50,000 bytes plus header: the newest 20 remain, every older one is gone.
        for (var i = 0; i < 100; i++)
            Assert.Equal(i >= 80, await store.GetAsync($"tile/{i}") is not null);
    }

    [Fact]
    public async Task Evicts_the_least_recently_used_first()
    {
        // Common practice (LRU): a read makes a tile recent, so the tile neither written nor read since goes first.
        var store = await OpenAsync(OneMiB);
        foreach (var key in new[] { "a", "b", "c" }) await store.SetAsync(key, TileFor(key, 300_000));
        Assert.NotNull(await store.GetAsync("a"));
        await store.SetAsync("d", TileFor("d", 300_000));

        Assert.Null(await store.GetAsync("b"));
        Assert.False(File.Exists(store.PathFor("b")));
        foreach (var key in new[] { "a", "c", "d" }) Assert.Equal(TileFor(key, 300_000), await store.GetAsync(key));
        Assert.Equal(3, _folder.TileFileCount());
    }

    [Fact]
    public async Task A_restart_rebuilds_the_index_from_the_files_oldest_used_first()
    {
        var keys = new[] { "k0", "k1", "k2", "k3", "k4" };
        var first = await OpenAsync();
        foreach (var key in keys) await first.SetAsync(key, TileFor(key, 400_000));
        // Give the files last uses an hour apart, k3 the oldest and k0 the next: the order the new index must rebuild.
        var now = DateTime.UtcNow;
        var hoursAgo = new Dictionary<string, int> { ["k3"] = 10, ["k0"] = 9, ["k4"] = 8, ["k1"] = 7, ["k2"] = 6 };
        foreach (var (key, hours) in hoursAgo)
        {
            File.SetLastWriteTimeUtc(first.PathFor(key), now.AddHours(-hours));
            File.SetLastAccessTimeUtc(first.PathFor(key), now.AddHours(-hours));
        }

        var roomy = await OpenAsync();
        Assert.Equal(5, roomy.Count);
        Assert.Equal(_folder.TileFileBytes(), roomy.CurrentBytes);
        Assert.Equal(new[] { "k3", "k0", "k4", "k1", "k2" }.Select(DiskTileFile.NameOf), roomy.NamesOldestFirst());

        // A smaller bound on the next start keeps the three most recently used: each file is 24 + 2 + 400,000 bytes,
        // three (1,200,078) fit in 1,300,000 and four do not.
        var smaller = await OpenAsync(1_300_000);
        Assert.Equal(3, smaller.Count);
        Assert.False(File.Exists(smaller.PathFor("k3")));
        Assert.False(File.Exists(smaller.PathFor("k0")));
        foreach (var key in new[] { "k4", "k1", "k2" }) Assert.Equal(TileFor(key, 400_000), await smaller.GetAsync(key));
    }

    [Fact]
    public async Task A_read_marks_the_file_used_for_the_next_start()
    {
        var store = await OpenAsync();
        await store.SetAsync("old", TileFor("old", 1000));
        await store.SetAsync("new", TileFor("new", 1000));
        var past = DateTime.UtcNow.AddDays(-2);
        File.SetLastWriteTimeUtc(store.PathFor("old"), past);
        File.SetLastAccessTimeUtc(store.PathFor("old"), past);
        File.SetLastWriteTimeUtc(store.PathFor("new"), past.AddHours(1));
        File.SetLastAccessTimeUtc(store.PathFor("new"), past.AddHours(1));
        Assert.NotNull(await store.GetAsync("old"));

        var restarted = await OpenAsync();
        Assert.Equal(new[] { "new", "old" }.Select(DiskTileFile.NameOf), restarted.NamesOldestFirst());
    }

    [Fact]
    public async Task Leftover_temporary_files_are_removed_on_start_and_other_files_left_alone()
    {
        var sub = Directory.CreateDirectory(Path.Combine(_folder.Path, "ab"));
        var leftover = Path.Combine(sub.FullName, "ab000000000000000000000000000000.0123.tmp");
        await File.WriteAllBytesAsync(leftover, new byte[100]);
        File.SetLastWriteTimeUtc(leftover, DateTime.UtcNow.AddMinutes(-5));
        var stranger = Path.Combine(_folder.Path, "notes.txt");
        await File.WriteAllTextAsync(stranger, "kept");

        var store = await OpenAsync();
        Assert.False(File.Exists(leftover));
        Assert.True(File.Exists(stranger));
        Assert.Equal(0, store.Count);
    }

    [Theory]
    [InlineData("flipped byte")]
    [InlineData("cut short")]
    [InlineData("empty")]
    [InlineData("another key's file")]
    public async Task A_damaged_file_is_a_miss_and_is_removed(string damage)
    {
        var store = await OpenAsync();
        var tile = TileFor("victim", 4000);
        await store.SetAsync("victim", tile);
        await store.SetAsync("other", TileFor("other", 4000));
        var path = store.PathFor("victim");
        var bytes = await File.ReadAllBytesAsync(path);
        switch (damage)
        {
            case "flipped byte":
                bytes[^100] ^= 0x01;
                await File.WriteAllBytesAsync(path, bytes);
                break;
            case "cut short":
                await File.WriteAllBytesAsync(path, bytes[..(bytes.Length / 2)]);
                break;
            case "empty":
                await File.WriteAllBytesAsync(path, []);
                break;
            case "another key's file":
                File.Copy(store.PathFor("other"), path, overwrite: true);
                break;
        }

        Assert.Null(await store.GetAsync("victim"));
        Assert.False(File.Exists(path));
        Assert.Equal(0, store.Errors); // damage is a miss, not a disk error
        Assert.Equal(1, store.Count);
        await store.SetAsync("victim", tile);
        Assert.Equal(tile, await store.GetAsync("victim"));
    }

    [Fact]
    public async Task A_failing_disk_answers_misses_and_drops_writes_without_throwing()
    {
        // The folder cannot be created: a regular file stands where its parent should be.
        var blocker = Path.Combine(_folder.Path, "blocker");
        await File.WriteAllTextAsync(blocker, "a file, not a folder");
        var store = new DiskTileStore(new DiskTileStoreOptions { Directory = Path.Combine(blocker, "tiles"), CapacityBytes = OneMiB });
        await store.IndexRebuilt;

        await store.SetAsync("k", [1, 2, 3]);
        Assert.Null(await store.GetAsync("k"));
        Assert.True(store.Errors >= 2, $"{store.Errors} errors counted"); // listing at start and the write
        Assert.Equal(0, store.Count);
    }

    [Fact]
    public async Task Concurrent_writers_and_readers_of_the_same_keys_never_see_a_wrong_or_partial_tile()
    {
        var store = await OpenAsync(OneMiB);
        var keys = Enumerable.Range(0, 12).Select(i => $"shared/{i}").ToArray();
        var wrong = 0;
        var workers = Enumerable.Range(0, 8).Select(worker => Task.Run(async () =>
        {
            var random = new Random(worker);
            for (var step = 0; step < 150; step++)
            {
                var key = keys[random.Next(keys.Length)];
                if (random.Next(2) == 0) await store.SetAsync(key, TileFor(key, 100_000));
                else if (await store.GetAsync(key) is { } read && !read.AsSpan().SequenceEqual(TileFor(key, 100_000)))
                    Interlocked.Increment(ref wrong);
            }
        })).ToArray();
        await Task.WhenAll(workers);

        Assert.Equal(0, wrong);
        Assert.Equal(0, store.Errors);
        Assert.True(store.CurrentBytes <= OneMiB, $"{store.CurrentBytes} bytes counted");
        Assert.True(_folder.TileFileBytes() <= store.CurrentBytes, $"{_folder.TileFileBytes()} bytes on disk, {store.CurrentBytes} counted");
        Assert.InRange(_folder.TileFileBytes(), 1, OneMiB);
        Assert.Empty(Directory.EnumerateFiles(_folder.Path, "*.tmp", SearchOption.AllDirectories));
    }

    [Fact]
    public void Rejects_a_bound_too_small_or_a_missing_folder()
    {
        var small = Assert.Throws<ArgumentOutOfRangeException>(() => new DiskTileStore(new DiskTileStoreOptions { Directory = _folder.Path, CapacityBytes = 1000 }));
        Assert.Contains("CapacityBytes", small.Message);
        var blank = Assert.Throws<ArgumentException>(() => new DiskTileStore(new DiskTileStoreOptions { Directory = " " }));
        Assert.Contains("Directory", blank.Message);
    }
}
