"""Ducts: heat gain and leakage of air ducts in a given surrounding, with moist-air properties.

This package imports nothing from ``attic``: it knows a duct, the air in it and the air and
surfaces around it, and can be used alone ("this duct in a 130 °F attic").
"""
