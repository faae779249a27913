using Microsoft.AspNetCore.Authentication;
using Microsoft.AspNetCore.Authentication.Cookies;
using Microsoft.AspNetCore.Authorization;
using Microsoft.AspNetCore.DataProtection;
using Microsoft.Extensions.DependencyInjection.Extensions;
using Mosaic.Server.Hosting;

namespace Mosaic.Server.Access;

public static class AccessServices
{
    /// <summary>Authentication (token handler and sign-in cookie), the one access policy, share tokens, and log filters that keep secrets out.</summary>
    public static IServiceCollection AddMosaicAccess(this IServiceCollection services, MosaicOptions options)
    {
        ArgumentNullException.ThrowIfNull(options);
        services.AddSingleton(options.Access);
        services.TryAddSingleton(TimeProvider.System);
        services.AddSingleton<ShareKey>();
        services.AddSingleton<ShareTokens>();
        services.AddSingleton<TokenCheck>();
        services.AddSingleton<FieldVisibility>();
        services.AddSingleton<AccessCookieEvents>();
        services.AddSingleton<IAuthorizationHandler, AccessAuthorizationHandler>();
        services.AddSingleton<Microsoft.AspNetCore.Authorization.IAuthorizationMiddlewareResultHandler, AccessResultHandler>();

        // Cookies stay readable across restarts; the key ring is the server's alone, like the share key.
        var keys = Directory.CreateDirectory(Path.Combine(options.StateDirectory, "cookie-keys"));
        if (!OperatingSystem.IsWindows()) File.SetUnixFileMode(keys.FullName, UnixFileMode.UserRead | UnixFileMode.UserWrite | UnixFileMode.UserExecute);
        services.AddDataProtection().SetApplicationName("Mosaic").PersistKeysToFileSystem(keys);

        services.AddAuthentication(AccessSchemes.Token)
            .AddScheme<AuthenticationSchemeOptions, TokenAuthenticationHandler>(AccessSchemes.Token, null)
            .AddCookie(AccessSchemes.Cookie, cookie =>
            {
                cookie.Cookie.Name = AccessSchemes.CookieName;
                cookie.Cookie.HttpOnly = true;
                cookie.Cookie.SameSite = SameSiteMode.Strict;
                cookie.Cookie.SecurePolicy = CookieSecurePolicy.SameAsRequest;
                cookie.SlidingExpiration = false;
                cookie.EventsType = typeof(AccessCookieEvents);
            });
        var policy = new AuthorizationPolicyBuilder(AccessSchemes.Token).AddRequirements(new AccessRequirement()).Build();
        services.AddAuthorizationBuilder()
            .AddPolicy(AccessRequirement.Policy, policy)
            .SetDefaultPolicy(policy)
            .SetFallbackPolicy(policy);

        services.AddLogging(logging =>
        {
            // The host's own request lines (Debug) print the query as sent, tokens and keys included; RequestLog writes them redacted.
            logging.AddFilter("Microsoft.AspNetCore.Hosting.Diagnostics", LogLevel.Warning);
            // Below Information, SignalR prints each hub call with its arguments, presenter keys among them.
            logging.AddFilter("Microsoft.AspNetCore.SignalR", LogLevel.Information);
            logging.AddFilter("Microsoft.AspNetCore.Http.Connections", LogLevel.Information);
        });
        return services;
    }

    /// <summary>First in the pipeline, so it sees the final status of every request.</summary>
    public static IApplicationBuilder UseRedactedRequestLog(this IApplicationBuilder app) => app.UseMiddleware<RequestLog>();

    /// <summary>After the security headers, before anything that serves: authentication, "?token=" sign-in, the access policy.</summary>
    public static IApplicationBuilder UseMosaicAccess(this IApplicationBuilder app)
    {
        app.UseAuthentication();
        app.UseMiddleware<QueryTokenSignIn>();
        app.UseAuthorization();
        app.UseMiddleware<FieldScopeMiddleware>();
        return app;
    }

    /// <summary>Says at start what the server will let in, so a private field left open by mistake shows in the log.</summary>
    public static void LogAccessSummary(this WebApplication app)
    {
        var options = app.Services.GetRequiredService<AccessOptions>();
        var logger = app.Services.GetRequiredService<ILoggerFactory>().CreateLogger("Mosaic.Server.Access");
        _ = app.Services.GetRequiredService<ShareKey>(); // made now, so a bad key file stops the start
        if (options.Tokens.IsConfigured)
            logger.LogInformation("Access: token required ({Anonymous} for callers without one)",
                options.Anonymous == AnonymousAccess.None ? "nothing" : "public fields");
        else
            logger.LogInformation("Access: open to every caller that reaches the server (no access token configured); private fields are hidden from all");
    }
}
