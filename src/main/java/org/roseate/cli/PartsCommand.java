package org.roseate.cli;

import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import java.util.stream.Collectors;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.tools.PartsList;
import org.roseate.value.EngineeringValue;
import picocli.CommandLine.Command;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code parts DESIGN.json}: the bill of materials. */
@Command(name = "parts", mixinStandardHelpOptions = true,
        description = "List a design's parts: value, kind, the E-series that contain it, tolerance and what to buy.")
final class PartsCommand implements Callable<Integer> {
    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file")
    Path file;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Design d = DesignReader.read(file);
        List<PartsList.Part> parts = PartsList.of(d);
        PrintWriter out = spec.commandLine().getOut();
        out.println("Parts: " + d.name() + " (" + file.getFileName() + ")");
        out.println(Numbers.f("%-6s %-10s %7s %10s %-28s %9s", "part", "kind", "value", "SI", "in series (IEC 60063)", "tolerance"));
        for (PartsList.Part p : parts) {
            String in = p.series().isEmpty()
                    ? "none; nearest E24 " + EngineeringValue.format(p.nearestE24(), p.kind()) + ", E96 " + EngineeringValue.format(p.nearestE96(), p.kind())
                    : p.series().stream().map(Enum::name).collect(Collectors.joining(" "));
            out.println(Numbers.f("%-6s %-10s %7s %10s %-28s %9s", p.designator(), p.kind().name().toLowerCase(java.util.Locale.ROOT),
                    p.letterCode(), p.si(), in, p.tolerance().map(Object::toString).orElse("exact?")));
        }
        out.println();
        out.println("Advice:");
        parts.stream().map(p -> p.kind().name().toLowerCase(java.util.Locale.ROOT) + "s: " + p.advice()).distinct()
                .forEach(a -> out.println("  " + a));
        if (parts.stream().anyMatch(p -> p.tolerance().isEmpty())) {
            out.println("  'exact?': the design gives no tolerance for this part; add one to its \"tolerance\" map.");
        }
        out.flush();
        return 0;
    }
}
