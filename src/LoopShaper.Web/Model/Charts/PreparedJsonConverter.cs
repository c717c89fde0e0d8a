using System.Text.Json;
using System.Text.Json.Serialization;

namespace LoopShaper.Web.Model.Charts;

/// <summary>Writes a prepared object's JSON as it is.</summary>
/// <typeparam name="T">The prepared type.</typeparam>
public sealed class PreparedJsonConverter<T> : JsonConverter<T>
    where T : IPreparedJson
{
    /// <inheritdoc />
    public override T Read(ref Utf8JsonReader reader, Type typeToConvert, JsonSerializerOptions options)
        => throw new NotSupportedException("Figures are only written.");

    /// <inheritdoc />
    public override void Write(Utf8JsonWriter writer, T value, JsonSerializerOptions options) => writer.WriteRawValue(value.Json, skipInputValidation: true);
}
