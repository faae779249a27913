namespace Mosaic.Server.ClientFiles;

/// <summary>
/// How the browser client is served: the page with its module preloads (<see cref="ClientPageMiddleware"/>), then the
/// web root's files. The files keep their plain names (modules import each other by them), so instead of a long
/// lifetime every answer says no-cache: the browser keeps its copy and revalidates it with the ETag, a 304 when unchanged.
/// </summary>
public static class ClientFileServing
{
    public const string Revalidate = "no-cache";

    public static WebApplication UseClientFiles(this WebApplication app)
    {
        ArgumentNullException.ThrowIfNull(app);
        var page = new ClientPage(app.Environment.WebRootFileProvider);
        // Made before the first visitor, who would otherwise wait for the module files to be read.
        app.Lifetime.ApplicationStarted.Register(() => _ = page.Current);
        app.UseMiddleware<ClientPageMiddleware>(page);
        app.UseStaticFiles(new StaticFileOptions
        {
            OnPrepareResponse = file => file.Context.Response.Headers.CacheControl = Revalidate,
        });
        return app;
    }
}
