"""Trade constants of the supply path: source, feeder, starting and protection.

Each constant names where it comes from; "common practice" has no single published source.
"""

from __future__ import annotations

import math

#: sqrt(3): line-to-line over line-to-neutral voltage of a balanced three-phase system.
SQRT3 = math.sqrt(3.0)

#: Temperature coefficient of resistance at 20 degC [1/K]: annealed copper 0.00393, aluminium
#: 0.00403 (IEC 60287-1-1, Table 1; IEC 60228 Annex B uses the same figures, from memory).
#: NEC Chapter 9 Table 8 note 2 gives the same law referred to 75 degC (0.00323, 0.00330).
ALPHA20_PER_K = {"copper": 0.00393, "aluminium": 0.00403}

#: Resistivity in normal service for the voltage-drop formula of IEC 60364-5-52 Annex G:
#: 1.25 x the resistivity at 20 degC, 0.0225 ohm mm2/m copper and 0.036 ohm mm2/m aluminium
#: [ohm m] (IEC 60364-5-52:2009 G.52.1).
ANNEX_G_RESISTIVITY_OHM_M = {"copper": 0.0225e-6, "aluminium": 0.036e-6}
#: Reactance per length "in the absence of other details" (IEC 60364-5-52:2009 G.52.1):
#: 0.08 mohm/m [ohm/m].
ANNEX_G_REACTANCE_OHM_PER_M = 0.08e-3

#: Feet in a metre's reciprocal: NEC tables are per 1000 ft [m].
KFT_M = 304.8

#: Default limits, common practice, no published source: 5 % running drop (NFPA 70 210.19
#: and 215.2 informational notes suggest 3 % branch, 5 % feeder plus branch; IEC 60364-5-52
#: Annex G 5 % for other uses from a public LV supply), 15 % starting dip at the starting
#: motor's terminals, 10 % at a bus shared with other loads.
RUNNING_DROP_LIMIT = 0.05
STARTING_DIP_LIMIT_TERMINALS = 0.15
STARTING_DIP_LIMIT_SHARED_BUS = 0.10

#: Torque margin over the load's breakaway torque at the dipped voltage: 10 % (common
#: practice, no published source).
BREAKAWAY_TORQUE_MARGIN = 0.10
