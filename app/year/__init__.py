"""A year at the site in the window: profile edits (Qt-free), the worker, the panel, its profile
editor (a table model over the document's entries: profile_model.py) and the results view."""
