"""A client for the parsimetry service: compare and search models, read back, verify and replay records."""
from .client import Client
from .columns import columns_from_frame
from .errors import ParsimetryError, UnreadableRecordsError

__all__ = ["Client", "ParsimetryError", "UnreadableRecordsError", "columns_from_frame"]
__version__ = "0.1.0"
