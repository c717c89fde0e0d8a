using System.Collections;
using System.Collections.Concurrent;
using System.Reflection;
using System.Text.Json;
using System.Text.Json.Serialization;
using Plotly.Blazor;

namespace LoopShaper.Web.Model.Charts;

/// <summary>
/// Plotly.Blazor's JSON for a figure, written with the property lists read once per type. Plotly.Blazor 7.2 reads every
/// property's attributes by reflection on every redraw (about 10 ms per chart on the server); the JSON written here is
/// the same, character for character (tests compare it with Plotly.Blazor's own), and goes to the chart as a
/// <see cref="PreparedTrace"/> or <see cref="PreparedLayout"/>, which Plotly.Blazor passes through as it is.
/// </summary>
public static class PlotlyJson
{
    /// <summary>Options as Plotly.Blazor's own: names as declared, nulls left out.</summary>
    private static readonly JsonSerializerOptions Options = new()
    {
        PropertyNamingPolicy = null,
        DefaultIgnoreCondition = JsonIgnoreCondition.WhenWritingNull,
        Converters = { new Factory(), new PolymorphicConverter<ITrace>(), new DateTimeConverter(), new DateTimeOffsetConverter() },
    };

    /// <summary>The JSON Plotly.Blazor writes for a trace, layout or any of its parts.</summary>
    public static string Serialize(object value) => JsonSerializer.Serialize(value, value.GetType(), Options);

    /// <summary>The trace with its JSON written now.</summary>
    public static ITrace Prepare(ITrace trace) => trace is PreparedTrace ? trace : new PreparedTrace(Serialize(trace), trace.Type);

    /// <summary>The layout with its JSON written now.</summary>
    public static Layout Prepare(Layout layout) => layout is PreparedLayout ? layout : new PreparedLayout(Serialize(layout));

    /// <summary>Writes Plotly.Blazor's types the way its own converter does, from property lists kept per type.</summary>
    private sealed class Factory : JsonConverterFactory
    {
        private static readonly ConcurrentDictionary<Type, bool> IsPlotly = new();

        public override bool CanConvert(Type typeToConvert) => IsPlotly.GetOrAdd(
            typeToConvert,
            t => t.GetCustomAttribute<JsonConverterAttribute>(inherit: false)?.ConverterType == typeof(PlotlyConverter));

        public override JsonConverter CreateConverter(Type typeToConvert, JsonSerializerOptions options)
            => (JsonConverter)Activator.CreateInstance(typeof(Writer<>).MakeGenericType(typeToConvert))!;
    }

    /// <summary>One property as Plotly.Blazor's converter sees it.</summary>
    private sealed record Member(PropertyInfo Property, string Name, bool IsArray, bool IsSubplot, PropertyInfo? Single);

    private sealed class Writer<T> : JsonConverter<T>
    {
        private static readonly Member[] Members = [.. typeof(T).GetProperties().Select(Describe)];

        public override T Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
            => throw new NotSupportedException("Figures are only written.");

        public override void Write(Utf8JsonWriter writer, T value, JsonSerializerOptions options)
        {
            writer.WriteStartObject();
            foreach (var m in Members)
            {
                object? v = m.Property.GetValue(value);
                if (v is null)
                {
                    continue;
                }

                if (m.IsSubplot)
                {
                    int n = 0;
                    foreach (object? item in (IEnumerable)v)
                    {
                        writer.WritePropertyName(n == 0 ? m.Name : m.Name + (n + 1).ToString(System.Globalization.CultureInfo.InvariantCulture));
                        JsonSerializer.Serialize(writer, item, options);
                        n++;
                    }
                }
                else if (!m.IsArray || m.Single?.GetValue(value) is null)
                {
                    // An array property is written only when its single-value counterpart is unset.
                    writer.WritePropertyName(m.Name);
                    JsonSerializer.Serialize(writer, v, options);
                }
            }

            writer.WriteEndObject();
        }

        private static Member Describe(PropertyInfo p)
        {
            bool isArray = p.GetCustomAttribute<ArrayAttribute>() is not null;
            bool isSubplot = p.GetCustomAttribute<SubplotAttribute>() is not null;
            if (isArray && isSubplot)
            {
                throw new NotSupportedException("A property cannot be both an array and a subplot list.");
            }

            var single = isArray ? typeof(T).GetProperty(p.Name.Replace("Array", string.Empty, StringComparison.Ordinal))
                ?? throw new ArgumentException("No single-value counterpart for " + p.Name) : null;
            return new Member(p, p.GetCustomAttribute<JsonPropertyNameAttribute>(inherit: true)?.Name ?? p.Name, isArray, isSubplot, single);
        }
    }
}
