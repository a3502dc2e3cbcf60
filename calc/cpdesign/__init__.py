"""Cathodic-protection design: galvanic anodes (immersed and buried structures) and impressed current.

One small module per method; each published model is one function whose body is its equation:

- :mod:`.resistivity`: soil resistivity from a Wenner four-pin reading (ASTM G57);
- :mod:`.demand`: coating breakdown and current demand (DNV-RP-B401 method, El-Reedy 2012);
- :mod:`.mass`: net anode mass and anode life (DNV-RP-B401; MIL-HDBK-1004/10);
- :mod:`.anodes`: anode resistance by shape and anode output (DNV-RP-B401 formulas);
- :mod:`.zones` and :mod:`.galvanic`: the offshore galvanic-anode design from the structure's zones;
- :mod:`.buried`: the galvanic-anode method of MIL-HDBK-1004/10 for buried structures;
- :mod:`.groundbed` and :mod:`.impressed`: impressed-current groundbeds (Dwight, the handbooks'
  paralleling factor or Sunde), circuit, rectifier and anode life;
- :mod:`.tank` and :mod:`.tankdesign`: impressed-current anodes inside water storage tanks (the
  handbooks' tank formulas, the fringe factor of short anodes, the anode circle);
- :mod:`.catalogue`, :mod:`.limits`, :mod:`.units`, :mod:`.cautions`: the data lookups, the input
  bounds, the unit factors of the US handbooks and the cautions, each written once.

The design values (current densities, coating constants, anode alloys and types, the handbooks'
tables) are data: ``data/cp_*.yaml`` with their sources and confidence.

JSON entry points (request dict in, result dict out): :func:`anodes_entry`,
:func:`anode_resistance_entry`, :func:`buried_entry`, :func:`groundbed_entry`, :func:`tank_entry`,
:func:`wenner_entry`.
"""

from .anodes import anode_resistance_entry
from .buried import buried_entry
from .galvanic import anodes_entry
from .impressed import groundbed_entry
from .resistivity import wenner_entry
from .tankdesign import tank_entry

__all__ = ["anode_resistance_entry", "anodes_entry", "buried_entry", "groundbed_entry", "tank_entry", "wenner_entry"]
