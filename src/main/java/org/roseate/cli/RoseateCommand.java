package org.roseate.cli;

import java.io.PrintWriter;
import org.roseate.circuit.DesignException;
import picocli.CommandLine;
import picocli.CommandLine.Command;

/** The top-level command: dispatches to one subcommand per verb. */
@Command(name = "roseate",
        mixinStandardHelpOptions = true,
        versionProvider = RoseateCommand.Version.class,
        description = {
            "Design, hear and measure analog noise-shaping filters (pink-noise RC networks).",
            "Run without arguments to open the window."},
        subcommands = {AnalyzeCommand.class, RenderCommand.class, PlayCommand.class, DevicesCommand.class,
            MeasureCommand.class, DiagnoseCommand.class, ListenTestCommand.class, FitCommand.class, ToleranceCommand.class,
            CompareCommand.class, PartsCommand.class, BudgetCommand.class,
            CommandLine.HelpCommand.class})
public final class RoseateCommand implements Runnable {
    /** Exit status for bad input: files, values, arguments. */
    public static final int EXIT_BAD_INPUT = 2;
    /** Exit status for audio-device trouble. */
    public static final int EXIT_DEVICE = 3;
    /** Exit status when the window cannot open because there is no display. */
    public static final int EXIT_NO_DISPLAY = 4;

    @CommandLine.Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public void run() {
        throw new CommandLine.ParameterException(spec.commandLine(), "name a subcommand, e.g. 'analyze presets/bench-pink.json'");
    }

    /** Runs the command line and returns the exit status; never throws. */
    public static int run(String... args) {
        return run(new PrintWriter(System.out, true), new PrintWriter(System.err, true), args);
    }

    /** As {@link #run(String...)}, writing to the given streams (for tests). */
    public static int run(PrintWriter out, PrintWriter err, String... args) {
        return run(out, err, true, args);
    }

    /**
     * As {@link #run(PrintWriter, PrintWriter, String...)}. With {@code oneVerb} true and a first argument
     * that names a subcommand exactly, picocli builds the model of that subcommand alone under a bare
     * {@code roseate} parent: building the model of all twelve verbs by reflection took a third of the
     * start-up of {@code analyze}. The output is the same either way ({@code RoseateCommandTest} compares
     * them); anything else (no verb, {@code help}, top-level options, a misspelt verb that wants the list
     * of verbs) gets the whole model.
     */
    static int run(PrintWriter out, PrintWriter err, boolean oneVerb, String... args) {
        Class<?> verb = oneVerb && args.length > 0 ? verbClass(args[0]) : null;
        CommandLine cl;
        if (verb == null) {
            cl = new CommandLine(new RoseateCommand());
        } else {
            cl = new CommandLine(CommandLine.Model.CommandSpec.wrapWithoutInspection(new RoseateCommand()).name("roseate"));
            cl.addSubcommand(args[0], verb);
        }
        // -V on a subcommand prints the same version line as on the top command
        for (CommandLine sub : cl.getSubcommands().values()) {
            sub.getCommandSpec().versionProvider(new Version());
        }
        cl.setOut(out);
        cl.setErr(err);
        cl.setCaseInsensitiveEnumValuesAllowed(true);
        cl.setParameterExceptionHandler((ex, a) -> {
            err.println("roseate: " + ex.getMessage());
            err.println("Try 'roseate " + commandPath(ex.getCommandLine()) + "--help' for the options.");
            return EXIT_BAD_INPUT;
        });
        cl.setExecutionExceptionHandler((ex, commandLine, parseResult) -> {
            Throwable e = ex;
            if (e instanceof DesignException || e instanceof UserInputException) {
                err.println("roseate: " + e.getMessage());
                return EXIT_BAD_INPUT;
            }
            if (e instanceof DeviceException) {
                err.println("roseate: " + e.getMessage());
                return EXIT_DEVICE;
            }
            err.println("roseate: internal error: " + e);
            e.printStackTrace(err);
            return 1;
        });
        int code = cl.execute(args);
        out.flush();
        err.flush();
        return code;
    }

    /**
     * The class of the subcommand called {@code name}, without building any picocli model; null for
     * {@code help} and any other name. Every entry must match the {@code subcommands} of the
     * annotation above ({@code RoseateCommandTest} checks it); a verb missing here still works, through
     * the whole model.
     */
    static Class<?> verbClass(String name) {
        switch (name) {
            case "analyze": return AnalyzeCommand.class;
            case "render": return RenderCommand.class;
            case "play": return PlayCommand.class;
            case "devices": return DevicesCommand.class;
            case "measure": return MeasureCommand.class;
            case "diagnose": return DiagnoseCommand.class;
            case "listen-test": return ListenTestCommand.class;
            case "fit": return FitCommand.class;
            case "tolerance": return ToleranceCommand.class;
            case "compare": return CompareCommand.class;
            case "parts": return PartsCommand.class;
            case "budget": return BudgetCommand.class;
            default: return null;
        }
    }

    private static String commandPath(CommandLine cl) {
        StringBuilder sb = new StringBuilder();
        for (CommandLine c = cl; c.getParent() != null; c = c.getParent()) {
            sb.insert(0, c.getCommandName() + " ");
        }
        return sb.toString();
    }

    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            String v = RoseateCommand.class.getPackage().getImplementationVersion();
            return new String[] {"roseate " + (v == null ? "development build" : v)};
        }
    }
}
