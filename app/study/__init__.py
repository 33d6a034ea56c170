"""The staging study front to back in the window: the request and its plain-data answer, apply an option, table cells, the worker, the panel and its tab."""
