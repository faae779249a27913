namespace Mosaic.Imaging.Composite;

/// <summary>One thing per colour channel, in the order red, green, blue.</summary>
public readonly record struct Channels<T>(T Red, T Green, T Blue)
{
    public const int Count = 3;

    /// <summary>The same value in all three channels.</summary>
    public static Channels<T> All(T value) => new(value, value, value);

    /// <summary>0 = red, 1 = green, 2 = blue.</summary>
    public T this[int channel] => channel switch
    {
        0 => Red,
        1 => Green,
        2 => Blue,
        _ => throw new ArgumentOutOfRangeException(nameof(channel), channel, "a channel is 0 (red), 1 (green) or 2 (blue)"),
    };

    public Channels<TResult> Select<TResult>(Func<T, TResult> map)
    {
        ArgumentNullException.ThrowIfNull(map);
        return new(map(Red), map(Green), map(Blue));
    }

    public IEnumerable<T> AsEnumerable()
    {
        yield return Red;
        yield return Green;
        yield return Blue;
    }
}
