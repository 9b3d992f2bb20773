"""Input and output: bundled data, the material library, the project file, JSON and text results."""
