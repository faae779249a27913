using System.Runtime.InteropServices;

namespace Mosaic.Fits.Reading;

/// <summary>
/// pread(2) through a function pointer into the C library, for the many small reads of a tile (one per row): the
/// general RandomAccess path spends about a tenth of a 1 KiB page-cache read on its checks and marshalling, and the
/// C library's pread wrapper another tenth on thread-cancellation bookkeeping, so on x64 and Arm64 the call goes
/// through syscall(2) with the pread64 number. Only on 64-bit Linux with glibc; elsewhere <see cref="IsAvailable"/>
/// is false and callers use RandomAccess.
/// </summary>
internal static unsafe class DirectPRead
{
    // Linux system call numbers of pread64 (arch/x86/entry/syscalls/syscall_64.tbl; include/uapi/asm-generic/unistd.h).
    private const long X64PRead64 = 17;
    private const long Arm64PRead64 = 67;

    private static readonly long SyscallNumber;
    private static readonly delegate* unmanaged<long, long, byte*, nint, long, nint> Syscall;
    private static readonly delegate* unmanaged<int, byte*, nint, long, nint> PRead;

    static DirectPRead()
    {
        // off_t is 64-bit in every 64-bit Linux ABI, so pread has this signature there.
        if (!OperatingSystem.IsLinux() || !Environment.Is64BitProcess || !NativeLibrary.TryLoad("libc.so.6", out var libc)) return;
        SyscallNumber = RuntimeInformation.ProcessArchitecture switch
        {
            Architecture.X64 => X64PRead64,
            Architecture.Arm64 => Arm64PRead64,
            _ => 0,
        };
        // syscall(2) is variadic; with integer arguments only, x64 and Arm64 Linux pass them as in a plain call.
        if (SyscallNumber != 0 && NativeLibrary.TryGetExport(libc, "syscall", out var syscall))
            Syscall = (delegate* unmanaged<long, long, byte*, nint, long, nint>)syscall;
        else if (NativeLibrary.TryGetExport(libc, "pread", out var pread))
            PRead = (delegate* unmanaged<int, byte*, nint, long, nint>)pread;
    }

    public static bool IsAvailable => Syscall != null || PRead != null;

    /// <summary>
    /// Up to buffer.Length bytes of fd at offset: the count read, 0 at the end of the file, negative on an error
    /// (errno is not kept: read the same bytes through RandomAccess for its exception). The caller holds the handle open.
    /// </summary>
    public static int Read(int fd, Span<byte> buffer, long offset)
    {
        fixed (byte* p = buffer)
            return (int)(Syscall != null ? Syscall(SyscallNumber, fd, p, buffer.Length, offset) : PRead(fd, p, buffer.Length, offset));
    }
}
