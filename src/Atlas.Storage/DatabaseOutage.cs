using System.Net.Sockets;
using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// Tells a database outage (no connection, server shutting down, pool exhausted) from other failures: the API answers
/// it with 503, and a worker puts a part of a pass back in the queue instead of failing the pass.
/// </summary>
public static class DatabaseOutage
{
    public static bool Is(Exception exception)
    {
        for (var e = exception; e is not null; e = e.InnerException)
        {
            switch (e)
            {
                case PostgresException p:
                    // Class 08 connection exceptions, 53 insufficient resources, 57P operator intervention.
                    return p.SqlState.StartsWith("08", StringComparison.Ordinal) || p.SqlState.StartsWith("53", StringComparison.Ordinal)
                        || p.SqlState.StartsWith("57P", StringComparison.Ordinal);
                case NpgsqlException:
                case SocketException:
                    return true;
                case TimeoutException when e.Source?.StartsWith("Npgsql", StringComparison.Ordinal) == true:
                    return true;
            }
        }
        return false;
    }
}
