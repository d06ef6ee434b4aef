/**
 * Noise budgets in volts: what a design with its noise source, resistors and op-amps really puts
 * out, stage by stage, with headroom, clip probability, slew and the ranked noise contributors.
 * Plain Java on the nodal model ({@link org.roseate.model.NodalSolver}); the CLI and the window are
 * adapters. Entry point: {@link org.roseate.budget.NoiseBudget}.
 */
package org.roseate.budget;
