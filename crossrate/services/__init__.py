"""Services combining the core and the couple library: prediction, screening, maps, checks, fits."""
