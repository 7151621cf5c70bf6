using Microsoft.AspNetCore.Mvc;
using System.Threading.RateLimiting;
using Microsoft.AspNetCore.RateLimiting;

namespace Atlas.Api.Security;

/// <summary>The rate-limit policy of the expensive endpoints: a fixed one-minute window per client address.</summary>
public static class RateLimits
{
    public const string Expensive = "expensive";

    /// <summary>Puts an endpoint under the expensive-request limit and documents its 429 problem answer.</summary>
    public static RouteHandlerBuilder RequireExpensiveLimit(this RouteHandlerBuilder endpoint) =>
        endpoint.RequireRateLimiting(Expensive).ProducesProblem(StatusCodes.Status429TooManyRequests);

    public static void Configure(RateLimiterOptions limiter, AtlasApiOptions options)
    {
        limiter.RejectionStatusCode = StatusCodes.Status429TooManyRequests;
        limiter.AddPolicy(Expensive, http => RateLimitPartition.GetFixedWindowLimiter(
            http.Connection.RemoteIpAddress?.ToString() ?? "unknown",
            _ => new FixedWindowRateLimiterOptions
            {
                PermitLimit = options.ExpensiveRequestsPerMinute,
                Window = TimeSpan.FromMinutes(1),
                QueueLimit = 0,
                AutoReplenishment = true,
            }));
        limiter.OnRejected = async (context, cancel) =>
        {
            var seconds = context.Lease.TryGetMetadata(MetadataName.RetryAfter, out var retry) ? (int)Math.Ceiling(retry.TotalSeconds) : 60;
            context.HttpContext.Response.Headers.RetryAfter = seconds.ToString(CultureInfo.InvariantCulture);
            var problems = context.HttpContext.RequestServices.GetRequiredService<IProblemDetailsService>();
            await problems.WriteAsync(new ProblemDetailsContext
            {
                HttpContext = context.HttpContext,
                ProblemDetails = new ProblemDetails
                {
                    Status = 429,
                    Title = "Too many requests",
                    Detail = $"This address has used its {options.ExpensiveRequestsPerMinute} requests per minute on the computing endpoints. " +
                             $"Retry after {seconds} s, or fetch layer downloads once and compute locally.",
                },
            });
        };
    }
}
