"""NDS 2018 allowable stress design of wood bending members with ASCE 7-16 ASD combinations."""

from .. import register
from .basis import NdsBasis

register(NdsBasis())
