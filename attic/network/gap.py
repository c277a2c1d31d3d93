"""The ventilated gap under a covering on battens (tile): the heat flows of each plane's gap, for the network."""

from __future__ import annotations

import numpy as np

from attic.network.nodes import N_PLANES
from attic.physics import channel

GAP_EMITTANCE = 0.9  # tile underside and the underlayment on the deck (common practice, no source)


def gap_flows(net, T_cover, T_deck, T_gap):
    """Heat flows of the ventilated gap of each plane of a Network, W, arrays (n, 2).

    gap_from_cover and gap_from_deck: convection from each face to the gap air (channel.channel_nusselt:
    Shah & London laminar, Gnielinski turbulent); gap_radiation: covering to deck across the gap;
    gap_air_out: heat the air carries out at the ridge (buoyancy against friction and entry/exit losses).
    """
    from ducts.air_transport import conductivity_sutherland, viscosity_sutherland

    Ap = net.areas[:N_PLANES]
    T_o = net.T_out[:, None]
    rho_o = net.rho_out[:, None]
    rho_g = rho_o * T_o / T_gap
    mu, k = viscosity_sutherland(T_gap), conductivity_sutherland(T_gap)
    dp = channel.stack_pressure(rho_o, T_o, T_gap, net.slope_length * np.sin(net.tilt))
    V = channel.channel_velocity(dp, net.slope_length, net.gap, mu, rho_g)
    D_h = 2.0 * net.gap
    h = channel.channel_nusselt(rho_g * V * D_h / mu, net.cp[:, None] * mu / k) * k / D_h
    width = Ap / net.slope_length
    m_cp = rho_g * V * net.gap * width * net.cp[:, None]
    return {
        "gap_from_cover": h * Ap * (T_cover - T_gap),
        "gap_from_deck": h * Ap * (T_deck - T_gap),
        "gap_radiation": Ap * channel.radiation_between_plates(T_cover, T_deck, GAP_EMITTANCE, GAP_EMITTANCE),
        "gap_air_out": channel.channel_heat_to_air(m_cp, 2.0 * h * Ap, 0.5 * (T_cover + T_deck), T_o),
        "gap_m_dot": m_cp / net.cp[:, None],
    }

