"""The couple library: TOML reading, validation, layering and safe writing."""
