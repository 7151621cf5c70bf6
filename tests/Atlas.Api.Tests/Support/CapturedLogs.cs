using System.Collections.Concurrent;
using Microsoft.Extensions.Logging;

namespace Atlas.Api.Tests.Support;

/// <summary>A logger provider that keeps every entry with the scope values active when it was written.</summary>
public sealed class CapturedLogs : ILoggerProvider, ISupportExternalScope
{
    private IExternalScopeProvider _scopes = new LoggerExternalScopeProvider();

    public ConcurrentQueue<(string Category, string Message, IReadOnlyList<KeyValuePair<string, object?>> Scope)> Entries { get; } = new();

    public ILogger CreateLogger(string categoryName) => new Logger(this, categoryName);

    public void SetScopeProvider(IExternalScopeProvider scopeProvider) => _scopes = scopeProvider;

    public void Dispose() { }

    private sealed class Logger(CapturedLogs owner, string category) : ILogger
    {
        public IDisposable? BeginScope<TState>(TState state) where TState : notnull => owner._scopes.Push(state);

        public bool IsEnabled(LogLevel logLevel) => true;

        public void Log<TState>(LogLevel logLevel, EventId eventId, TState state, Exception? exception, Func<TState, Exception?, string> formatter)
        {
            var scope = new List<KeyValuePair<string, object?>>();
            owner._scopes.ForEachScope((value, list) =>
            {
                if (value is IEnumerable<KeyValuePair<string, object?>> pairs) list.AddRange(pairs);
                else if (value is IEnumerable<KeyValuePair<string, object>> plain) list.AddRange(plain.Select(p => new KeyValuePair<string, object?>(p.Key, p.Value)));
            }, scope);
            owner.Entries.Enqueue((category, formatter(state, exception), scope));
        }
    }
}
