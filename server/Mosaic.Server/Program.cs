using Mosaic.Server.Hosting;

if (args is ["generate-demo", .. var demoArgs])
    return DemoField.RunCommand(demoArgs);
if (args is ["ingest", .. var ingestArgs])
    return IngestCommand.Run(ingestArgs);

if (ServerArguments.Problem(args) is { } problem)
    return ServerArguments.Fail(problem);

var builder = WebApplication.CreateBuilder(args);
builder.UseServingDefaults();
MosaicOptions options;
try
{
    options = MosaicOptions.FromConfiguration(builder.Configuration);
    builder.UseHeapLimit(options);
}
catch (Exception e) when (ServerArguments.IsOptionError(e))
{
    return ServerArguments.Fail(e.Message);
}
if (string.IsNullOrEmpty(builder.Configuration["urls"]))
    builder.WebHost.UseUrls("http://127.0.0.1:5000"); // loopback unless told otherwise
builder.Services.AddMosaic(options);

if (options.ServesDemo) DemoField.EnsureGenerated(options);

var app = builder.Build();
app.UseMosaic();
app.Run();
return 0;

/// <summary>Visible to the test host.</summary>
public partial class Program;
