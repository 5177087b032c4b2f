"""homogenize."""
