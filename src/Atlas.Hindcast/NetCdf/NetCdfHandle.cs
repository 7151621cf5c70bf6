using System.Runtime.InteropServices;
using Atlas.Hindcast.Native;

namespace Atlas.Hindcast;

/// <summary>Owns one open netCDF id and closes it exactly once, also when the owner is never disposed.</summary>
internal sealed class NetCdfHandle : SafeHandle
{
    public NetCdfHandle(int ncid) : base(new IntPtr(-1), ownsHandle: true) => SetHandle(new IntPtr(ncid));

    public override bool IsInvalid => handle == new IntPtr(-1);

    public int Id
    {
        get
        {
            ObjectDisposedException.ThrowIf(IsClosed, this);
            return (int)handle;
        }
    }

    /// <summary>The status nc_close returned; a failed close of a file being written means lost data.</summary>
    public int CloseStatus { get; private set; }

    protected override bool ReleaseHandle()
    {
        lock (NetCdfNative.Gate) CloseStatus = NetCdfNative.nc_close((int)handle);
        return true;
    }
}
