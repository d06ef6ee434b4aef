package org.roseate.cli;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.SerializationFeature;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.ObjectNode;
import java.io.PrintWriter;
import java.nio.file.Path;
import java.util.List;
import java.util.Locale;
import java.util.concurrent.Callable;
import java.util.stream.Collectors;
import org.roseate.circuit.Design;
import org.roseate.circuit.DesignReader;
import org.roseate.tools.PartsList;
import org.roseate.value.EngineeringValue;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

/** {@code parts DESIGN.json}: the bill of materials. */
@Command(name = "parts", mixinStandardHelpOptions = true,
        description = "List a design's parts to buy: equal parts grouped with their quantity, value, the E-series that "
                + "contain it, tolerance, the op-amps with their model keys, and what to buy.")
final class PartsCommand implements Callable<Integer> {
    enum Format { table, csv, json }

    @Parameters(index = "0", paramLabel = "DESIGN.json", description = "design file")
    Path file;

    @Option(names = "--format", defaultValue = "table", description = "table, csv or json (default: ${DEFAULT-VALUE})")
    Format format;

    @Spec
    picocli.CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        Design d = DesignReader.read(file);
        List<PartsList.Group> groups = PartsList.grouped(d);
        List<PartsList.OpAmpEntry> opamps = PartsList.opAmps(d);
        PrintWriter out = spec.commandLine().getOut();
        switch (format) {
            case csv -> out.print(csv(groups, opamps));
            case json -> out.print(json(d, groups, opamps));
            default -> out.print(table(d, file, groups, opamps));
        }
        out.flush();
        return 0;
    }

    private static String kind(PartsList.Part p) {
        return p.kind().name().toLowerCase(Locale.ROOT);
    }

    private static String series(PartsList.Part p) {
        return p.series().stream().map(Enum::name).collect(Collectors.joining(" "));
    }

    static String table(Design d, Path file, List<PartsList.Group> groups, List<PartsList.OpAmpEntry> opamps) {
        StringBuilder sb = new StringBuilder();
        sb.append("Parts: ").append(d.name()).append(" (").append(file.getFileName()).append(")\n");
        sb.append(Numbers.f("%4s %-20s %-10s %7s %10s %-28s %9s%n", "qty", "parts", "kind", "value", "SI", "in series (IEC 60063)", "tolerance"));
        for (PartsList.Group g : groups) {
            PartsList.Part p = g.first();
            String in = p.series().isEmpty()
                    ? "none; nearest E24 " + EngineeringValue.format(p.nearestE24(), p.kind()) + ", E96 " + EngineeringValue.format(p.nearestE96(), p.kind())
                    : series(p);
            sb.append(Numbers.f("%4d %-20s %-10s %7s %10s %-28s %9s%n", g.quantity(), String.join(" ", g.designators()), kind(p),
                    p.letterCode(), p.si(), in, p.tolerance().map(Object::toString).orElse("exact?")));
        }
        if (!opamps.isEmpty()) {
            sb.append("\nOp-amps (model keys as in the design file):\n");
            for (PartsList.OpAmpEntry o : opamps) {
                sb.append(Numbers.f("%4d %-6s stage %d: gbwHz %s, openLoopGain %s%n", 1, o.name(), o.stage(),
                        Numbers.plain(o.gbwHz()), Numbers.plain(o.openLoopGain())));
            }
        }
        sb.append("\nAdvice:\n");
        groups.stream().map(g -> kind(g.first()) + "s: " + g.first().advice()).distinct().forEach(a -> sb.append("  ").append(a).append('\n'));
        if (!opamps.isEmpty()) {
            sb.append("  op-amps: any part whose gain-bandwidth product is at least the gbwHz above and whose noise suits "
                    + "the level (common practice)\n");
        }
        if (groups.stream().anyMatch(g -> g.first().tolerance().isEmpty())) {
            sb.append("  'exact?': the design gives no tolerance for this part; add one to its \"tolerance\" map.\n");
        }
        return sb.toString();
    }

    static String csv(List<PartsList.Group> groups, List<PartsList.OpAmpEntry> opamps) {
        StringBuilder sb = new StringBuilder("quantity,designators,kind,value,letterCode,series,tolerance,gbwHz,openLoopGain\n");
        for (PartsList.Group g : groups) {
            PartsList.Part p = g.first();
            sb.append(g.quantity()).append(',').append(String.join(" ", g.designators())).append(',').append(kind(p)).append(',')
                    .append(Numbers.plain(p.value())).append(',').append(p.letterCode()).append(',').append(series(p)).append(',')
                    .append(p.tolerance().map(Object::toString).orElse("")).append(",,\n");
        }
        for (PartsList.OpAmpEntry o : opamps) {
            sb.append("1,").append(o.name()).append(",opamp,,,,,").append(Numbers.plain(o.gbwHz())).append(',')
                    .append(Numbers.plain(o.openLoopGain())).append('\n');
        }
        return sb.toString();
    }

    static String json(Design d, List<PartsList.Group> groups, List<PartsList.OpAmpEntry> opamps) {
        ObjectMapper m = new ObjectMapper().enable(SerializationFeature.INDENT_OUTPUT);
        ObjectNode root = m.createObjectNode();
        root.put("name", d.name());
        ArrayNode parts = root.putArray("parts");
        for (PartsList.Group g : groups) {
            PartsList.Part p = g.first();
            ObjectNode o = parts.addObject();
            o.put("quantity", g.quantity());
            ArrayNode ds = o.putArray("designators");
            g.designators().forEach(ds::add);
            o.put("kind", kind(p));
            o.put("value", p.value());
            o.put("letterCode", p.letterCode());
            ArrayNode in = o.putArray("series");
            p.series().forEach(e -> in.add(e.name()));
            if (p.tolerance().isPresent()) {
                o.put("tolerance", p.tolerance().get().toString());
            } else {
                o.putNull("tolerance");
            }
            o.put("advice", p.advice());
        }
        ArrayNode ops = root.putArray("opamps");
        for (PartsList.OpAmpEntry o : opamps) {
            ObjectNode n = ops.addObject();
            n.put("name", o.name());
            n.put("stage", o.stage());
            n.put("gbwHz", o.gbwHz());
            n.put("openLoopGain", o.openLoopGain());
        }
        try {
            return m.writeValueAsString(root) + "\n";
        } catch (com.fasterxml.jackson.core.JsonProcessingException e) {
            throw new IllegalStateException(e);
        }
    }
}
