package org.roseate.app;

import java.util.EnumMap;
import java.util.Map;
import java.util.function.Function;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.NoiseChain;

/**
 * The noise chains of the window's players (Listen's A/B, the Bench's generator): each source is
 * designed once, at the players' rate, channel count and seed ({@link ListenView#RATE_HZ},
 * {@link ListenView#CHANNELS}, {@link ListenView#SEED}), then re-levelled, so any two sources play
 * at the same RMS level. Keyed by the view's own source enum. FX thread only.
 *
 * @param <K> the view's source kinds
 */
final class ChainPrototypes<K extends Enum<K>> {
    private final Map<K, NoiseChain> made;
    private final Function<K, Function<ChainSettings, NoiseChain>> recipes;

    /**
     * @param recipes how each kind's chain is made from the players' settings; a null recipe means
     *                the kind has nothing to play yet (no design loaded)
     */
    ChainPrototypes(Class<K> kinds, Function<K, Function<ChainSettings, NoiseChain>> recipes) {
        this.made = new EnumMap<>(kinds);
        this.recipes = recipes;
    }

    /** The recipe for a design's noise: its analog model through the bilinear path; null for no design. */
    static Function<ChainSettings, NoiseChain> design(CircuitModel model) {
        return model == null ? null : s -> NoiseChain.design(model.zpk(), s, model.design().name());
    }

    /**
     * The chain for {@code kind} at {@code levelDbfs}, or null when the kind has nothing to play.
     *
     * @throws org.roseate.digital.UnrenderableModelException when the design cannot be rendered
     */
    NoiseChain at(K kind, double levelDbfs) {
        NoiseChain p = made.get(kind);
        if (p == null) {
            Function<ChainSettings, NoiseChain> recipe = recipes.apply(kind);
            if (recipe == null) {
                return null;
            }
            p = recipe.apply(new ChainSettings(ListenView.RATE_HZ, ListenView.CHANNELS, false, ListenView.SEED, levelDbfs));
            made.put(kind, p);
        }
        return p.withLevel(levelDbfs);
    }

    /** Forgets a kind's chain, after its design changed. */
    void forget(K kind) {
        made.remove(kind);
    }
}
