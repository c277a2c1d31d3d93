"""atticduct: attic heat balance, attic duct gains and the house load they add.

Subpackage map (see DEVELOPERS.md): physics modules are pure functions of SI values
(``atmosphere``, ``sky``, ``solar``, ``convection``, ``radiation``, ``ventilation``,
``geometry``, ``coverings``); ``model`` and ``balance`` assemble and solve the node network;
``house`` adds up the loads; ``case`` reads case files; ``cli`` is the command line.
"""

__version__ = "0.1.0"
