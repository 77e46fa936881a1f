"""Pure physics kernels in SI units: numpy and scipy only, vectorised, NaN-transparent.

Each function's docstring gives its equation and published source.
"""

from coilplan.physics.dispersion import *  # noqa: F403
from coilplan.physics.dispersion import __all__ as _dispersion_all
from coilplan.physics.frequency import *  # noqa: F403
from coilplan.physics.frequency import __all__ as _frequency_all
from coilplan.physics.loops import *  # noqa: F403
from coilplan.physics.loops import __all__ as _loops_all
from coilplan.physics.magnetic import *  # noqa: F403
from coilplan.physics.magnetic import __all__ as _magnetic_all
from coilplan.physics.multilayer import *  # noqa: F403
from coilplan.physics.multilayer import __all__ as _multilayer_all
from coilplan.physics.resonance import *  # noqa: F403
from coilplan.physics.resonance import __all__ as _resonance_all
from coilplan.physics.rod import *  # noqa: F403
from coilplan.physics.rod import __all__ as _rod_all
from coilplan.physics.solenoid import *  # noqa: F403
from coilplan.physics.solenoid import __all__ as _solenoid_all

__all__ = sorted([
    *_dispersion_all,
    *_frequency_all,
    *_loops_all,
    *_magnetic_all,
    *_multilayer_all,
    *_resonance_all,
    *_rod_all,
    *_solenoid_all,
])
