"""A year at the site in the window: profile edits (Qt-free), the worker, the panel and its profile editor."""
