package org.roseate.circuit;

import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Objects;
import java.util.Optional;
import java.util.TreeSet;
import java.util.function.UnaryOperator;
import java.util.regex.Pattern;

/**
 * Any linear circuit of R, C, L networks and op-amps, solved by nodal analysis
 * ({@code org.roseate.model.NodalModel}). The {@code input} node is driven by an ideal voltage
 * source (the previous stage's output, or the noise source); the stage's output is the voltage of
 * the {@code output} node, which drives the next stage through an ideal buffer. {@code gnd} is the
 * reference node.
 *
 * <p>Each key of {@code branches} is two node names separated by one space ("in a"), its value a
 * two-terminal network. Node names are letters, digits and {@code _}. Op-amps are keyed by
 * designator. The constructor checks the structure ({@link #problem}); it does not check that the
 * equations can be solved, which needs the values (the model does that).
 *
 * @param input    node driven by the stage's input
 * @param output   node whose voltage is the stage's output
 * @param branches networks by node pair, in file order
 * @param opamps   op-amps by designator, in file order
 */
public record CircuitStage(String input, String output, Map<String, Network> branches,
        Map<String, CircuitOpAmp> opamps) implements Stage {
    public static final String KIND = "circuit";
    /** The reference node. */
    public static final String GROUND = "gnd";
    private static final Pattern NODE = Pattern.compile("[A-Za-z0-9_]+");

    public CircuitStage {
        Objects.requireNonNull(input, "input");
        Objects.requireNonNull(output, "output");
        branches = Collections.unmodifiableMap(new LinkedHashMap<>(branches));
        opamps = Collections.unmodifiableMap(new LinkedHashMap<>(opamps));
        Optional<Problem> p = problem(input, output, branches, opamps);
        if (p.isPresent()) {
            throw new IllegalArgumentException(p.get().key() + ": " + p.get().message());
        }
    }

    /** A structural problem: the design-file key it concerns and what is wrong. */
    public record Problem(String key, String message) {
    }

    /** True when {@code name} is a valid node name: letters, digits and {@code _}. */
    public static boolean isNodeName(String name) {
        return name != null && NODE.matcher(name).matches();
    }

    /** The two node names of a branch key such as {@code "in a"}, or empty if it is not one. */
    public static Optional<String[]> nodesOf(String branchKey) {
        int sp = branchKey.indexOf(' ');
        if (sp < 0) {
            return Optional.empty();
        }
        String a = branchKey.substring(0, sp);
        String b = branchKey.substring(sp + 1);
        return isNodeName(a) && isNodeName(b) ? Optional.of(new String[] {a, b}) : Optional.empty();
    }

    /**
     * The first structural problem of a circuit, or empty. Checked in this order: branch keys (two
     * node names, not the same node, no pair twice), the input (not {@code gnd}, a node of a
     * branch or op-amp pin), op-amp pins (known nodes; the output neither {@code gnd} nor the
     * input, no node driven by two op-amps), the output, dangling nodes (one branch end and no
     * op-amp pin), and groups of nodes with no path to {@code gnd}, the input or an op-amp output
     * (their equations are singular at every frequency).
     */
    public static Optional<Problem> problem(String input, String output, Map<String, Network> branches,
            Map<String, CircuitOpAmp> opamps) {
        Map<String, Integer> touches = new LinkedHashMap<>();
        Map<String, String> pairs = new LinkedHashMap<>();
        if (branches.isEmpty()) {
            return Optional.of(new Problem("branches", "empty: a circuit needs at least one branch such as \"in out\": \"R1(10k)\""));
        }
        for (String key : branches.keySet()) {
            String at = "branches '" + key + "'";
            Optional<String[]> ab = nodesOf(key);
            if (ab.isEmpty()) {
                return Optional.of(new Problem(at, "a branch key must be two node names (letters, digits, _) "
                        + "separated by one space, such as \"in a\""));
            }
            String a = ab.get()[0];
            String b = ab.get()[1];
            if (a.equals(b)) {
                return Optional.of(new Problem(at, "a branch from node '" + a + "' to itself; expected two different nodes"));
            }
            String pair = a.compareTo(b) < 0 ? a + " " + b : b + " " + a;
            String before = pairs.putIfAbsent(pair, key);
            if (before != null) {
                return Optional.of(new Problem(at, "nodes " + a + " and " + b + " are already joined by branch '" + before
                        + "'; put both networks in one branch with ||"));
            }
            touches.merge(a, 1, Integer::sum);
            touches.merge(b, 1, Integer::sum);
        }
        if (!isNodeName(input)) {
            return Optional.of(new Problem("input", "expected a node name (letters, digits, _), found '" + input + "'"));
        }
        if (input.equals(GROUND)) {
            return Optional.of(new Problem("input", "the input cannot be gnd, the reference node; name the node the source drives"));
        }
        Map<String, String> drivenBy = new LinkedHashMap<>();
        TreeSet<String> known = new TreeSet<>(touches.keySet());
        known.add(GROUND);
        for (CircuitOpAmp op : opamps.values()) {
            known.add(op.output());
        }
        known.add(input);
        for (Map.Entry<String, CircuitOpAmp> e : opamps.entrySet()) {
            String at = "opamps " + e.getKey();
            CircuitOpAmp op = e.getValue();
            for (String[] pin : new String[][] {{"plus", op.plus()}, {"minus", op.minus()}, {"output", op.output()}}) {
                if (!isNodeName(pin[1])) {
                    return Optional.of(new Problem(at + " " + pin[0], "expected a node name (letters, digits, _), found '" + pin[1] + "'"));
                }
                if (!known.contains(pin[1])) {
                    return Optional.of(new Problem(at + " " + pin[0], "unknown node '" + pin[1] + "'; expected one of "
                            + String.join(", ", known)));
                }
            }
            if (op.output().equals(GROUND)) {
                return Optional.of(new Problem(at + " output", "an op-amp output cannot be tied to gnd"));
            }
            if (op.output().equals(input)) {
                return Optional.of(new Problem(at + " output", "an op-amp output cannot be tied to the input node '" + input
                        + "', which the source drives"));
            }
            String other = drivenBy.putIfAbsent(op.output(), e.getKey());
            if (other != null) {
                return Optional.of(new Problem(at + " output", "node '" + op.output() + "' is already driven by " + other
                        + "; two outputs cannot drive one node"));
            }
            touches.merge(op.plus(), 1, Integer::sum);
            touches.merge(op.minus(), 1, Integer::sum);
            touches.merge(op.output(), 1, Integer::sum);
        }
        if (!touches.containsKey(input)) {
            return Optional.of(new Problem("input", "unknown node '" + input + "'; expected a node named by a branch or an op-amp pin: "
                    + String.join(", ", new TreeSet<>(touches.keySet()))));
        }
        if (!isNodeName(output)) {
            return Optional.of(new Problem("output", "expected a node name (letters, digits, _), found '" + output + "'"));
        }
        if (!known.contains(output)) {
            return Optional.of(new Problem("output", "unknown node '" + output + "'; expected one of " + String.join(", ", known)));
        }
        if (output.equals(GROUND)) {
            return Optional.of(new Problem("output", "the output cannot be gnd, whose voltage is always zero"));
        }
        for (Map.Entry<String, Integer> t : touches.entrySet()) {
            String n = t.getKey();
            if (t.getValue() == 1 && !n.equals(GROUND) && !n.equals(input) && !n.equals(output)) {
                String key = branches.keySet().stream().filter(k -> List.of(k.split(" ")).contains(n)).findFirst().orElse(n);
                return Optional.of(new Problem("branches '" + key + "'", "node '" + n + "' is dangling: only this branch "
                        + "touches it; connect it to another branch or an op-amp pin"));
            }
        }
        return floatingGroup(input, branches, opamps);
    }

    /** Nodes joined by branches form groups; each must reach gnd, the input or an op-amp output. */
    private static Optional<Problem> floatingGroup(String input, Map<String, Network> branches, Map<String, CircuitOpAmp> opamps) {
        Map<String, String> parent = new LinkedHashMap<>();
        for (String key : branches.keySet()) {
            String[] ab = key.split(" ");
            union(parent, ab[0], ab[1]);
        }
        // The source and the op-amp outputs are referred to gnd.
        union(parent, input, GROUND);
        opamps.values().forEach(op -> union(parent, op.output(), GROUND));
        String groundRoot = find(parent, GROUND);
        List<String> floating = new ArrayList<>();
        for (String n : parent.keySet()) {
            if (!find(parent, n).equals(groundRoot)) {
                floating.add(n);
            }
        }
        if (floating.isEmpty()) {
            return Optional.empty();
        }
        Collections.sort(floating);
        return Optional.of(new Problem("branches", "nodes " + String.join(", ", floating) + " have no connection to gnd, "
                + "the input or an op-amp output, so the circuit's equations are singular at every frequency"));
    }

    private static String find(Map<String, String> parent, String n) {
        parent.putIfAbsent(n, n);
        String p = parent.get(n);
        while (!p.equals(n)) {
            n = p;
            p = parent.get(n);
        }
        return p;
    }

    private static void union(Map<String, String> parent, String a, String b) {
        String ra = find(parent, a);
        String rb = find(parent, b);
        if (!ra.equals(rb)) {
            parent.put(ra, rb);
        }
    }

    @Override
    public String kind() {
        return KIND;
    }

    /** The branches, keyed by their node pair ("in a"): the role of each network. */
    @Override
    public Map<String, Network> networks() {
        return branches;
    }

    /** Empty: a circuit's op-amps are in {@link #opamps()}. */
    @Override
    public Optional<OpAmp> opamp() {
        return Optional.empty();
    }

    @Override
    public Stage mapNetworks(UnaryOperator<Network> f) {
        Map<String, Network> m = new LinkedHashMap<>();
        branches.forEach((k, n) -> m.put(k, f.apply(n)));
        return new CircuitStage(input, output, m, opamps);
    }

    @Override
    public CircuitStage asCircuit() {
        return this;
    }

    /** The nodes other than gnd, sorted: those of branches, op-amp pins and the input. */
    public List<String> nodes() {
        TreeSet<String> s = new TreeSet<>();
        branches.keySet().forEach(k -> s.addAll(List.of(k.split(" "))));
        opamps.values().forEach(op -> s.addAll(List.of(op.plus(), op.minus(), op.output())));
        s.add(input);
        s.remove(GROUND);
        return List.copyOf(s);
    }
}
