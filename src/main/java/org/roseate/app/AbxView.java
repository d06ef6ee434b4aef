package org.roseate.app;

import java.nio.file.Files;
import java.nio.file.Path;
import java.security.SecureRandom;
import java.time.Clock;
import java.util.List;
import java.util.concurrent.CompletableFuture;
import javafx.application.Platform;
import javafx.beans.property.ObjectProperty;
import javafx.beans.property.ReadOnlyObjectProperty;
import javafx.beans.property.SimpleObjectProperty;
import javafx.collections.FXCollections;
import javafx.geometry.Insets;
import javafx.geometry.Pos;
import javafx.scene.Node;
import javafx.scene.control.Button;
import javafx.scene.control.CheckBox;
import javafx.scene.control.ComboBox;
import javafx.scene.control.Label;
import javafx.scene.control.Slider;
import javafx.scene.control.TextField;
import javafx.scene.layout.BorderPane;
import javafx.scene.layout.GridPane;
import javafx.scene.layout.HBox;
import javafx.scene.layout.VBox;
import org.roseate.audio.PlaybackEngine;
import org.roseate.circuit.DesignReader;
import org.roseate.io.AtomicOutput;
import org.roseate.listen.AbxLog;
import org.roseate.listen.AbxOutcome;
import org.roseate.listen.AbxSession;
import org.roseate.listen.Binomial;
import org.roseate.listen.Side;
import org.roseate.model.CircuitModel;
import org.roseate.noise.ChainSettings;
import org.roseate.noise.FrameSource;
import org.roseate.noise.NoiseChain;

/**
 * The blind ABX listening test in the window, as {@code listen-test} runs it ({@link AbxSession}):
 * A and B (the design in the editor, a design file, ideal pink or white) and a hidden X, at the same
 * RMS level with the same level rules and caution as playback; the number of trials is fixed before
 * the first one and there is no early result (stopping when the score looks good inflates false
 * positives); at the end the count correct, the one-sided binomial p-value and the smallest count
 * significant at 5 %. Every answer rewrites the trial log ({@link AbxLog}).
 *
 * <p>The running score is not shown during the test, so it cannot tempt anyone to stop early.
 */
final class AbxView {
    /** What a side plays. */
    enum Source {
        DESIGN("Design in the editor"), FILE("Design file…"), IDEAL_PINK("ideal-pink"), WHITE("white");

        private final String label;

        Source(String label) {
            this.label = label;
        }

        @Override
        public String toString() {
            return label;
        }
    }

    /** Where the test's sound goes: the sound card, or a recorder in tests. */
    interface Player {
        /** Opens the output; may block (called off the FX thread). */
        void open() throws Exception;

        void play(FrameSource source);

        void silence();

        void close();
    }

    static final int RATE_HZ = ListenView.RATE_HZ;
    static final int DEFAULT_TRIALS = 16;
    /** Every side starts from the same noise seed, as {@code listen-test} does, so A and B differ only by their filters. */
    static final long NOISE_SEED = 1L;

    private final MainWindow window;
    private java.util.function.Supplier<Player> players;
    private final BorderPane root = new BorderPane();
    private final ComboBox<Source> sourceA = new ComboBox<>(FXCollections.observableArrayList(Source.values()));
    private final ComboBox<Source> sourceB = new ComboBox<>(FXCollections.observableArrayList(Source.values()));
    private final TextField trials = new TextField(String.valueOf(DEFAULT_TRIALS));
    private final TextField seed = new TextField();
    private final Slider level = new Slider(ListenView.MIN_LEVEL_DBFS, ListenView.SAFE_MAX_DBFS, ListenView.DEFAULT_LEVEL_DBFS);
    private final Label levelText = new Label();
    private final CheckBox allowLoud = new CheckBox("Allow loud (above −10 dBFS)");
    private final Button start = new Button("Start test…");
    private final Button stop = new Button("Abandon");
    private final Button playA = new Button("Play A");
    private final Button playB = new Button("Play B");
    private final Button playX = new Button("Play X");
    private final Button answerA = new Button("X is A");
    private final Button answerB = new Button("X is B");
    private final Label trialText = new Label("No test running.");
    private final Label resultText = new Label();
    private final ObjectProperty<AbxOutcome> outcome = new SimpleObjectProperty<>();
    private final Clock clock = Clock.systemUTC();
    private Path fileA;
    private Path fileB;
    private AbxSession session;
    private Player player;
    private NoiseChain chainA;
    private NoiseChain chainB;
    private Path logFile;
    private String nameA;
    private String nameB;
    private double levelDbfs;
    private boolean settingFile;

    /**
     * @param players makes the output for one test (the sound card in the window)
     */
    AbxView(MainWindow window, java.util.function.Supplier<Player> players) {
        this.window = window;
        this.players = players;
        sourceA.setValue(Source.DESIGN);
        sourceB.setValue(Source.IDEAL_PINK);
        sourceA.valueProperty().addListener((o, a, b) -> pickFile(b, true));
        sourceB.valueProperty().addListener((o, a, b) -> pickFile(b, false));
        seed.setPromptText("random");
        level.setShowTickLabels(true);
        level.setShowTickMarks(true);
        level.setMajorTickUnit(10);
        level.valueProperty().addListener((o, a, b) -> levelText.setText(ToolText.f("%.1f dBFS RMS", b.doubleValue())));
        levelText.setText(ToolText.f("%.1f dBFS RMS", level.getValue()));
        allowLoud.selectedProperty().addListener((o, a, loud) -> {
            level.setMax(loud ? ListenView.LOUD_MAX_DBFS : ListenView.SAFE_MAX_DBFS);
            if (!loud && level.getValue() > ListenView.SAFE_MAX_DBFS) {
                level.setValue(ListenView.SAFE_MAX_DBFS);
            }
        });
        GridPane g = new GridPane();
        g.setHgap(8);
        g.setVgap(6);
        int r = 0;
        g.addRow(r++, new Label("A"), sourceA);
        g.addRow(r++, new Label("B"), sourceB);
        g.addRow(r++, new Label("Trials"), trials);
        g.addRow(r++, new Label("Seed"), seed);
        g.addRow(r++, new Label("Level"), level);
        g.addRow(r++, new Label(""), levelText);
        g.add(allowLoud, 1, r++);
        Label caution = new Label(ListenView.CAUTION);
        caution.setWrapText(true);
        caution.getStyleClass().add("caution");
        Label rules = new Label("The number of trials is fixed before the first one and the test gives no result until "
                + "the last answer: checking the score and stopping when it looks good makes a chance result look "
                + "significant far more often than 5 %. A, B and X replay the same seeded noise at the same RMS level.");
        rules.setWrapText(true);
        rules.getStyleClass().add("readout");
        start.setOnAction(e -> startTest());
        stop.setOnAction(e -> abandon());
        playA.setOnAction(e -> select(AbxSession.Choice.A));
        playB.setOnAction(e -> select(AbxSession.Choice.B));
        playX.setOnAction(e -> select(AbxSession.Choice.X));
        answerA.setOnAction(e -> answer(Side.A));
        answerB.setOnAction(e -> answer(Side.B));
        HBox listen = new HBox(8, playA, playB, playX);
        HBox answers = new HBox(8, answerA, answerB);
        listen.setAlignment(Pos.CENTER_LEFT);
        answers.setAlignment(Pos.CENTER_LEFT);
        trialText.getStyleClass().add("section-title");
        resultText.setWrapText(true);
        resultText.getStyleClass().add("summary");
        VBox left = new VBox(10, ToolsView.title("Blind ABX listening test"), g, caution, new HBox(8, start, stop));
        left.setPrefWidth(360);
        left.getStyleClass().add("side-panel");
        VBox centre = new VBox(14, trialText, listen, answers, rules, resultText);
        centre.setPadding(new Insets(0, 0, 0, 16));
        root.setLeft(left);
        root.setCenter(centre);
        root.setPadding(new Insets(10));
        running(false);
    }

    private void pickFile(Source s, boolean a) {
        if (s != Source.FILE || settingFile) {
            return;
        }
        window.prompts().openFile(window.stage(), "Design file for " + (a ? "A" : "B"), "Design files (*.json)", "*.json")
                .ifPresentOrElse(p -> {
                    if (a) {
                        fileA = p;
                    } else {
                        fileB = p;
                    }
                }, () -> (a ? sourceA : sourceB).setValue(Source.IDEAL_PINK));
    }

    /** Where later tests play (the sound card unless a test says otherwise). */
    void usePlayers(java.util.function.Supplier<Player> p) {
        players = p;
    }

    /** Sets a side to a design file without asking (tests). */
    void setFile(boolean a, Path p) {
        if (a) {
            fileA = p;
        } else {
            fileB = p;
        }
        settingFile = true;
        try {
            (a ? sourceA : sourceB).setValue(Source.FILE);
        } finally {
            settingFile = false;
        }
    }

    private void running(boolean on) {
        for (Node n : List.of(playA, playB, playX, answerA, answerB, stop)) {
            n.setDisable(!on);
        }
        for (Node n : List.of(start, sourceA, sourceB, trials, seed, level, allowLoud)) {
            n.setDisable(on);
        }
    }

    private NoiseChain chain(Source s, Path file, double dbfs) {
        ChainSettings cs = new ChainSettings(RATE_HZ, 2, false, NOISE_SEED, dbfs);
        return switch (s) {
            case IDEAL_PINK -> NoiseChain.idealPink(cs);
            case WHITE -> NoiseChain.white(cs);
            case DESIGN -> {
                CircuitModel m = window.model();
                if (m == null) {
                    throw new IllegalArgumentException("the design in the editor has an error");
                }
                yield NoiseChain.design(m.zpk(), cs, m.design().name());
            }
            case FILE -> {
                if (file == null) {
                    throw new IllegalArgumentException("no design file chosen");
                }
                yield NoiseChain.design(CircuitModel.of(DesignReader.read(file), file.getFileName().toString()).zpk(), cs,
                        file.getFileName().toString());
            }
        };
    }

    private String name(Source s, Path file) {
        return switch (s) {
            case DESIGN -> window.model() == null ? "design" : window.model().design().name();
            case FILE -> file == null ? "" : file.toString();
            default -> s.toString();
        };
    }

    /** Checks the settings, asks for the log file and the caution, opens the output and starts trial 1. */
    void startTest() {
        int n;
        long orderSeed;
        try {
            n = Integer.parseInt(trials.getText().trim());
        } catch (NumberFormatException e) {
            resultText.setText("Trials: expected a whole number from 5 to " + Binomial.MAX_TRIALS + ".");
            return;
        }
        if (n < 5 || n > Binomial.MAX_TRIALS) {
            resultText.setText("Trials: expected 5 to " + Binomial.MAX_TRIALS + " (with fewer than 5 no score is "
                    + "significant at 5 %), found " + n + ".");
            return;
        }
        try {
            orderSeed = seed.getText().isBlank() ? new SecureRandom().nextLong() : Long.parseLong(seed.getText().trim());
        } catch (NumberFormatException e) {
            resultText.setText("Seed: expected a whole number, or blank for a random one.");
            return;
        }
        levelDbfs = level.getValue();
        if (levelDbfs > ListenView.SAFE_MAX_DBFS && !allowLoud.isSelected()) {
            resultText.setText("The level is loud; tick \"Allow loud\" for levels above −10 dBFS.");
            return;
        }
        try {
            chainA = chain(sourceA.getValue(), fileA, levelDbfs);
            chainB = chain(sourceB.getValue(), fileB, levelDbfs);
        } catch (RuntimeException e) {
            resultText.setText("Cannot play: " + e.getMessage());
            return;
        }
        nameA = name(sourceA.getValue(), fileA);
        nameB = name(sourceB.getValue(), fileB);
        var chosen = window.prompts().saveFile(window.stage(), "Trial log of the listening test", "listen-test.json",
                "JSON files (*.json)", "*.json");
        if (chosen.isEmpty()) {
            return;
        }
        if (Files.exists(chosen.get()) && !window.prompts().confirmReplace(window.stage(), chosen.get())) {
            resultText.setText("Not started: " + chosen.get() + " already exists and was kept.");
            return;
        }
        if (!window.cautionAccepted()) {
            return;
        }
        logFile = chosen.get();
        window.listen().stop();
        Player p = players.get();
        resultText.setText("Opening the output…");
        start.setDisable(true);
        CompletableFuture.runAsync(() -> {
            try {
                p.open();
            } catch (Exception e) {
                throw new IllegalStateException(e.getMessage(), e);
            }
        }, window.tasks().devices()).whenComplete((v, ex) -> Platform.runLater(() -> {
            if (ex != null) {
                start.setDisable(false);
                Throwable c = ex.getCause() != null ? ex.getCause() : ex;
                resultText.setText("Cannot open the output: " + c.getMessage());
                return;
            }
            player = p;
            session = new AbxSession(n, orderSeed, clock.instant());
            outcome.set(null);
            running(true);
            resultText.setText(ToolText.f("%d trials, fixed; %d or more correct would be significant at 5 %%. Log: %s",
                    n, Binomial.smallestSignificantCount(n, AbxSession.ALPHA), logFile));
            showTrial();
        }));
    }

    private void showTrial() {
        trialText.setText(ToolText.f("Trial %d of %d: listen to A, B and X as often as you like, then answer.",
                session.currentTrial(), session.trials()));
    }

    void select(AbxSession.Choice c) {
        if (session == null || session.finished()) {
            return;
        }
        Side s = session.select(c);
        player.play((s == Side.A ? chainA : chainB).withLevel(levelDbfs));
    }

    void answer(Side s) {
        if (session == null || session.finished()) {
            return;
        }
        player.silence();
        session.answer(s, clock.instant());
        writeLog();
        if (session.finished()) {
            AbxOutcome o = session.outcome();
            finish();
            trialText.setText("Test complete.");
            resultText.setText(ToolText.f("%d of %d correct; one-sided binomial p-value %.4g (the chance of %d or more by "
                    + "guessing); %d or more would have been significant at 5 %%. %s Log: %s (seed %d).", o.correct(),
                    o.trials(), o.pValue(), o.correct(), o.smallestSignificantCount(),
                    o.significant() ? "A and B were told apart." : "No evidence that A and B can be told apart.",
                    logFile, session.seed()));
            outcome.set(o);
        } else {
            showTrial();
        }
    }

    private void writeLog() {
        AbxLog log = new AbxLog(nameA, nameB, levelDbfs, session.seed(), session.trials(), session.log());
        try {
            AtomicOutput.writeString(logFile, log.toJson(), true);
        } catch (java.io.IOException e) {
            resultText.setText("The trial log could not be written: " + e.getMessage());
        }
    }

    /** Stops without a result: an early stop gives none (see the class notes). */
    void abandon() {
        if (session != null && !session.finished()) {
            int done = session.log().size();
            finish();
            trialText.setText("Test abandoned after " + done + " trial(s).");
            resultText.setText("No result: a test stopped before its planned trials has none. The answered trials are in "
                    + logFile + ".");
        }
    }

    private void finish() {
        if (player != null) {
            Player p = player;
            player = null;
            window.tasks().devices().submit(p::close);
        }
        running(false);
    }

    void shutdown() {
        if (player != null) {
            player.close();
            player = null;
        }
    }

    ReadOnlyObjectProperty<AbxOutcome> outcomeProperty() {
        return outcome;
    }

    AbxSession session() {
        return session;
    }

    TextField trials() {
        return trials;
    }

    TextField seed() {
        return seed;
    }

    Label resultText() {
        return resultText;
    }

    Node root() {
        return root;
    }

    /** The sound card: the default output, through the core's playback engine (1 s ramp from silence). */
    static Player soundCard() {
        return new Player() {
            private PlaybackEngine engine;

            @Override
            public void open() {
                engine = Players.start(null, new Silence(RATE_HZ, ListenView.CHANNELS));
            }

            @Override
            public void play(FrameSource source) {
                engine.throwIfFailed();
                engine.switchTo(source);
            }

            @Override
            public void silence() {
                engine.switchTo(new Silence(RATE_HZ, 2));
            }

            @Override
            public void close() {
                if (engine != null) {
                    engine.stop();
                }
            }
        };
    }

    /** Digital silence between trials. */
    record Silence(int rateHz, int channels) implements FrameSource {
        @Override
        public double sampleRateHz() {
            return rateHz;
        }

        @Override
        public void render(double[] interleaved, int frames) {
            java.util.Arrays.fill(interleaved, 0, frames * channels, 0.0);
        }
    }
}
